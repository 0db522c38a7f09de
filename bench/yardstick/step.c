/*
 * A measuring stick for slabecho's production FDTD step: the same update in plain C, to be compiled with
 * gcc -O3 -march=native and timed beside `slabecho bench` (bench/yardstick.ts does both). Not part of the product.
 *
 * It reads a run as the TypeScript side builds it (both grids' coefficients, CPML, pole groups, probes, DFT span;
 * the format is written by bench/yardstick.ts, a stream of little-endian doubles, counts before arrays) and steps
 * it as src/fdtd/kernel.ts, engine-js.ts and run.ts do: H and E of both grids with their CPML, the TF/SF one-node
 * injections, the pole passes (node-major state, one pass per group before the E update), the hard source, the
 * probes into records, one DFT term every `stride` steps, the stored energy every 32 steps and the running
 * spectra of the records at 24 frequencies every `check` steps.
 *
 * Two layouts of the pole state: node-major as the TypeScript kernel keeps it (all poles of a node together),
 * and with LAYOUT "pole-major" one array per pole across the nodes, one pass per pole, which the compiler
 * vectorizes across nodes at the machine's full width; the yardstick is the faster of the two.
 *
 * Usage: step DUMP WARMUP STEPS [node-major|pole-major]  ->  {"steps":…,"seconds":…,"checksum":…} on stdout
 * (seconds: the STEPS only).
 */
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <time.h>

typedef struct { int eLo, eHi, hLo, hHi; double *be, *ce, *psiE, *bh, *ch, *psiH; } Pml;
typedef struct {
  int lo, hi, nd, no;
  double *fill, *da, *db, *deps, *dState, *oa, *ox, *oz, *oc, *ow0sq, *oState;
} Group;
typedef struct { int lo, hi, groups; double *cp, *eOld, *acc; Group *g; } Disp;
typedef struct { int n, pmls; double *e, *h, *ca, *cb, *db; Pml *pml; Disp *disp; } Grid;

static FILE *in;
static double num(void) {
  double v;
  if (fread(&v, sizeof v, 1, in) != 1) { fprintf(stderr, "step: short dump\n"); exit(2); }
  return v;
}
static int count(void) { return (int)num(); }
static double *array(int *len) {
  int n = count();
  double *a = aligned_alloc(64, sizeof(double) * (size_t)(n + 8));
  for (int i = 0; i < n; i++) a[i] = num();
  for (int i = n; i < n + 8; i++) a[i] = 0;
  if (len) *len = n;
  return a;
}

static Grid readGrid(void) {
  Grid g;
  g.e = array(&g.n); g.h = array(NULL); g.ca = array(NULL); g.cb = array(NULL); g.db = array(NULL);
  g.pmls = count();
  g.pml = calloc((size_t)g.pmls + 1, sizeof(Pml));
  for (int r = 0; r < g.pmls; r++) {
    Pml *p = &g.pml[r];
    p->eLo = count(); p->eHi = count(); p->be = array(NULL); p->ce = array(NULL); p->psiE = array(NULL);
    p->hLo = count(); p->hHi = count(); p->bh = array(NULL); p->ch = array(NULL); p->psiH = array(NULL);
  }
  g.disp = NULL;
  if (count()) {
    Disp *d = calloc(1, sizeof(Disp));
    d->lo = count(); d->hi = count(); d->cp = array(NULL); d->eOld = array(NULL); d->acc = array(NULL);
    d->groups = count();
    d->g = calloc((size_t)d->groups + 1, sizeof(Group));
    for (int k = 0; k < d->groups; k++) {
      Group *G = &d->g[k];
      G->lo = count(); G->hi = count(); G->fill = array(NULL);
      G->nd = count(); G->da = array(NULL); G->db = array(NULL); G->deps = array(NULL); G->dState = array(NULL);
      G->no = count(); G->oa = array(NULL); G->ox = array(NULL); G->oz = array(NULL); G->oc = array(NULL);
      G->ow0sq = array(NULL); G->oState = array(NULL);
    }
    g.disp = d;
  }
  return g;
}

static void updateH(Grid *s, int inj, double injValue) {
  double *restrict e = s->e, *restrict h = s->h, *restrict db = s->db;
  int m = s->n - 1;
  for (int i = 0; i < m; i++) h[i] += db[i] * (e[i + 1] - e[i]);
  for (int r = 0; r < s->pmls; r++) {
    Pml *p = &s->pml[r];
    for (int i = p->hLo; i < p->hHi; i++) {
      int k = i - p->hLo;
      double v = p->bh[k] * p->psiH[k] + p->ch[k] * (e[i + 1] - e[i]);
      p->psiH[k] = v;
      h[i] += db[i] * v;
    }
  }
  if (inj >= 0) h[inj] += db[inj] * injValue;
}

static void polesPre(Disp *d, const double *restrict e) {
  int len = d->hi - d->lo;
  double *restrict acc = d->acc, *restrict eOld = d->eOld;
  for (int k = 0; k < len; k++) acc[k] = 0;
  for (int g = 0; g < d->groups; g++) {
    Group *G = &d->g[g];
    int n = G->hi - G->lo, off = G->lo - d->lo, nd = G->nd, no = G->no;
    const double *restrict da = G->da, *restrict dbq = G->db, *restrict oa = G->oa, *restrict ox = G->ox, *restrict oz = G->oz;
    double *restrict v = G->dState, *restrict st = G->oState;
    for (int k = 0; k < n; k++) {
      double E = e[G->lo + k], f = G->fill[k], sum = 0;
      for (int q = 0, j = k * nd; q < nd; q++, j++) {
        double bE = dbq[q] * f * E, P = v[j] + bE;
        sum += (1 - da[q]) * P;
        v[j] = da[q] * P + bE;
      }
      double E2 = 2 * E + eOld[off + k];
      for (int q = 0, j = 2 * k * no; q < no; q++, j += 2) {
        double z = oz[q] * f, P = st[j] + z * E;
        double partial = oa[q] * P + ox[q] * st[j + 1] + z * E2;
        sum -= partial - P;
        st[j] = partial;
        st[j + 1] = P;
      }
      acc[off + k] += sum;
    }
  }
  for (int k = 0; k < len; k++) eOld[k] = e[d->lo + k];
}

/* Pole-major state: Debye pole q of node k at dState[q·n + k]; second order u, P̃ⁿ at oState[2q·n + k], [(2q+1)·n + k]. */
static int poleMajor = 0;

static void toPoleMajor(Grid *s) {
  if (!s->disp) return;
  for (int g = 0; g < s->disp->groups; g++) {
    Group *G = &s->disp->g[g];
    int n = G->hi - G->lo;
    double *d = aligned_alloc(64, sizeof(double) * (size_t)(n * G->nd + 8)), *o = aligned_alloc(64, sizeof(double) * (size_t)(2 * n * G->no + 8));
    for (int k = 0; k < n; k++) {
      for (int q = 0; q < G->nd; q++) d[q * n + k] = G->dState[k * G->nd + q];
      for (int q = 0; q < G->no; q++) { o[2 * q * n + k] = G->oState[2 * (k * G->no + q)]; o[(2 * q + 1) * n + k] = G->oState[2 * (k * G->no + q) + 1]; }
    }
    G->dState = d; G->oState = o;
  }
}

static void polesPrePoleMajor(Disp *d, const double *restrict e) {
  int len = d->hi - d->lo;
  double *restrict acc = d->acc, *restrict eOld = d->eOld;
  for (int k = 0; k < len; k++) acc[k] = 0;
  for (int g = 0; g < d->groups; g++) {
    Group *G = &d->g[g];
    int n = G->hi - G->lo, off = G->lo - d->lo;
    const double *restrict E = e + G->lo, *restrict f = G->fill, *restrict Eo = eOld + off;
    double *restrict a = acc + off;
    for (int q = 0; q < G->nd; q++) {
      double *restrict v = G->dState + (size_t)q * n, dq = G->db[q], aq = G->da[q], oma = 1 - aq;
      for (int k = 0; k < n; k++) {
        double bE = dq * f[k] * E[k], P = v[k] + bE;
        a[k] += oma * P;
        v[k] = aq * P + bE;
      }
    }
    for (int q = 0; q < G->no; q++) {
      double *restrict u = G->oState + (size_t)2 * q * n, *restrict old = u + n, zq = G->oz[q], al = G->oa[q], xi = G->ox[q];
      for (int k = 0; k < n; k++) {
        double z = zq * f[k], P = u[k] + z * E[k];
        double partial = al * P + xi * old[k] + z * (2 * E[k] + Eo[k]);
        a[k] -= partial - P;
        u[k] = partial;
        old[k] = P;
      }
    }
  }
  for (int k = 0; k < len; k++) eOld[k] = e[d->lo + k];
}

static void updateE(Grid *s, int inj, double injValue) {
  double *restrict e = s->e, *restrict h = s->h, *restrict ca = s->ca, *restrict cb = s->cb;
  int m = s->n - 1;
  if (s->disp) { if (poleMajor) polesPrePoleMajor(s->disp, e); else polesPre(s->disp, e); }
  for (int i = 1; i < m; i++) e[i] = ca[i] * e[i] + cb[i] * (h[i] - h[i - 1]);
  for (int r = 0; r < s->pmls; r++) {
    Pml *p = &s->pml[r];
    for (int i = p->eLo; i < p->eHi; i++) {
      int k = i - p->eLo;
      double v = p->be[k] * p->psiE[k] + p->ce[k] * (h[i] - h[i - 1]);
      p->psiE[k] = v;
      e[i] += cb[i] * v;
    }
  }
  if (inj >= 0) e[inj] += cb[inj] * injValue;
  if (s->disp) {
    Disp *d = s->disp;
    for (int k = 0; k < d->hi - d->lo; k++) e[d->lo + k] += d->cp[k] * d->acc[k];
  }
}

static double energy(const Grid *s, const double *w, double dt) {
  double W = 0, P = 0;
  for (int i = 0; i < s->n; i++) W += w[i] * s->e[i] * s->e[i];
  for (int i = 0; i < s->n - 1; i++) W += s->h[i] * s->h[i];
  if (!s->disp) return W;
  for (int g = 0; g < s->disp->groups; g++) {
    const Group *G = &s->disp->g[g];
    for (int k = 0; k < G->hi - G->lo; k++) {
      double f = G->fill[k], E = s->e[G->lo + k];
      if (!(f > 0)) continue;
      int n = G->hi - G->lo;
      for (int q = 0; q < G->nd; q++) {
        double p = G->dState[poleMajor ? q * n + k : k * G->nd + q] + G->db[q] * f * E;
        P += p * p / (f * G->deps[q]);
      }
      for (int q = 0; q < G->no; q++) {
        int j = poleMajor ? 2 * q * n + k : 2 * (k * G->no + q), next = poleMajor ? j + n : j + 1;
        double p = G->oState[j] + G->oz[q] * f * E, old = G->oState[next];
        double rate = (p - old) / dt, mean = (p + old) / 2;
        P += (rate * rate + G->ow0sq[q] * mean * mean) / (f * G->oc[q]);
      }
    }
  }
  return W + P;
}

/* The running spectra of the records at the check frequencies (src/fdtd/convergence.ts, feed). */
static void feed(const double *inc, const double *ref, const double *tra, int from, int to, const double *w, int nw, double dt, double *acc) {
  for (int q = 0; q < nw; q++) {
    double step = w[q] * dt, cs = cos(step), sn = sin(step), c = 0, s = 0;
    double a0 = 0, a1 = 0, a2 = 0, a3 = 0, a4 = 0, a5 = 0;
    for (int k = from; k < to; k++) {
      if (k == from || k % 256 == 0) { c = cos(step * k); s = sin(step * k); }
      a0 += inc[k] * c; a1 -= inc[k] * s; a2 += ref[k] * c; a3 -= ref[k] * s; a4 += tra[k] * c; a5 -= tra[k] * s;
      double c2 = c * cs - s * sn; s = s * cs + c * sn; c = c2;
    }
    acc[6 * q] += a0; acc[6 * q + 1] += a1; acc[6 * q + 2] += a2; acc[6 * q + 3] += a3; acc[6 * q + 4] += a4; acc[6 * q + 5] += a5;
  }
}

static double now(void) { struct timespec t; clock_gettime(CLOCK_MONOTONIC, &t); return (double)t.tv_sec + 1e-9 * (double)t.tv_nsec; }

int main(int argc, char **argv) {
  if (argc < 4 || !(in = fopen(argv[1], "rb"))) { fprintf(stderr, "usage: step DUMP WARMUP STEPS [node-major|pole-major]\n"); return 2; }
  poleMajor = argc > 4 && argv[4][0] == 'p';
  int warm = atoi(argv[2]), steps = atoi(argv[3]), total = warm + steps;
  Grid main_ = readGrid(), aux = readGrid();
  int tfsf = count(), off = count(), front = count(), back = count(), sf = count();
  int srcLen; double *src = array(&srcLen);
  int dftLo = count(), dftLen = count(), stride = count();
  double dt = num(), omegaDt = num();
  double *epsInf = array(NULL);
  int nw; double *w = array(&nw);
  int check = count();
  fclose(in);
  if (poleMajor) { toPoleMajor(&main_); toPoleMajor(&aux); }
  double *rec = calloc(4 * (size_t)(total + 2), sizeof(double));
  double *inc = rec, *ref = rec + total + 2, *tra = rec + 2 * (total + 2), *sfr = rec + 3 * (total + 2);
  double *re = calloc((size_t)dftLen + 8, sizeof(double)), *im = calloc((size_t)dftLen + 8, sizeof(double));
  double *spec = calloc(6 * (size_t)nw, sizeof(double));
  double incRe = 0, incIm = 0, W = 0, t0 = 0;
  int fed = 0;
  for (int n = 0; n < total; n++) {
    if (n == warm) t0 = now();
    double injH = -aux.e[tfsf - off];
    updateH(&aux, -1, 0);
    updateH(&main_, tfsf - 1, injH);
    double injE = -aux.h[tfsf - 1 - off];
    updateE(&main_, tfsf, injE);
    updateE(&aux, -1, 0);
    int t = n + 1;
    aux.e[0] = t < srcLen ? src[t] : 0;
    double vi = aux.e[front - off], tot = main_.e[front];
    inc[t] = vi; ref[t] = tot - vi; tra[t] = back < 0 ? 0 : main_.e[back]; sfr[t] = main_.e[sf];
    if (t % stride == 0) {
      double c = cos(omegaDt * t), s = sin(omegaDt * t);
      for (int i = 0; i < dftLen; i++) { double v = main_.e[dftLo + i]; re[i] += v * c; im[i] -= v * s; }
      incRe += vi * c; incIm -= vi * s;
    }
    if (t % 32 == 0) W += energy(&main_, epsInf, dt);
    if (t % check == 0) { feed(inc, ref, tra, fed, t + 1, w, nw, dt, spec); fed = t + 1; }
  }
  double seconds = now() - t0, sum = 0;
  for (int i = 0; i < main_.n; i++) sum += fabs(main_.e[i]);
  printf("{\"steps\":%d,\"seconds\":%.6f,\"checksum\":%.17g,\"energy_sum\":%.17g,\"dft\":%.17g,\"spectra\":%.17g}\n",
         steps, seconds, sum, W, re[dftLen / 2] + incRe + incIm, spec[0]);
  return 0;
}

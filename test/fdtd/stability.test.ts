// Stability by construction. Every pole is updated with the trapezoidal rule (auxiliary differential
// equations, Taflove & Hagness, Computational Electrodynamics, 3rd ed., 2005, ch. 9), so the von Neumann
// polynomial of the coupled update (Taflove & Hagness ch. 4: plane-wave modes e^{−jk̃iΔx} zⁿ) must have every
// root in |z| ≤ 1 for S ≤ √ε∞ whatever the pole — far above the band, far below it, lossless — and some
// root outside once S exceeds √ε∞ (the bound is sharp); with poles on the H side too (magnetic media, and the
// partial fractions of an oblique line), a closed cavity on the kernel itself keeps its energy for S ≤ √(ε∞μ∞)
// and blows up just above it. Then pulse runs on random such media must stay
// finite, decay, and stay passive (|R|² + |T|² ≤ 1 between lossless half-spaces; energy conservation,
// common practice).
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { uniformGrid } from '../../src/fdtd/build.ts';
import { updateE, updateH } from '../../src/fdtd/kernel.ts';
import { type LineMedium, type StepModel, lineMedium, stepModelFixed } from '../../src/fdtd/media.ts';
import { atIncidence } from '../../src/fdtd/oblique.ts';
import type { EffectiveStack } from '../../src/fdtd/types.ts';
import { courantLimit } from '../../src/fdtd/plan.ts';
import { createPulseRun, runToEndSync } from '../../src/fdtd/run.ts';
import { EPS0_F_per_m, linspace } from '../../src/units.ts';
import { runSpectrum } from './measure.ts';
import { bulk, material, stackOf } from './stacks.ts';

type Cx = { re: number; im: number };
type Poly = number[]; // real coefficients, lowest degree first
const pmul = (a: Poly, b: Poly): Poly => { const o = new Array(a.length + b.length - 1).fill(0); a.forEach((x, i) => b.forEach((y, j) => { o[i + j] += x * y; })); return o; };
const padd = (...ps: Poly[]): Poly => { const o = new Array(Math.max(...ps.map((p) => p.length))).fill(0); for (const p of ps) p.forEach((x, i) => { o[i] += x; }); return o; };
const pscale = (a: Poly, s: number): Poly => a.map((x) => x * s);

/** Largest root modulus (Durand–Kerner iteration on the monic polynomial). */
function largestRoot(p: Poly): number {
  while (p.length > 1 && Math.abs(p[p.length - 1]) < 1e-300) p = p.slice(0, -1);
  // Roots at z = 1 exactly (static modes of lossless terms) are divided out: multiple, they would be found
  // only to the cube root of rounding, while they sit on the circle.
  const size = (q: Poly) => q.reduce((a, x) => a + Math.abs(x), 0);
  while (p.length > 2 && Math.abs(p.reduce((a, x) => a + x, 0)) <= 1e-13 * size(p)) {
    const q: Poly = new Array(p.length - 1).fill(0);
    for (let k = p.length - 1, carry = 0; k >= 1; k--) { carry = p[k] + carry; q[k - 1] = carry; }
    p = q;
  }
  const n = p.length - 1, lead = p[n], c = p.map((x) => x / lead);
  const ev = (z: Cx): Cx => { let r: Cx = { re: 1, im: 0 }; for (let k = n - 1; k >= 0; k--) r = { re: r.re * z.re - r.im * z.im + c[k], im: r.re * z.im + r.im * z.re }; return r; };
  let zs: Cx[] = Array.from({ length: n }, (_, k) => ({ re: 1.1 * Math.cos(0.4 + (2 * Math.PI * k) / n), im: 1.1 * Math.sin(0.4 + (2 * Math.PI * k) / n) }));
  for (let it = 0; it < 1500; it++) {
    const before = zs;
    zs = zs.map((z, i) => {
      let d: Cx = { re: 1, im: 0 };
      zs.forEach((w, j) => { if (j !== i) { const a = { re: z.re - w.re, im: z.im - w.im }; d = { re: d.re * a.re - d.im * a.im, im: d.re * a.im + d.im * a.re }; } });
      const v = ev(z), q = d.re * d.re + d.im * d.im;
      return { re: z.re - (v.re * d.re + v.im * d.im) / q, im: z.im - (v.im * d.re - v.re * d.im) / q };
    });
    // Settled: no root moved by more than rounding (multiple roots converge slowly and keep going).
    if (zs.every((z, i) => Math.hypot(z.re - before[i].re, z.im - before[i].im) <= 1e-15 * Math.max(1, Math.hypot(z.re, z.im)))) break;
  }
  return Math.max(...zs.map((z) => Math.hypot(z.re, z.im)));
}

/** 4S²κ z + ε_d(z)(z − 1)² = 0 with the kernel's own coefficients for a single-pole medium, times its denominator. */
function vonNeumann(model: StepModel, dt: number, S: number, kappa: number): Poly {
  const g = uniformGrid(8, lineMedium(model), { courant: S, dt_s: dt, band_Hz: [1e9, 2e9], pmlFront: 0, pmlBack: 0 }).disp!.groups[0];
  const sig = (model.sigma * dt) / (2 * EPS0_F_per_m);
  // χ = Num/Den: Debye b(z+1)/(z − a); second order ζ(z+1)²/(z² − αz − ξ).
  const [num, den] = g.nd === 1 ? [pscale([1, 1], g.db[0]), [-g.da[0], 1]] : [pscale([1, 2, 1], g.oz[0]), [-g.ox[0], -g.oa[0], 1]];
  const zm1 = [-1, 1], zp1 = [1, 1];
  return padd(
    pmul(pscale([0, 1], 4 * S * S * kappa), den),
    pmul(pscale(pmul(zm1, zm1), model.epsInf), den),
    pmul(pscale(pmul(zp1, zm1), sig), den),
    pmul(pmul(zm1, zm1), num),
  );
}

const poleArb = fc.oneof(
  fc.record({ kind: fc.constant('debye' as const), x: fc.double({ min: -3, max: 4, noNaN: true }) }),
  fc.record({ kind: fc.constant('lorentz' as const), x: fc.double({ min: -4, max: 3, noNaN: true }), q: fc.oneof(fc.constant(0), fc.double({ min: -3, max: 3, noNaN: true })) }),
  fc.record({ kind: fc.constant('drude' as const), x: fc.double({ min: -3, max: 1, noNaN: true }), q: fc.oneof(fc.constant(0), fc.double({ min: -3, max: 3, noNaN: true })) }),
);
/** A single-pole medium on a step dt: x is log10 of the pole's ωΔt (τ/Δt for Debye), q log10 of γ/ω0 (0: lossless). */
function poleMedium(p: { kind: string; x: number; q?: number }, epsInf: number, deps: number, sigma: number, dt: number): StepModel {
  const w = 10 ** p.x / dt, gamma = p.q === undefined || p.q === 0 ? 0 : w * 10 ** p.q;
  if (p.kind === 'debye') return { epsInf, sigma, debye: [{ deps, tau_s: 10 ** p.x * dt }], osc: [] };
  if (p.kind === 'lorentz') return { epsInf, sigma, debye: [], osc: [{ c: deps * w * w, w0sq: w * w, gamma }] };
  return { epsInf, sigma, debye: [], osc: [{ c: w * w, w0sq: 0, gamma }] };
}

describe('von Neumann stability of the coupled update (kernel coefficients)', () => {
  it('every root in |z| ≤ 1 at S = √(min(1, ε∞)) for poles far above, far below and lossless; outside once S is 5 % above', () => {
    const dt = 1e-12;
    fc.assert(fc.property(poleArb, fc.double({ min: 0.3, max: 10, noNaN: true }), fc.double({ min: 0.01, max: 100, noNaN: true }),
      fc.oneof(fc.constant(0), fc.double({ min: 1e-3, max: 10, noNaN: true })), (pole, epsInf, deps, sigma) => {
        const m = poleMedium(pole, epsInf, deps, sigma, dt);
        const S = courantLimit([lineMedium(m)]);
        for (const kappa of [0.02, 0.25, 0.7, 1]) expect(largestRoot(vonNeumann(m, dt, S, kappa))).toBeLessThanOrEqual(1 + 1e-6);
        expect(largestRoot(vonNeumann(m, dt, 1.05 * Math.sqrt(epsInf), 1))).toBeGreaterThan(1 + 1e-6);
      }), { numRuns: 100 });
  });
});

/** A one-medium effective stack, to fold an angle into a line medium as the planner does. */
const alone = (m: LineMedium): EffectiveStack => ({
  front: lineMedium(stepModelFixed(1)), segments: [{ x0_m: 0, x1_m: 0.01, model: m, layer: 0, name: 'm', label: 'm' }],
  sheets: [], back: lineMedium(stepModelFixed(1)), thickness_m: 0.01, substitutions: 0,
});

/** Field energy Σ ε∞E² + μ∞H² of a closed cavity: its initial value and the largest in each half of the run. */
function cavityEnergy(m: LineMedium, S: number, dt: number, steps: number): { initial: number; first: number; second: number; largest: number } {
  const g = uniformGrid(9, m, { courant: S, dt_s: dt, band_Hz: [1e9, 2e9], pmlFront: 0, pmlBack: 0 });
  for (let i = 1; i < g.n - 1; i++) g.e[i] = Math.sin(1.7 * i) + 0.3 * Math.cos(0.4 * i);
  const energy = () => { let W = 0; for (const x of g.e) W += m.shunt.epsInf * x * x; for (const x of g.h) W += m.series.epsInf * x * x; return W; };
  const initial = energy();
  let first = 0, second = 0;
  for (let k = 1; k <= steps; k++) {
    updateH(g); updateE(g);
    if (k % 250 !== 0) continue;
    const W = energy();
    if (2 * k <= steps) first = Math.max(first, W); else second = Math.max(second, W);
    if (!(W < 1e4 * initial)) { second = Math.max(second, W); break; }
  }
  return { initial, first, second, largest: Math.max(first, second) };
}

describe('stability of the line with poles on both sides (the kernel itself)', () => {
  it('a closed cavity of any such medium keeps its energy at S = √(ε∞μ∞), normal and oblique TE and TM, and blows up just above it', () => {
    // Every mode of an 8-cell cavity (κ = sin²(πm/16)) on the kernel itself; electric poles of every kind,
    // magnetic ones as the stack file has them (Debye, Lorentz); far above, far below, lossless. The staggered
    // sum Σ ε∞E² + μ∞H² is not the conserved form (energy moves between it and the poles), so the check is that
    // it does not grow: its peak over the second half of the run stays at its peak over the first half, where
    // a growth of 1e-4 per step would multiply it by e^3.
    // A lossless Drude term is left out: under a static field its current grows without bound (a property of
    // the model — infinite static conductivity — not of the scheme; the root test above allows its z = 1 pair).
    const magneticArb = poleArb.filter((p) => p.kind !== 'drude');
    const electricArb = poleArb.filter((p) => !(p.kind === 'drude' && p.q === 0));
    const dt = 1e-12;
    fc.assert(fc.property(electricArb, magneticArb, fc.double({ min: 1, max: 10, noNaN: true }), fc.double({ min: 1, max: 6, noNaN: true }),
      fc.double({ min: 0.01, max: 30, noNaN: true }), fc.double({ min: 0.01, max: 10, noNaN: true }), fc.double({ min: 0, max: 75, noNaN: true }), fc.boolean(),
      (pe, pm, epsInf, muInf, deps, dmu, angle_deg, te) => {
        const line = lineMedium(poleMedium(pe, epsInf, deps, 0, dt), poleMedium(pm, muInf, dmu, 0, dt));
        const m = atIncidence(alone(line), { angle_rad: (angle_deg * Math.PI) / 180, polarization: te ? 'TE' : 'TM' }, [1e9, 2e9]).segments[0].model;
        const S = courantLimit([m]);
        const ok = cavityEnergy(m, S, dt, 60000);
        expect(ok.second).toBeLessThanOrEqual(1.5 * ok.first);
      }), { numRuns: 25 });
    // The bound is the product's: μ∞ = 2 over ε∞ = 0.3 allows S = √0.6, and 10 % above it blows up.
    const m = lineMedium(poleMedium({ kind: 'lorentz', x: -1, q: -1 }, 0.3, 2, 0, dt), poleMedium({ kind: 'debye', x: 1 }, 2, 3, 0, dt));
    const S = courantLimit([m]);
    expect(S).toBeCloseTo(Math.sqrt(0.6), 12);
    const at = cavityEnergy(m, S, dt, 60000), above = cavityEnergy(m, 1.1 * S, dt, 20000);
    expect(at.second).toBeLessThanOrEqual(1.5 * at.first);
    expect(above.largest).toBeGreaterThan(1e3 * above.initial);
  });
});

describe('pulse runs on random poles (far above, far below, lossless)', () => {
  it('stay finite, decay, and stay passive', () => {
    const f1 = 1e9, f2 = 3e9;
    fc.assert(fc.property(
      fc.constantFrom('above', 'below'), fc.double({ min: 0, max: 1, noNaN: true }), fc.boolean(), fc.constantFrom('lorentz', 'drude', 'debye'),
      fc.double({ min: 1, max: 6, noNaN: true }), fc.double({ min: 0.2, max: 6, noNaN: true }), fc.double({ min: 3, max: 15, noNaN: true }),
      (where, u, lossless, kind, epsInf, deps, thickness_mm) => {
        // Resonance 10–300× above the band's top or 10–300× below its bottom.
        const f0 = where === 'above' ? f2 * 10 ** (1 + 1.5 * u) : f1 / 10 ** (1 + 1.5 * u);
        const gamma_GHz = lossless ? 0 : (0.05 + u) * f0 / 1e9;
        const spec = kind === 'lorentz'
          ? { model: 'lorentz' as const, eps_inf: epsInf, poles: [{ delta_eps: deps, f0_GHz: f0 / 1e9, gamma_GHz }], sigma_S_per_m: 0 }
          : kind === 'drude'
            ? { model: 'drude' as const, eps_inf: epsInf, plasma_GHz: f0 / 1e9, collision_GHz: gamma_GHz, sigma_S_per_m: 0 }
            : { model: 'debye' as const, eps_inf: epsInf, poles: [{ delta_eps: deps, tau_ps: 1e12 / (2 * Math.PI * f0) }], sigma_S_per_m: 0 };
        const stack = stackOf([bulk(material('pole', spec), thickness_mm)], { band_GHz: [1, 3] });
        const run = runToEndSync(createPulseRun(stack, { accuracy: 0.03 }));
        const r = run.records();
        for (const key of ['incident', 'reflected', 'transmitted'] as const) expect(r[key].every(Number.isFinite)).toBe(true);
        expect(run.energy().level_dB).toBeLessThan(-40);
        const sp = runSpectrum(run, linspace(f1, f2, 9));
        sp.R.forEach((R, k) => expect(R.re ** 2 + R.im ** 2 + sp.T[k].re ** 2 + sp.T[k].im ** 2).toBeLessThanOrEqual(1 + 0.03));
      }), { numRuns: 12 });
  });
});

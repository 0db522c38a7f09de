// Stability by construction. Every pole is updated with the trapezoidal rule (auxiliary differential
// equations, Taflove & Hagness, Computational Electrodynamics, 3rd ed., 2005, ch. 9), so the von Neumann
// polynomial of the coupled update (Taflove & Hagness ch. 4: plane-wave modes e^{−jk̃iΔx} zⁿ) must have every
// root in |z| ≤ 1 for S ≤ √ε∞ whatever the pole — far above the band, far below it, lossless — and some
// root outside once S exceeds √ε∞ (the bound is sharp). Then pulse runs on random such media must stay
// finite, decay, and stay passive (|R|² + |T|² ≤ 1 between lossless half-spaces; energy conservation,
// common practice).
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { uniformGrid } from '../../src/fdtd/build.ts';
import { type StepModel, lineMedium } from '../../src/fdtd/media.ts';
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
  const n = p.length - 1, lead = p[n], c = p.map((x) => x / lead);
  const ev = (z: Cx): Cx => { let r: Cx = { re: 1, im: 0 }; for (let k = n - 1; k >= 0; k--) r = { re: r.re * z.re - r.im * z.im + c[k], im: r.re * z.im + r.im * z.re }; return r; };
  let zs: Cx[] = Array.from({ length: n }, (_, k) => ({ re: 1.1 * Math.cos(0.4 + (2 * Math.PI * k) / n), im: 1.1 * Math.sin(0.4 + (2 * Math.PI * k) / n) }));
  for (let it = 0; it < 1500; it++) {
    zs = zs.map((z, i) => {
      let d: Cx = { re: 1, im: 0 };
      zs.forEach((w, j) => { if (j !== i) { const a = { re: z.re - w.re, im: z.im - w.im }; d = { re: d.re * a.re - d.im * a.im, im: d.re * a.im + d.im * a.re }; } });
      const v = ev(z), q = d.re * d.re + d.im * d.im;
      return { re: z.re - (v.re * d.re + v.im * d.im) / q, im: z.im - (v.im * d.re - v.re * d.im) / q };
    });
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

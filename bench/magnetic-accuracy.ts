// Worst errors of the μ ≠ 1 checks, measured (not asserted): the closed forms in the exact solver and the FEM,
// the 40° profiles against the ABCD cascade, and the property-test quantities over random stacks.
// Run: npx tsx bench/magnetic-accuracy.ts

import { type Complex } from '../src/complex.ts';
import { profileFem } from '../src/fem/profile.ts';
import { solveFem } from '../src/fem/solve.ts';
import type { Stack } from '../src/stack/types.ts';
import { profilePositions, profileTmm } from '../src/tmm/profile.ts';
import { absorption, solveTmm, tmmAt } from '../src/tmm/solve.ts';
import { AIR, dielectric, layer, magnetic, makeStack, prng, sheet } from '../test/support/build-stack.ts';
import { referenceOf, referenceProfile, referenceRT } from '../test/support/field-reference.ts';
import { CASE_FREQUENCY_Hz, type ClosedFormCase, fresnelCases, matchedCases, quarterWaveAbsorber, shortedLayerCases } from '../test/support/magnetic-cases.ts';

const dist = (a: Complex, b: Complex) => Math.hypot(a.re - b.re, a.im - b.im);
const fmt = (x: number) => x.toExponential(2);
const femAt = (st: Stack, f: number, tolerance = 1e-8) => {
  const sp = solveFem(st, Float64Array.of(f), { tolerance }).spectrum;
  return { R: { re: sp.R_re[0], im: sp.R_im[0] }, T: { re: sp.T_re[0], im: sp.T_im[0] } };
};

function worstCase(cases: ClosedFormCase[], solve: (st: Stack, f: number) => { R: Complex; T: Complex }): number {
  let w = 0;
  for (const c of cases) {
    const { R, T } = solve(c.stack, c.f_Hz);
    w = Math.max(w, dist(R, c.R), c.T ? dist(T, c.T) : Math.hypot(T.re, T.im));
  }
  return w;
}

function absorberCases(): ClosedFormCase[] {
  return [[10, 0.005], [20, 0.005], [40, 0.004]].map(([eps, d]) => {
    const { mu } = quarterWaveAbsorber(eps, d);
    return { name: `absorber ${eps}`, stack: makeStack({ layers: [layer(magnetic(eps, 0, mu.re, -mu.im), d)], back: 'pec' }), f_Hz: CASE_FREQUENCY_Hz, R: { re: 0, im: 0 }, T: null };
  });
}

function brewsterCases(): ClosedFormCase[] {
  const th = (Math.asin(Math.sqrt(8 / 15)) * 180) / Math.PI;
  return ([['TM', 4, 2], ['TE', 2, 4]] as const).map(([pol, e, m]) => {
    const back = magnetic(e, 0, m);
    return { name: `Brewster ${pol}`, stack: makeStack({ layers: [layer(back, 0.01)], back, angle_deg: th, polarization: pol }), f_Hz: CASE_FREQUENCY_Hz, R: { re: 0, im: 0 }, T: null };
  });
}

const groups: [string, ClosedFormCase[]][] = [
  ['Fresnel with μ (40 cases)', fresnelCases()], ['matched ε = μ (6)', matchedCases()],
  ['shorted magnetic layer (6)', shortedLayerCases()], ['quarter-wave absorber (3)', absorberCases()],
];
console.log('closed forms                 tmm        fem (tolerance 1e-8)');
for (const [name, cases] of groups) console.log(`${name.padEnd(28)} ${fmt(worstCase(cases, tmmAt))}   ${fmt(worstCase(cases, femAt))}`);
const bw = brewsterCases();
const rOnly = (solve: (st: Stack, f: number) => { R: Complex }) => Math.max(...bw.map((c) => Math.hypot(...Object.values(solve(c.stack, c.f_Hz).R))));
console.log(`${'Brewster |R| (2)'.padEnd(28)} ${fmt(rOnly(tmmAt))}   ${fmt(rOnly(femAt))}`);

console.log('\nprofiles at 40° vs ABCD cascade      tmm E     tmm H     fem E     fem H');
const F = 5e9;
for (const pol of ['TE', 'TM'] as const) for (const back of ['magnetic', 'pec'] as const) {
  const st = makeStack({
    layers: [layer(magnetic(6, 0.05, 3, 1.2), 0.004), sheet(300), layer(dielectric(2.5, 0.01), 0.01), layer(magnetic(1.5, 0, 4, 0.3), 0.003)],
    back: back === 'pec' ? 'pec' : magnetic(2, 0, 2), angle_deg: 40, polarization: pol, band_GHz: [2, 8],
  });
  const x = profilePositions(st, F);
  const ref = referenceProfile(referenceOf(st, F), F, x);
  const w = (p: ReturnType<typeof profileTmm>) => {
    let e = 0, h = 0;
    for (let k = 0; k < x.length; k++) {
      e = Math.max(e, dist({ re: p.E_re[k], im: p.E_im[k] }, ref.E[k]));
      h = Math.max(h, dist({ re: p.H_re![k], im: p.H_im![k] }, ref.H[k]));
    }
    return [e, h];
  };
  const [te, th] = w(profileTmm(st, F, x)), [fe, fh] = w(profileFem(st, F, x, {}, true));
  console.log(`${`${pol}, ${back} back`.padEnd(36)} ${fmt(te)}  ${fmt(th)}  ${fmt(fe)}  ${fmt(fh)}`);
}

// Random magnetic stacks (the property tests' kind), 2000 of them.
const rand = prng(99);
let abcd = 0, energy = 0, recip = 0, femWorst = 0;
for (let k = 0; k < 2000; k++) {
  const lossy = k % 2 === 1;
  const med = () => magnetic(1 + 9 * rand(), lossy ? 0.2 * rand() : 0, 0.5 + 7.5 * rand(), lossy ? 3 * rand() : 0);
  const layers = Array.from({ length: 1 + Math.floor(rand() * 5) }, () => (lossy && rand() < 0.15 ? sheet(20 + 780 * rand()) : layer(med(), 0.5e-3 + 30e-3 * rand())));
  const front = rand() < 0.5 ? AIR : magnetic(1 + 9 * rand(), 0, 0.5 + 7.5 * rand());
  const st = makeStack({ front, layers, back: rand() < 0.2 ? 'pec' : magnetic(1 + 9 * rand(), 0, 0.5 + 7.5 * rand()), angle_deg: rand() < 0.3 ? 0 : 85 * rand(), polarization: rand() < 0.5 ? 'TE' : 'TM', band_GHz: [1, 12] });
  const f = 1e9 + 11e9 * rand();
  const a = tmmAt(st, f), b = referenceRT(referenceOf(st, f), f);
  abcd = Math.max(abcd, dist(a.R, b.R), dist(a.T, b.T));
  if (!lossy) energy = Math.max(energy, Math.abs(absorption(st, solveTmm(st, Float64Array.of(f)))[0]));
  const between: Stack = { ...st, back: st.front };
  const t1 = tmmAt(between, f).T, t2 = tmmAt({ ...between, layers: [...between.layers].reverse() }, f).T;
  recip = Math.max(recip, dist(t1, t2) / Math.max(1, Math.hypot(t1.re, t1.im)));
  if (k < 200) { const fm = femAt(st, f, 1e-5); femWorst = Math.max(femWorst, dist(a.R, fm.R), dist(a.T, fm.T)); }
}
console.log(`\nrandom stacks (2000): tmm vs ABCD ${fmt(abcd)}, lossless |1 − |R|² − P|T|²| ${fmt(energy)}, reciprocity ${fmt(recip)}; FEM (default 1e-5 target) vs tmm over 200: ${fmt(femWorst)}`);

// Mesh planning: nodes on every interface, element size from the density, the automatic choice, and refusals.
// (Bookkeeping checks; the accuracy they buy is checked against sources in the other FEM tests.)

import { describe, expect, it } from 'vitest';
import { planMesh } from '../../src/fem/mesh.ts';
import { solveFem } from '../../src/fem/solve.ts';
import { createTridiagonal, solveSeriesShunt, solveTridiagonal } from '../../src/fem/tridiag.ts';
import { interfacePositions_m } from '../../src/stack/types.ts';
import { C0_m_per_s } from '../../src/units.ts';
import { AIR, dielectric, layer, makeStack, prng, sheet } from '../support/build-stack.ts';

const stack = makeStack({ layers: [layer(dielectric(4), 0.013), sheet(100), layer(AIR, 0.0271), layer(dielectric(9, 0.02), 0.0049)] });
const f = Float64Array.of(1e9, 6e9);

describe('mesh', () => {
  it('puts a vertex on every interface and sizes elements from the density (TE and TM)', () => {
    for (const polarization of ['TE', 'TM'] as const) {
      const mesh = planMesh({ ...stack, incidence: { angle_rad: 0, polarization } }, f, { order: 2, density: 12 });
      const faces = interfacePositions_m(stack);
      for (const x of faces) expect(mesh.vertexX.some((v) => Math.abs(v - x) < 1e-15)).toBe(true);
      // Layer 0: ε_r = 4 at 6 GHz, λ = 25 mm → 13 mm is 0.52 λ → ceil(12 · 0.52) = 7 elements.
      const lambda = C0_m_per_s / 6e9 / 2;
      expect(mesh.info.elements_per_layer[0]).toBe(Math.ceil((12 * 0.013) / lambda));
      expect(mesh.info.elements_per_layer[1]).toBe(0); // the sheet
      // TM splits the sheet's vertex: one more vertex than elements + 1.
      const vertices = mesh.info.elements + 1 + (polarization === 'TM' ? 1 : 0);
      expect(mesh.vertexX.length).toBe(vertices);
      expect(mesh.info.unknowns).toBe(vertices + mesh.info.elements);
    }
  });

  it('picks p = 3 by default (fewest elements for the target) and a density from the estimate', () => {
    const { mesh } = solveFem(stack, f);
    expect(mesh.order).toBe(3);
    expect(mesh.order_auto && mesh.density_auto).toBe(true);
    expect(mesh.estimate).toBeLessThanOrEqual(1e-6 * 1.0001);
    // A tighter tolerance asks for a finer mesh.
    expect(solveFem(stack, f, { tolerance: 1e-9 }).mesh.density).toBeGreaterThan(mesh.density);
  });

  it('refuses bad options naming the field', () => {
    expect(() => solveFem(stack, f, { order: 4 as never })).toThrow(/fem\.order/);
    expect(() => solveFem(stack, f, { density: 1 })).toThrow(/fem\.density/);
    expect(() => solveFem(stack, f, { density: Number.NaN })).toThrow(/fem\.density/);
    expect(() => solveFem(stack, f, { tolerance: 0 })).toThrow(/fem\.tolerance/);
  });

  it('refuses a mesh beyond the element limit with a clear message', () => {
    const huge = makeStack({ layers: [layer(dielectric(80), 10)], band_GHz: [100, 1000] });
    expect(() => solveFem(huge, Float64Array.of(1e12))).toThrow(/fem: the mesh would need/);
  });
});

describe('complex tridiagonal solve', () => {
  it('leaves a residual at round-off on a random complex symmetric system (A x = b checked directly)', () => {
    const rand = prng(7), n = 50, t = createTridiagonal(n);
    for (let i = 0; i < n; i++) {
      t.dRe[i] = rand() * 4 - 2; t.dIm[i] = rand() * 4 - 2; t.bRe[i] = rand(); t.bIm[i] = rand();
      if (i < n - 1) { t.oRe[i] = rand() - 0.5; t.oIm[i] = rand() - 0.5; }
    }
    solveTridiagonal(t);
    for (let i = 0; i < n; i++) {
      const terms: [number, number, number][] = [[t.dRe[i], t.dIm[i], i]];
      if (i > 0) terms.push([t.oRe[i - 1], t.oIm[i - 1], i - 1]);
      if (i < n - 1) terms.push([t.oRe[i], t.oIm[i], i + 1]);
      let rr = -t.bRe[i], ri = -t.bIm[i];
      for (const [ar, ai, j] of terms) { rr += ar * t.xRe[j] - ai * t.xIm[j]; ri += ar * t.xIm[j] + ai * t.xRe[j]; }
      expect(Math.hypot(rr, ri)).toBeLessThan(1e-10);
    }
  });

  it('in shunt and series form: the same system, A x = b checked directly with d = shunt + the series either side', () => {
    const rand = prng(11), n = 50, t = createTridiagonal(n);
    for (let i = 0; i < n; i++) {
      t.shRe[i] = rand() * 4 - 2; t.shIm[i] = rand() * 4 - 2; t.bRe[i] = rand(); t.bIm[i] = rand();
      if (i < n - 1) { t.seRe[i] = rand() - 0.5; t.seIm[i] = rand() - 0.5; }
    }
    solveSeriesShunt(t);
    const se = (i: number): [number, number] => (i >= 0 && i < n - 1 ? [t.seRe[i], t.seIm[i]] : [0, 0]);
    for (let i = 0; i < n; i++) {
      const terms: [number, number, number][] = [[t.shRe[i] + se(i - 1)[0] + se(i)[0], t.shIm[i] + se(i - 1)[1] + se(i)[1], i]];
      if (i > 0) terms.push([-se(i - 1)[0], -se(i - 1)[1], i - 1]);
      if (i < n - 1) terms.push([-se(i)[0], -se(i)[1], i + 1]);
      let rr = -t.bRe[i], ri = -t.bIm[i];
      for (const [ar, ai, j] of terms) { rr += ar * t.xRe[j] - ai * t.xIm[j]; ri += ar * t.xIm[j] + ai * t.xRe[j]; }
      expect(Math.hypot(rr, ri)).toBeLessThan(1e-10);
    }
  });
});

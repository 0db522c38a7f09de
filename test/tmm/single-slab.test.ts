// A single lossy slab against the Airy (multiple-beam) closed form:
//   R = r (1 − e^{−j2q}) / (1 − r² e^{−j2q}),  T = (1 − r²) e^{−jq} / (1 − r² e^{−j2q}),
//   q = k0 d √(ε_r − sin²θ), r the TE Fresnel coefficient of the air/slab face.
// Source: Born & Wolf, Principles of Optics, §1.6; the same form appears in ITU-R P.2040-3 §3
// for building-material slabs (recalled from memory; the algebra is checked here, not the text).

import { describe, expect, it } from 'vitest';
import { type Complex, add, cx, div, exp, mul, scale, sqrt, sub } from '../../src/complex.ts';
import { permittivity } from '../../src/materials/permittivity.ts';
import { tmmAt } from '../../src/tmm/solve.ts';
import { C0_m_per_s } from '../../src/units.ts';
import { bulk, layer, makeStack } from '../support/build-stack.ts';

// ITU-R P.2040-3 Table 3 concrete: ε' = 5.24, σ = 0.0462 f^0.7822 (f in GHz).
const concrete = bulk({ model: 'power-law', a: 5.24, b: 0, c: 0.0462, d: 0.7822 }, 'concrete');

function airy(eps: Complex, d: number, f: number, theta: number): { R: Complex; T: Complex } {
  const s2 = Math.sin(theta) ** 2;
  const root = sqrt(sub(eps, cx(s2)));
  const cosI = Math.cos(theta);
  const r = div(sub(cx(cosI), root), add(cx(cosI), root)); // TE: (cos θ − √(ε − sin²θ)) / (…)
  const q = scale(root, (2 * Math.PI * f * d) / C0_m_per_s);
  const e1 = exp(mul(cx(0, -1), q)), e2 = mul(e1, e1);
  const r2 = mul(r, r);
  const den = sub(cx(1), mul(r2, e2));
  return { R: div(mul(r, sub(cx(1), e2)), den), T: div(mul(sub(cx(1), r2), e1), den) };
}

describe('single slab (Airy form)', () => {
  for (const [f_GHz, d_mm, deg] of [[1, 200, 0], [2.4, 150, 0], [5.8, 100, 30], [10, 120, 60]] as const) {
    it(`concrete ${d_mm} mm at ${f_GHz} GHz, ${deg}° TE`, () => {
      const f = f_GHz * 1e9, d = d_mm / 1000, th = (deg * Math.PI) / 180;
      const ref = airy(permittivity(concrete.spec, f), d, f, th);
      const got = tmmAt(makeStack({ layers: [layer(concrete, d)], angle_deg: deg, polarization: 'TE' }), f);
      expect(Math.hypot(got.R.re - ref.R.re, got.R.im - ref.R.im)).toBeLessThan(1e-9);
      expect(Math.hypot(got.T.re - ref.T.re, got.T.im - ref.T.im)).toBeLessThan(1e-9);
    });
  }
});

// Echo timing and attribution on synthetic records built from closed-form echo trains.
import { describe, expect, it } from 'vitest';
import { measureEchoes } from '../../src/echoes/echoes.ts';
import { echoTable } from '../../src/echoes/table.ts';
import { dielectric, layer, makeStack } from '../support/build-stack.ts';

const C0 = 299792458;
const gauss = (t: number, t0: number, s: number) => Math.exp(-((t - t0) ** 2) / (2 * s * s));
/** Wideband sine-modulated Gaussian (zero mean); an echo is a shifted, scaled copy. */
const pulse = (t: number, t0: number) => gauss(t, t0, 70e-12) * Math.sin(2 * Math.PI * 3e9 * (t - t0));

/** Records of an echo train: (delay s, amplitude) pairs after an incident pulse centred at t0. */
function train(echoes: [number, number][], dt: number, N: number, t0 = 0.6e-9) {
  const incident = new Float64Array(N), reflected = new Float64Array(N);
  for (let i = 0; i < N; i++) {
    const t = i * dt;
    incident[i] = pulse(t, t0);
    for (const [d, a] of echoes) reflected[i] += a * pulse(t, t0 + d);
  }
  return { dt_s: dt, count: N, incident, reflected };
}

describe('measured echoes', () => {
  it("a slab's back-face echo comes 2 d √ε'/c after the front-face echo, with the closed-form levels", () => {
    // Air | ε_r = 4, d = 30 mm | air. Back-face delay 2 d √ε'/c = 0.4003 ns (physics reference, closed forms);
    // amplitudes r = −1/3, then t01 r12 t10 = (2/3)(1/3)(4/3) = 8/27, then 8/27 · (1/3)² (Airy series terms).
    const d = 0.03, tau2 = (2 * d * 2) / C0;
    const rec = train([[0, -1 / 3], [tau2, 8 / 27], [2 * tau2, 8 / 243]], 1e-12, 3000);
    const m = measureEchoes(rec.incident, rec.reflected, rec.dt_s);
    expect(m.t_s.length).toBe(3);
    expect(Math.abs(m.t_s[0])).toBeLessThan(0.05e-12);
    expect(Math.abs(m.t_s[1] - tau2)).toBeLessThan(0.05e-12);
    expect(Math.abs(m.t_s[2] - 2 * tau2)).toBeLessThan(0.05e-12);
    expect(m.amplitude[0]).toBeCloseTo(-1 / 3, 4);
    expect(m.amplitude[1]).toBeCloseTo(8 / 27, 4);
    expect(m.amplitude[2]).toBeCloseTo(8 / 243, 4);
    expect(m.level_dB[0]).toBeCloseTo(20 * Math.log10(1 / 3), 3);
  });

  it('drops echoes below the relative threshold and returns nothing (not NaN) for a silent record', () => {
    const rec = train([[0, 0.5], [0.5e-9, 0.5e-3]], 1e-12, 2000);
    expect(measureEchoes(rec.incident, rec.reflected, rec.dt_s).t_s.length).toBe(1);
    expect(measureEchoes(rec.incident, rec.reflected, rec.dt_s, { relative_dB: -70 }).t_s.length).toBe(2);
    const silent = measureEchoes(rec.incident, new Float64Array(2000), rec.dt_s);
    expect(silent.t_s.length).toBe(0);
    expect(silent.pulseWidth_s).toBeGreaterThan(0);
  });
});

describe('attribution', () => {
  it('names each echo of a two-layer stack from hand-derived delays and amplitudes', () => {
    // Air | ε 4, 30 mm | ε 2.25, 90 mm | air. One-way delays τ1 = 2·0.03/c, τ2 = 1.5·0.09/c.
    // Interface coefficients (closed form r = (n1 − n2)/(n1 + n2), t = 1 + r):
    // r01 = −1/3, r12 = 1/7, r2b = 1/5, r10 = 1/3, t01 = 2/3, t10 = 4/3, t12 = 8/7, t21 = 6/7.
    const t1 = 0.06 / C0, t2 = 0.135 / C0;
    const echoes: [number, number][] = [
      [0, -1 / 3],                                                      // front face
      [2 * t1, (2 / 3) * (1 / 7) * (4 / 3)],                            // back of layer 1
      [2 * t1 + 2 * t2, (2 / 3) * (8 / 7) * 0.2 * (6 / 7) * (4 / 3)],   // back face
      [4 * t1, (2 / 3) * (1 / 7) * (1 / 3) * (1 / 7) * (4 / 3)],       // two round trips in layer 1
    ];
    const rec = train(echoes, 1e-12, 4000);
    const stack = makeStack({ band_GHz: [1, 5], layers: [layer(dielectric(4, 0, 'slab'), 0.03), layer(dielectric(2.25, 0, 'foam'), 0.09)] });
    const tab = echoTable(stack, rec);
    expect(tab.path).toEqual(['front face', 'back of layer 1 (slab)', 'two round trips inside layer 1 (slab)', 'back face']);
    for (let k = 0; k < tab.t_s.length; k++) expect(Math.abs(tab.t_s[k] - tab.predicted_t_s[k])).toBeLessThan(0.1e-12);
    expect(tab.amplitude[3]).toBeCloseTo(echoes[2][1], 3);
  });

  it('paths closer than the pulse width are named together, in order of arrival', () => {
    // Air | ε_r = 4, 5 mm | conductor. Front face r = −1/3; conductor path t01 (−1) t10 = −(2/3)(4/3) = −8/9
    // (closed forms, physics reference), 2 d √ε'/c = 67 ps later: inside half the pulse's 165 ps width.
    const tau = (2 * 0.005 * 2) / C0;
    const rec = train([[0, -1 / 3], [tau, -8 / 9]], 1e-12, 3000);
    const stack = makeStack({ band_GHz: [1, 5], layers: [layer(dielectric(4, 0, 'slab'), 0.005)], back: 'pec' });
    const tab = echoTable(stack, rec);
    expect(tab.path[0]).toBe('front face & conductor (unresolved)');
    // the predicted delay is the strongest path's
    expect(tab.predicted_t_s[0]).toBeCloseTo(tau, 15);
  });

  it('an echo far from every predicted path is reported as unmatched', () => {
    const t1 = 0.12 / C0; // ε 4, 60 mm: back face at 0.80 ns, two round trips at 1.60 ns; the stray echo at 1.10 ns
    const rec = train([[0, -1 / 3], [2 * t1, 0.1], [2.75 * t1, 0.1]], 1e-12, 3000);
    const stack = makeStack({ band_GHz: [1, 5], layers: [layer(dielectric(4, 0, 'slab'), 0.06)] });
    const tab = echoTable(stack, rec);
    expect(tab.path).toEqual(['front face', 'back face', 'unmatched (nearest: back face)']);
  });
});

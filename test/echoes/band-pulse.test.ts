// The band pulse: a Kaiser window over the band. Its envelope's closed form (the Fourier transform of
// the Kaiser window, Kaiser & Schafer, IEEE Trans. ASSP 28(1), 1980) against a direct numerical
// integration of the window, its half-maximum width, the sidelobe level the trace view relies on
// (clean below −80 dB), and the leakage bound the detector uses.
import { describe, expect, it } from 'vitest';
import { bandPulse, bandWindow, besselI0, envelopeShape, leakBeyond, WIDTH_TIMES_BAND } from '../../src/echoes/band-pulse.ts';

const band: [number, number] = [1e9, 6e9];
const B = band[1] - band[0], f0 = 3.5e9;

/** ∫ W(f) e^{j2π(f − f0)t} df / ∫ W df by the midpoint rule (W is even about f0, so the integral is real). */
function integrated(t: number, n = 20000): number {
  let s = 0, s0 = 0;
  for (let i = 0; i < n; i++) {
    const f = band[0] + ((i + 0.5) * B) / n, w = bandWindow(f, band);
    s += w * Math.cos(2 * Math.PI * (f - f0) * t);
    s0 += w;
  }
  return s / s0;
}

describe('band pulse', () => {
  it('I0 matches its tabulated values', () => {
    // Abramowitz & Stegun, Table 9.8 (from memory): I0(1) = 1.266065878, I0(5) = 27.23987182
    expect(besselI0(1)).toBeCloseTo(1.266065878, 8);
    expect(besselI0(5)).toBeCloseTo(27.23987182, 6);
  });

  it('the window is 1 at the band centre and 0 outside the band', () => {
    expect(bandWindow(f0, band)).toBeCloseTo(1, 14);
    expect(bandWindow(0.99e9, band)).toBe(0);
    expect(bandWindow(6.01e9, band)).toBe(0);
  });

  it("the envelope's closed form is the window's transform, main lobe and sidelobes", () => {
    for (const tB of [0, 0.3, 1, 1.9, 3.5, 3.82, 5, 9]) {
      const t = tB / B;
      expect(Math.abs(envelopeShape(Math.PI * B * t) - integrated(t))).toBeLessThan(1e-7);
    }
  });

  it('its width at half maximum is WIDTH_TIMES_BAND / B', () => {
    const W = bandPulse(band).width_s;
    expect(W * B).toBe(WIDTH_TIMES_BAND);
    expect(integrated(W / 2)).toBeCloseTo(0.5, 6);
  });

  it('beyond its main lobe the envelope stays below −85 dB (so a dB view is clean to −80 dB)', () => {
    // first null: π B t = √(β² + π²), β = 12
    const firstNull = Math.sqrt(144 + Math.PI ** 2) / Math.PI;
    let worst = 0;
    for (let tB = firstNull; tB < 30; tB += 0.02) worst = Math.max(worst, Math.abs(integrated(tB / B, 2000)));
    expect(20 * Math.log10(worst)).toBeLessThan(-85);
  });

  it('leakBeyond bounds the envelope at every later time', () => {
    for (let tB = 0; tB < 20; tB += 0.1) {
      const bound = leakBeyond(tB / B, B);
      for (let u = tB; u < 25; u += 0.1) expect(Math.abs(envelopeShape(Math.PI * u))).toBeLessThanOrEqual(bound * (1 + 1e-12));
    }
  });
});

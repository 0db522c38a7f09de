// fft.js conventions and the DTFT against closed forms.
import { describe, expect, it } from 'vitest';
import { inverseFft, nextPow2, realFft } from '../../src/spectra/fft.ts';
import { dtft } from '../../src/spectra/dtft.ts';

describe('fft.js sign convention', () => {
  // With time dependence e^{+jωt} a forward transform must use the kernel e^{−j2πkn/N}, so a
  // delay of d samples shows as phase −2πkd/N (shift theorem; e.g. Oppenheim & Schafer,
  // Discrete-Time Signal Processing, 3rd ed., Table 8.2).
  it('a delayed impulse has phase −ωτ', () => {
    const N = 64, d = 5;
    const x = new Float64Array(N); x[d] = 1;
    const X = realFft(x);
    for (let k = 0; k < N; k++) {
      const expected = (-2 * Math.PI * k * d) / N;
      expect(X.re[k]).toBeCloseTo(Math.cos(expected), 12);
      expect(X.im[k]).toBeCloseTo(Math.sin(expected), 12);
    }
  });
  it('all bins above N/2 are filled (completeSpectrum), matching a direct DFT', () => {
    const N = 32, x = new Float64Array(N);
    for (let n = 0; n < N; n++) x[n] = Math.sin(0.7 * n) + 0.3 * Math.cos(2.1 * n) + (n % 5) * 0.1;
    const X = realFft(x);
    for (let k = 0; k < N; k++) {
      let re = 0, im = 0;
      for (let n = 0; n < N; n++) { re += x[n] * Math.cos((2 * Math.PI * k * n) / N); im -= x[n] * Math.sin((2 * Math.PI * k * n) / N); }
      expect(X.re[k]).toBeCloseTo(re, 10);
      expect(X.im[k]).toBeCloseTo(im, 10);
    }
  });
  it('inverse undoes forward; zero-padding to a power of two', () => {
    const x = new Float64Array(37).map((_, n) => Math.exp(-((n - 15) ** 2) / 20));
    expect(nextPow2(37)).toBe(64);
    const y = inverseFft(realFft(x));
    expect(y.re.length).toBe(64);
    for (let n = 0; n < 64; n++) {
      expect(y.re[n]).toBeCloseTo(n < 37 ? x[n] : 0, 12);
      expect(y.im[n]).toBeCloseTo(0, 12);
    }
  });
});

describe('DTFT at arbitrary frequencies', () => {
  it('equals the FFT at the bin frequencies', () => {
    const N = 1000, dt = 1e-12, nfft = 1024;
    const x = new Float64Array(N).map((_, n) => Math.exp(-(((n - 300) / 40) ** 2)) * Math.cos(0.3 * n));
    const X = realFft(x, nfft);
    const bins = [0, 3, 17, 100, 511];
    const f = Float64Array.from(bins, (k) => k / (nfft * dt));
    const D = dtft(x, dt, f);
    bins.forEach((k, i) => {
      expect(D.re[i]).toBeCloseTo(X.re[k], 9);
      expect(D.im[i]).toBeCloseTo(X.im[k], 9);
    });
  });
  it("a sampled Gaussian's DTFT·Δt is its continuous Fourier transform", () => {
    // Fourier pair (e.g. Bracewell, The Fourier Transform and Its Applications, ch. 6):
    // g(t) = exp(−(t−t0)²/(2s²))  ↔  G(f) = s√(2π) exp(−2π²s²f²) e^{−j2πf t0}.
    const dt = 2e-12, s = 50e-12, t0 = 1.23e-9, N = 2000;
    const x = new Float64Array(N).map((_, n) => Math.exp(-((n * dt - t0) ** 2) / (2 * s * s)));
    const f = Float64Array.from([0.1e9, 1e9, 2.7e9, 5e9, 7.3e9]);
    const D = dtft(x, dt, f);
    f.forEach((fk, i) => {
      const mag = s * Math.sqrt(2 * Math.PI) * Math.exp(-2 * Math.PI ** 2 * s * s * fk * fk);
      const ph = -2 * Math.PI * fk * t0;
      expect(D.re[i] * dt).toBeCloseTo(mag * Math.cos(ph), 14);
      expect(D.im[i] * dt).toBeCloseTo(mag * Math.sin(ph), 14);
      expect(Math.abs(D.re[i] * dt - mag * Math.cos(ph))).toBeLessThan(1e-9 * s);
    });
  });
});

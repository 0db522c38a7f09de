// Property test over random stacks (fast-check): every row of the echo tables sits on a peak of the exact
// band envelope (support.ts: the exact solution's R(f) or T(f) times the band pulse's spectrum, inverse
// FFT, Hilbert envelope) searched from delay −width/10 on (the window's start counts where the envelope
// falls from it), at or above the floor, is some bounce path, and no path is named in two rows.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { bandPulse } from '../../src/echoes/band-pulse.ts';
import { EARLIEST_WIDTHS } from '../../src/echoes/detect.ts';
import { analyseEchoes } from '../../src/echoes/table.ts';
import type { Layer } from '../../src/stack/types.ts';
import { dielectric, layer, makeStack, sheet } from '../support/build-stack.ts';
import { envelopeValue, exactEnvelope, exactPeaks, exactRecords } from './support.ts';

const layerArb = fc.record({
  eps: fc.double({ min: 1.5, max: 6, noNaN: true }),
  sigma: fc.oneof(fc.constant(0), fc.double({ min: 1e-3, max: 0.05, noNaN: true })),
  thickness_mm: fc.double({ min: 5, max: 150, noNaN: true }),
});

const stackArb = fc.record({
  layers: fc.array(layerArb, { minLength: 1, maxLength: 3 }),
  sheetAt: fc.option(fc.nat(3)),
  ohm_per_sq: fc.double({ min: 100, max: 2000, noNaN: true }),
  back: fc.oneof(fc.constant('air' as const), fc.constant('pec' as const), fc.double({ min: 1, max: 6, noNaN: true })),
  f1_GHz: fc.double({ min: 0.5, max: 4, noNaN: true }),
  ratio: fc.double({ min: 2, max: 6, noNaN: true }),
}).map((o) => {
  // behind a conductor every layer is a little lossy, so the record has rung down within its length
  const layers: Layer[] = o.layers.map((l, i) => layer(dielectric(l.eps, o.back === 'pec' ? Math.max(l.sigma, 0.01) : l.sigma, `m${i + 1}`), l.thickness_mm / 1000));
  if (o.sheetAt !== null) layers.splice(Math.min(o.sheetAt, layers.length), 0, sheet(o.ohm_per_sq));
  const back = o.back === 'air' || o.back === 'pec' ? (o.back === 'pec' ? 'pec' as const : undefined) : dielectric(o.back, 0, 'backing');
  return makeStack({ band_GHz: [o.f1_GHz, o.f1_GHz * o.ratio], layers, ...(back ? { back } : {}) });
});

describe('echo tables over random stacks', () => {
  it('rows are peaks of the exact envelope, above the floor, with no path in two rows', () => {
    fc.assert(fc.property(stackArb, (stack) => {
      const a = analyseEchoes(stack, exactRecords(stack, 64e-9));
      const W = bandPulse(stack.band_Hz).width_s;
      for (const [t, which] of [[a.reflected, 'R'], [a.transmitted, 'T']] as const) {
        if (t === null) continue;
        const exact = exactEnvelope(stack, which, W / 50, 128e-9);
        const peaks = exactPeaks(exact, 0.005);
        for (let i = 0; i < t.t_s.length; i++) {
          expect(t.level_dB[i]).toBeGreaterThanOrEqual(-40 - 1e-9);
          const start = -EARLIEST_WIDTHS * W; // −width/10: the envelope is searched from there on
          expect(t.t_s[i]).toBeGreaterThanOrEqual(start);
          if (t.t_s[i] === start) {
            // the start of the searched window, where the envelope falls from it
            expect(envelopeValue(exact, start)).toBeGreaterThan(envelopeValue(exact, start + W / 25));
          } else {
            const near = peaks.reduce((d, p) => Math.min(d, Math.abs(p.t_s - t.t_s[i])), Infinity);
            expect(near, `row ${i} at ${t.t_s[i] * 1e9} ns is an envelope peak`).toBeLessThan(W / 50);
          }
          expect(Math.abs(t.level_dB[i] - 20 * Math.log10(envelopeValue(exact, t.t_s[i])))).toBeLessThan(0.1);
        }
        expect(t.path).not.toContain('unexplained'); // exact records: every echo is some bounce path
        const names = t.members.flat().map((m) => m.path);
        expect(new Set(names).size).toBe(names.length);
        expect(new Set(Array.from(t.t_s)).size).toBe(t.t_s.length);
      }
    }), { numRuns: 25, seed: 20260504 });
  });
});

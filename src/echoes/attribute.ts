// Ties each measured echo to a bounce path.
//   - Predicted arrivals within half a pulse width of the measured delay are candidates; the echo is
//     named after the strongest. The next strongest, if at least 0.35 as strong, is named with it, the two in
//     order of arrival, joined by " & " and marked "(unresolved)": paths closer than the pulse width arrive as one echo.
//   - An echo with no candidate, within two pulse widths of a measured echo at least 4× (12 dB)
//     stronger (or of another part of that echo's reshaped tail), is a change of that echo's shape (frequency-dependent reflection or loss spread the
//     pulse; the echo extraction represents the spread as extra delayed copies): "reshaping of …".
//   - Otherwise it is "unmatched", with its nearest prediction.

import type { PredictedEchoes } from './lattice.ts';

export interface Attribution {
  predicted_t_s: Float64Array;
  path: string[];
}

/** Candidates of at least this fraction of the strongest one's amplitude are named together. */
const TOGETHER = 0.35;
const MAX_NAMES = 2;

export function attributeEchoes(t_s: Float64Array, amplitude: Float64Array, predicted: PredictedEchoes, pulseWidth_s: number): Attribution {
  const n = t_s.length, m = predicted.delay_s.length;
  const tol = pulseWidth_s / 2;
  const predicted_t_s = new Float64Array(n);
  const path: string[] = new Array(n).fill('');
  const amp = Float64Array.from({ length: m }, (_, j) => Math.hypot(predicted.amp_re[j], predicted.amp_im[j]));
  const matched = new Uint8Array(n);
  for (let k = 0; k < n; k++) {
    const cand: number[] = [];
    for (let j = 0; j < m; j++) if (Math.abs(predicted.delay_s[j] - t_s[k]) <= tol) cand.push(j);
    if (cand.length === 0) continue;
    cand.sort((a, b) => amp[b] - amp[a]);
    const best = cand[0];
    // Named in the order they arrive (front face first), as a reader walks through the stack.
    const together = cand.filter((j) => amp[j] >= TOGETHER * amp[best] && amp[j] > 0).slice(0, MAX_NAMES)
      .sort((a, b) => predicted.delay_s[a] - predicted.delay_s[b]);
    predicted_t_s[k] = predicted.delay_s[best];
    path[k] = together.length > 1 ? `${together.map((j) => predicted.name[j]).join(' & ')} (unresolved)` : predicted.name[best];
    matched[k] = 1;
  }
  // Reshaping: a weak echo next to a strong one, or next to another part of the same reshaped tail
  // (a strongly dispersive face can leave a train of them); repeated until no echo changes.
  const root = new Int32Array(n).map((_, k) => (matched[k] ? k : -1));
  for (let changed = true; changed;) {
    changed = false;
    for (let k = 0; k < n; k++) {
      if (root[k] >= 0) continue;
      let host = -1;
      for (let i = 0; i < n; i++) {
        const r = root[i];
        if (i === k || r < 0 || Math.abs(t_s[i] - t_s[k]) > 2 * pulseWidth_s) continue;
        if (Math.abs(amplitude[r]) < 4 * Math.abs(amplitude[k])) continue;
        if (host < 0 || Math.abs(amplitude[r]) > Math.abs(amplitude[host])) host = r;
      }
      if (host >= 0) { root[k] = host; changed = true; }
    }
  }
  for (let k = 0; k < n; k++) {
    if (matched[k]) continue;
    let nearest = -1;
    for (let j = 0; j < m; j++) if (nearest < 0 || Math.abs(predicted.delay_s[j] - t_s[k]) < Math.abs(predicted.delay_s[nearest] - t_s[k])) nearest = j;
    predicted_t_s[k] = nearest >= 0 ? predicted.delay_s[nearest] : 0;
    const host = root[k];
    if (host >= 0) path[k] = `reshaping of the ${path[host].replace(/ \(unresolved\)$/, '')} echo`;
    else path[k] = nearest >= 0 ? `unmatched (nearest: ${predicted.name[nearest]})` : 'unmatched';
  }
  return { predicted_t_s, path };
}

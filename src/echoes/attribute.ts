// Ties each measured echo to a bounce path: among the predicted arrivals within half a pulse
// width of the measured delay, the strongest predicted one (echoes closer than the pulse width
// cannot be told apart, and the strongest dominates the envelope peak). With none that close, the
// echo is reported as unmatched with its nearest prediction.

import type { PredictedEchoes } from './lattice.ts';

export interface Attribution {
  predicted_t_s: Float64Array;
  path: string[];
}

export function attributeEchoes(t_s: Float64Array, predicted: PredictedEchoes, tolerance_s: number): Attribution {
  const n = t_s.length;
  const predicted_t_s = new Float64Array(n);
  const path: string[] = [];
  const m = predicted.delay_s.length;
  for (let k = 0; k < n; k++) {
    let best = -1, bestAmp = -1, nearest = -1, nearestDist = Infinity;
    for (let j = 0; j < m; j++) {
      const dist = Math.abs(predicted.delay_s[j] - t_s[k]);
      const amp = Math.hypot(predicted.amp_re[j], predicted.amp_im[j]);
      if (dist < nearestDist) { nearestDist = dist; nearest = j; }
      if (dist <= tolerance_s && amp > bestAmp) { bestAmp = amp; best = j; }
    }
    if (best >= 0) { predicted_t_s[k] = predicted.delay_s[best]; path.push(predicted.name[best]); }
    else if (nearest >= 0) { predicted_t_s[k] = predicted.delay_s[nearest]; path.push(`unmatched (nearest: ${predicted.name[nearest]})`); }
    else { predicted_t_s[k] = 0; path.push('unmatched'); }
  }
  return { predicted_t_s, path };
}

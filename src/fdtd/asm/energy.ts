// The stored energy of the main grid in the order of run.ts (storedEnergy, poleEnergy): Σ ε∞E² + Σ h², then
// the pole states' energy (P̃²/Δε per Debye pole, (P̃'² + ω0²P̃²)/c per second-order pole), scalar, so the sum
// rounds as the TypeScript one does.

import { get, word } from './mem.ts';
import {
  D_GROUP_COUNT, D_GROUPS, G_DISP, G_E, G_H, G_N, GROUP_WORDS,
  Q_D_COEF, Q_D_EPS, Q_D_STATE, Q_FILL, Q_LEN, Q_LO, Q_ND, Q_NO, Q_O_C, Q_O_COEF, Q_O_STATE, Q_O_W0SQ,
} from '../wasm/slots.ts';

export function storedEnergy(g: usize, epsInf: usize, dt: f64): f64 {
  const n = <i32>word(g, G_N), e = word(g, G_E), h = word(g, G_H);
  let W: f64 = 0;
  for (let i = 0; i < n; i++) { const v = get(e, i); W += get(epsInf, i) * v * v; }
  for (let i = 0; i < n - 1; i++) { const v = get(h, i); W += v * v; }
  const d = word(g, G_DISP);
  return d == 0 ? W : W + poleEnergy(d, e, dt);
}

function poleEnergy(d: usize, e: usize, dt: f64): f64 {
  const count = <i32>word(d, D_GROUP_COUNT), groups = word(d, D_GROUPS);
  let W: f64 = 0;
  for (let g = 0; g < count; g++) {
    const G = groups + (<usize>(g * GROUP_WORDS) << 2);
    const lo = <i32>word(G, Q_LO), len = <i32>word(G, Q_LEN), fill = word(G, Q_FILL);
    const nd = <i32>word(G, Q_ND), dc = word(G, Q_D_COEF), ds = word(G, Q_D_STATE), deps = word(G, Q_D_EPS);
    const no = <i32>word(G, Q_NO), oc = word(G, Q_O_COEF), os = word(G, Q_O_STATE), c = word(G, Q_O_C), w0sq = word(G, Q_O_W0SQ);
    for (let k = 0; k < len; k++) {
      const f = get(fill, k), E = get(e, lo + k);
      if (!(f > 0)) continue;
      // Lane k & 1 of pair k >> 1.
      const lane = <usize>(k & 1) << 3, p = k >> 1;
      for (let q = 0; q < nd; q++) {
        const P = load<f64>(ds + (<usize>(p * nd + q) << 4) + lane) + load<f64>(dc + (<usize>(3 * q + 2) << 3)) * f * E;
        W += (P * P) / (f * get(deps, q));
      }
      for (let q = 0; q < no; q++) {
        const s = os + (<usize>(p * no + q) << 5) + lane;
        const P = load<f64>(s) + load<f64>(oc + (<usize>(3 * q + 2) << 3)) * f * E, Pold = load<f64>(s + 16);
        const rate = (P - Pold) / dt, mean = (P + Pold) / 2;
        W += (rate * rate + get(w0sq, q) * mean * mean) / (f * get(c, q));
      }
    }
  }
  return W;
}

// Complex symmetric tridiagonal solve (Thomas algorithm, no pivoting), real and imaginary parts in
// separate arrays. Safe here: with the absorbing port in row 0 every leading block is a uniquely solvable
// 1D problem, so no pivot vanishes (common practice for 1D Helmholtz with an impedance end).

export interface Tridiagonal {
  n: number;
  /** Diagonal (n), off-diagonal A[i][i+1] = A[i+1][i] (n − 1), right-hand side (n). */
  dRe: Float64Array; dIm: Float64Array;
  oRe: Float64Array; oIm: Float64Array;
  bRe: Float64Array; bIm: Float64Array;
  /** Solution (n) and the forward sweep's scratch (n). */
  xRe: Float64Array; xIm: Float64Array;
  cRe: Float64Array; cIm: Float64Array;
  /**
   * The same matrix as shunt and series parts, for solveSeriesShunt: A[i][i] = shunt_i + series_{i−1} + series_i,
   * A[i][i+1] = −series_i (shunt n, series n − 1).
   */
  shRe: Float64Array; shIm: Float64Array;
  seRe: Float64Array; seIm: Float64Array;
}

export function createTridiagonal(n: number): Tridiagonal {
  const f = () => new Float64Array(n);
  return { n, dRe: f(), dIm: f(), oRe: f(), oIm: f(), bRe: f(), bIm: f(), xRe: f(), xIm: f(), cRe: f(), cIm: f(), shRe: f(), shIm: f(), seRe: f(), seIm: f() };
}

export function clearTridiagonal(t: Tridiagonal): void {
  t.dRe.fill(0); t.dIm.fill(0); t.oRe.fill(0); t.oIm.fill(0); t.bRe.fill(0); t.bIm.fill(0);
  t.shRe.fill(0); t.shIm.fill(0); t.seRe.fill(0); t.seIm.fill(0);
}

/**
 * Solves the system given by its shunt and series parts (bRe/bIm the right-hand side) into t.xRe/t.xIm: the
 * Thomas algorithm with each pivot m_i = A_i + series_i, where A_i, the admittance at node i of everything to
 * its left, is carried as A_{i+1} = shunt_{i+1} + series_i A_i / (A_i + series_i), the series combination of
 * admittances. The usual form m_{i+1} = d_{i+1} − o_i² / m_i subtracts two numbers of the size of series_i, so
 * an electrically thin element (series ≫ shunt) would lose log10(series/shunt) digits there; this form loses none.
 */
export function solveSeriesShunt(t: Tridiagonal): void {
  const { n, shRe, shIm, seRe, seIm, bRe, bIm, xRe, xIm, cRe, cIm } = t;
  let yRe = 0, yIm = 0; // the left side's admittance carried into node i
  let psRe = 0, psIm = 0, pyRe = 0, pyIm = 0; // series_{i−1} and the forward value y_{i−1}
  for (let i = 0; i < n; i++) {
    const aRe = shRe[i] + yRe, aIm = shIm[i] + yIm;
    const sRe = i < n - 1 ? seRe[i] : 0, sIm = i < n - 1 ? seIm[i] : 0;
    const mRe = aRe + sRe, mIm = aIm + sIm;
    if (!(mRe !== 0 || mIm !== 0) || !Number.isFinite(mRe + mIm)) throw new Error(`fem: singular system at node ${i}`);
    // 1 / m by Smith's scaling (Smith, CACM 5(8), 1962): a 1e-300 mm film's pivots are near 1e303, whose squares overflow
    let iRe: number, iIm: number;
    if (Math.abs(mRe) >= Math.abs(mIm)) { const q = mIm / mRe, d = mRe + mIm * q; iRe = 1 / d; iIm = -q / d; }
    else { const q = mRe / mIm, d = mRe * q + mIm; iRe = q / d; iIm = -1 / d; }
    // y_i = (b_i + series_{i−1} y_{i−1}) / m_i
    const rRe = bRe[i] + (psRe * pyRe - psIm * pyIm), rIm = bIm[i] + (psRe * pyIm + psIm * pyRe);
    pyRe = rRe * iRe - rIm * iIm; pyIm = rRe * iIm + rIm * iRe;
    xRe[i] = pyRe; xIm[i] = pyIm;
    if (i < n - 1) {
      // c_i = −series_i / m_i;  A carried on: series_i A_i / m_i
      const qRe = sRe * iRe - sIm * iIm, qIm = sRe * iIm + sIm * iRe;
      cRe[i] = -qRe; cIm[i] = -qIm;
      yRe = qRe * aRe - qIm * aIm; yIm = qRe * aIm + qIm * aRe;
      psRe = sRe; psIm = sIm;
    }
  }
  for (let i = n - 2; i >= 0; i--) {
    const nr = xRe[i + 1], ni = xIm[i + 1];
    xRe[i] -= cRe[i] * nr - cIm[i] * ni;
    xIm[i] -= cRe[i] * ni + cIm[i] * nr;
  }
}

/** Solves in place into t.xRe/t.xIm; the system arrays are left unchanged. */
export function solveTridiagonal(t: Tridiagonal): void {
  const { n, dRe, dIm, oRe, oIm, bRe, bIm, xRe, xIm, cRe, cIm } = t;
  // Forward sweep: c_i = o_i / m_i, y_i = (b_i − o_{i−1} y_{i−1}) / m_i, m_i = d_i − o_{i−1} c_{i−1}.
  let pcRe = 0, pcIm = 0, pyRe = 0, pyIm = 0, poRe = 0, poIm = 0;
  for (let i = 0; i < n; i++) {
    const mRe = dRe[i] - (poRe * pcRe - poIm * pcIm);
    const mIm = dIm[i] - (poRe * pcIm + poIm * pcRe);
    const den = mRe * mRe + mIm * mIm;
    if (!(den > 0)) throw new Error(`fem: singular system at node ${i}`);
    const iRe = mRe / den, iIm = -mIm / den;
    const rRe = bRe[i] - (poRe * pyRe - poIm * pyIm);
    const rIm = bIm[i] - (poRe * pyIm + poIm * pyRe);
    pyRe = rRe * iRe - rIm * iIm; pyIm = rRe * iIm + rIm * iRe;
    xRe[i] = pyRe; xIm[i] = pyIm;
    if (i < n - 1) {
      poRe = oRe[i]; poIm = oIm[i];
      pcRe = poRe * iRe - poIm * iIm; pcIm = poRe * iIm + poIm * iRe;
      cRe[i] = pcRe; cIm[i] = pcIm;
    }
  }
  // Back substitution: x_i = y_i − c_i x_{i+1}.
  for (let i = n - 2; i >= 0; i--) {
    const nr = xRe[i + 1], ni = xIm[i + 1];
    xRe[i] -= cRe[i] * nr - cIm[i] * ni;
    xIm[i] -= cRe[i] * ni + cIm[i] * nr;
  }
}

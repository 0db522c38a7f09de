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
}

export function createTridiagonal(n: number): Tridiagonal {
  const f = () => new Float64Array(n);
  return { n, dRe: f(), dIm: f(), oRe: f(), oIm: f(), bRe: f(), bIm: f(), xRe: f(), xIm: f(), cRe: f(), cIm: f() };
}

export function clearTridiagonal(t: Tridiagonal): void {
  t.dRe.fill(0); t.dIm.fill(0); t.oRe.fill(0); t.oIm.fill(0); t.bRe.fill(0); t.bIm.fill(0);
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

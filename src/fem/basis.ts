// Lagrange elements of order p on the reference interval ξ ∈ [0, 1], equally spaced nodes ξ_i = i/p.
// Local node 0 and local node p are the element's vertices; 1 … p−1 are interior nodes.
// Reference stiffness S_ij = ∫ φ_i' φ_j' dξ and mass M_ij = ∫ φ_i φ_j dξ come from Gauss–Legendre
// quadrature exact for the polynomial degree involved (2p ≤ 6 with 4 points).

export type FemOrder = 1 | 2 | 3;
export const FEM_ORDERS: readonly FemOrder[] = [1, 2, 3];

export interface ReferenceElement {
  p: FemOrder;
  /** Node positions ξ_i = i/p, i = 0 … p. */
  nodes: Float64Array;
  /** (p+1)×(p+1), row-major. */
  S: Float64Array;
  M: Float64Array;
}

// 4-point Gauss–Legendre on [−1, 1] (abscissae and weights, Abramowitz & Stegun table 25.4).
const GL_T = [-0.8611363115940526, -0.3399810435848563, 0.3399810435848563, 0.8611363115940526];
const GL_W = [0.3478548451374538, 0.6521451548625461, 0.6521451548625461, 0.3478548451374538];

/** φ_i(ξ) for i = 0 … p into out. */
export function basisValues(p: number, xi: number, out: Float64Array): Float64Array {
  for (let i = 0; i <= p; i++) {
    let v = 1;
    const xiI = i / p;
    for (let j = 0; j <= p; j++) if (j !== i) v *= (xi - j / p) / (xiI - j / p);
    out[i] = v;
  }
  return out;
}

/** dφ_i/dξ for i = 0 … p into out (product rule over the Lagrange factors). */
export function basisDerivatives(p: number, xi: number, out: Float64Array): Float64Array {
  for (let i = 0; i <= p; i++) {
    const xiI = i / p;
    let sum = 0;
    for (let k = 0; k <= p; k++) {
      if (k === i) continue;
      let term = 1 / (xiI - k / p);
      for (let j = 0; j <= p; j++) if (j !== i && j !== k) term *= (xi - j / p) / (xiI - j / p);
      sum += term;
    }
    out[i] = sum;
  }
  return out;
}

function buildReference(p: FemOrder): ReferenceElement {
  const n = p + 1;
  const S = new Float64Array(n * n), M = new Float64Array(n * n);
  const phi = new Float64Array(n), dphi = new Float64Array(n);
  for (let q = 0; q < GL_T.length; q++) {
    const xi = (1 + GL_T[q]) / 2, w = GL_W[q] / 2;
    basisValues(p, xi, phi);
    basisDerivatives(p, xi, dphi);
    for (let i = 0; i < n; i++)
      for (let j = 0; j < n; j++) {
        S[i * n + j] += w * dphi[i] * dphi[j];
        M[i * n + j] += w * phi[i] * phi[j];
      }
  }
  const nodes = new Float64Array(n);
  for (let i = 0; i < n; i++) nodes[i] = i / p;
  return { p, nodes, S, M };
}

const REFERENCE: Record<FemOrder, ReferenceElement> = { 1: buildReference(1), 2: buildReference(2), 3: buildReference(3) };

export const referenceElement = (p: FemOrder): ReferenceElement => REFERENCE[p];

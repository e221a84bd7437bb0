/**
 * Lagrange basis of order p on the p + 1 Gauss–Lobatto–Legendre nodes of [−1, 1], evaluated in
 * barycentric form (stable for every p we use; Berrut & Trefethen, SIAM Review 46, 2004).
 * Local index a runs 0..p along the axis; in 3D the local node (a, b, c) has index a + (p+1)(b + (p+1)c).
 */
import { gaussLobatto } from './quadrature.ts';

export interface Tabulation {
  nPoints: number;
  nBasis: number; // p + 1
  values: Float64Array; // nPoints × nBasis, values[q * nBasis + a] = φ_a(x_q)
  slopes: Float64Array; // nPoints × nBasis, dφ_a/dξ
}

export function lobattoNodes(p: number): Float64Array {
  if (!(p >= 1 && p <= 12 && Number.isInteger(p))) throw new RangeError(`element order must be an integer 1..12, got ${p}`);
  return gaussLobatto(p + 1).points;
}

function barycentricWeights(nodes: Float64Array): Float64Array {
  const n = nodes.length, w = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    let prod = 1;
    for (let j = 0; j < n; j++) if (j !== i) prod *= nodes[i] - nodes[j];
    w[i] = 1 / prod;
  }
  return w;
}

/** Values and ξ-derivatives of the p + 1 basis functions at the given reference points. */
export function tabulate(p: number, points: ArrayLike<number>, out?: Tabulation): Tabulation {
  const nodes = lobattoNodes(p), w = barycentricWeights(nodes), nb = p + 1, nq = points.length;
  const t = out ?? { nPoints: nq, nBasis: nb, values: new Float64Array(nq * nb), slopes: new Float64Array(nq * nb) };
  for (let q = 0; q < nq; q++) {
    const x = points[q], row = q * nb;
    const hit = nodes.findIndex((xn) => xn === x);
    if (hit >= 0) {
      // At a node: φ_a = δ_a,hit; φ_a'(x_i) = (w_a/w_i)/(x_i − x_a), φ_i'(x_i) = −Σ of the others.
      let diag = 0;
      for (let a = 0; a < nb; a++) {
        t.values[row + a] = a === hit ? 1 : 0;
        if (a !== hit) {
          const d = w[a] / w[hit] / (x - nodes[a]);
          t.slopes[row + a] = d;
          diag -= d;
        }
      }
      t.slopes[row + hit] = diag;
      continue;
    }
    // ℓ(x) = Π(x − x_j); φ_a = ℓ w_a/(x − x_a); φ_a' = φ_a·(Σ_j 1/(x − x_j) − 1/(x − x_a)).
    let ell = 1, sumInv = 0;
    for (let j = 0; j < nb; j++) {
      ell *= x - nodes[j];
      sumInv += 1 / (x - nodes[j]);
    }
    for (let a = 0; a < nb; a++) {
      const phi = (ell * w[a]) / (x - nodes[a]);
      t.values[row + a] = phi;
      t.slopes[row + a] = phi * (sumInv - 1 / (x - nodes[a]));
    }
  }
  return t;
}

/**
 * Test problems for the sparse solver: seeded random complex symmetric matrices, and Helmholtz
 * matrices K − k²M of Lagrange hexahedra on a node lattice (the shape of what the engine assembles).
 */
import type { ComplexCsr, ComplexVector, SparsePattern } from '../../engine/linalg/sparse.ts';
import type { NodeLattice } from '../../engine/linalg/dissection.ts';

/** Seeded uniform [0, 1) generator (Mulberry32). */
export function rng(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

export function randomVector(n: number, seed: number): ComplexVector {
  const r = rng(seed);
  const v = { re: new Float64Array(n), im: new Float64Array(n) };
  for (let i = 0; i < n; i++) {
    v.re[i] = 2 * r() - 1;
    v.im[i] = 2 * r() - 1;
  }
  return v;
}

/** CSR from triplets (duplicates summed, columns sorted, diagonal forced present). */
export function csrFromTriplets(n: number, I: number[], J: number[], R: number[], M: number[]): ComplexCsr {
  const rows: Map<number, [number, number]>[] = Array.from({ length: n }, (_, i) => new Map([[i, [0, 0]]]));
  for (let t = 0; t < I.length; t++) {
    const cell = rows[I[t]].get(J[t]) ?? [0, 0];
    rows[I[t]].set(J[t], [cell[0] + R[t], cell[1] + M[t]]);
  }
  const rowPtr = new Int32Array(n + 1);
  const cols: number[] = [], re: number[] = [], im: number[] = [];
  for (let i = 0; i < n; i++) {
    for (const j of [...rows[i].keys()].sort((a, b) => a - b)) {
      const [vr, vi] = rows[i].get(j)!;
      cols.push(j); re.push(vr); im.push(vi);
    }
    rowPtr[i + 1] = cols.length;
  }
  return { n, rowPtr, colIdx: Int32Array.from(cols), re: Float64Array.from(re), im: Float64Array.from(im) };
}

/**
 * Random complex symmetric matrix, about `degree` off-diagonal entries per row, made
 * well-conditioned by a diagonal of modulus (row sum + 1) with random sign (indefinite real part)
 * and a small random imaginary part.
 */
export function randomSymmetric(n: number, degree: number, seed: number): ComplexCsr {
  const r = rng(seed);
  const I: number[] = [], J: number[] = [], R: number[] = [], M: number[] = [];
  const rowSum = new Float64Array(n);
  const pairs = Math.round((n * degree) / 2);
  for (let t = 0; t < pairs; t++) {
    const i = Math.floor(r() * n), j = Math.floor(r() * n);
    if (i === j) continue;
    const vr = 2 * r() - 1, vi = 2 * r() - 1, mag = Math.hypot(vr, vi);
    I.push(i, j); J.push(j, i); R.push(vr, vr); M.push(vi, vi);
    rowSum[i] += mag;
    rowSum[j] += mag;
  }
  for (let i = 0; i < n; i++) {
    const sign = r() < 0.5 ? -1 : 1;
    I.push(i); J.push(i); R.push(sign * (rowSum[i] + 1)); M.push(0.1 * (2 * r() - 1));
  }
  return csrFromTriplets(n, I, J, R, M);
}

/** Random symmetric pattern with the diagonal, ~degree off-diagonals per row. */
export function randomPattern(n: number, degree: number, seed: number): SparsePattern {
  const A = randomSymmetric(n, degree, seed);
  return { n: A.n, rowPtr: A.rowPtr, colIdx: A.colIdx };
}

/**
 * 1D Lagrange element matrices on equispaced nodes, element length h (common practice: order 1,
 * K = [1 −1; −1 1]/h, M = h/6 [2 1; 1 2]; order 2 with nodes 0, h/2, h,
 * K = [7 −8 1; −8 16 −8; 1 −8 7]/(3h), M = h/30 [4 2 −1; 2 16 2; −1 2 4]); higher orders by
 * (p+1)-point Gauss–Legendre quadrature, exact for these polynomial integrands.
 */
export function lagrange1d(order: number, h: number): { K: number[][]; M: number[][] } {
  if (order === 1) return { K: [[1 / h, -1 / h], [-1 / h, 1 / h]], M: [[h / 3, h / 6], [h / 6, h / 3]] };
  if (order === 2) {
    const k = 1 / (3 * h), m = h / 30;
    return {
      K: [[7 * k, -8 * k, k], [-8 * k, 16 * k, -8 * k], [k, -8 * k, 7 * k]],
      M: [[4 * m, 2 * m, -m], [2 * m, 16 * m, 2 * m], [-m, 2 * m, 4 * m]],
    };
  }
  const q = order + 1;
  const nodes = Array.from({ length: q }, (_, a) => a / order);
  const K = Array.from({ length: q }, () => new Array<number>(q).fill(0));
  const M = Array.from({ length: q }, () => new Array<number>(q).fill(0));
  for (const [x, w] of gaussLegendre01(q)) {
    const phi = nodes.map((_, a) => basis(nodes, a, x));
    const dphi = nodes.map((_, a) => basisDerivative(nodes, a, x));
    for (let a = 0; a < q; a++) for (let b = 0; b < q; b++) {
      K[a][b] += (w * dphi[a] * dphi[b]) / h;
      M[a][b] += w * phi[a] * phi[b] * h;
    }
  }
  return { K, M };
}

function basis(nodes: number[], a: number, x: number): number {
  let v = 1;
  for (let b = 0; b < nodes.length; b++) if (b !== a) v *= (x - nodes[b]) / (nodes[a] - nodes[b]);
  return v;
}

function basisDerivative(nodes: number[], a: number, x: number): number {
  let sum = 0;
  for (let c = 0; c < nodes.length; c++) {
    if (c === a) continue;
    let v = 1 / (nodes[a] - nodes[c]);
    for (let b = 0; b < nodes.length; b++) if (b !== a && b !== c) v *= (x - nodes[b]) / (nodes[a] - nodes[b]);
    sum += v;
  }
  return sum;
}

/** n-point Gauss–Legendre rule on [0, 1] by Newton's method on P_n (common practice). */
function gaussLegendre01(n: number): [number, number][] {
  const out: [number, number][] = [];
  for (let i = 0; i < n; i++) {
    let x = Math.cos((Math.PI * (i + 0.75)) / (n + 0.5));
    let dp = 1;
    for (let it = 0; it < 100; it++) {
      let p0 = 1, p1 = x;
      for (let k = 2; k <= n; k++) [p0, p1] = [p1, ((2 * k - 1) * x * p1 - (k - 1) * p0) / k];
      dp = (n * (x * p1 - p0)) / (x * x - 1);
      const dx = p1 / dp;
      x -= dx;
      if (Math.abs(dx) < 1e-16) break;
    }
    out.push([(x + 1) / 2, 1 / ((1 - x * x) * dp * dp)]);
  }
  return out;
}

export interface LatticeProblem {
  A: ComplexCsr; // K − k²·M, both triangles
  K: ComplexCsr; // stiffness alone (same pattern)
  lattice: NodeLattice;
  ndofs: number;
}

export interface LatticeProblemOptions {
  elements: [number, number, number]; // hexahedra per axis
  order?: number; // lattice intervals per element and axis
  h?: number; // element edge
  k2: { re: number; im: number };
  solid?: (ex: number, ey: number, ez: number) => boolean; // elements left out
}

/** Helmholtz matrix of tensor-product Lagrange hexahedra with natural (Neumann) boundaries. */
export function latticeHelmholtz(o: LatticeProblemOptions): LatticeProblem {
  const p = o.order ?? 1, h = o.h ?? 1;
  const [ex, ey, ez] = o.elements;
  const dims: [number, number, number] = [ex * p + 1, ey * p + 1, ez * p + 1];
  const active = new Uint8Array(ex * ey * ez);
  for (let c = 0; c < ez; c++) for (let b = 0; b < ey; b++) for (let a = 0; a < ex; a++) {
    active[a + ex * (b + ey * c)] = o.solid?.(a, b, c) ? 0 : 1;
  }
  const dofOf = numberNodes(dims, p, o.elements, active);
  const ndofs = dofOf.reduce((n, d) => (d >= 0 ? n + 1 : n), 0);
  const pattern = elementPattern(dims, p, o.elements, active, dofOf, ndofs);
  const { Ke, Me } = elementMatrices(p, h);
  const K = zeroValued(pattern), A = zeroValued(pattern);
  const q = p + 1, nloc = q * q * q, local = new Int32Array(nloc);
  for (let c = 0; c < ez; c++) for (let b = 0; b < ey; b++) for (let a = 0; a < ex; a++) {
    if (!active[a + ex * (b + ey * c)]) continue;
    for (let t = 0; t < nloc; t++) {
      const i = a * p + (t % q), j = b * p + (Math.floor(t / q) % q), k = c * p + Math.floor(t / (q * q));
      local[t] = dofOf[i + dims[0] * (j + dims[1] * k)];
    }
    for (let s = 0; s < nloc; s++) for (let t = 0; t < nloc; t++) {
      const at = position(pattern, local[s], local[t]);
      const kv = Ke[s * nloc + t], mv = Me[s * nloc + t];
      K.re[at] += kv;
      A.re[at] += kv - o.k2.re * mv;
      A.im[at] += -o.k2.im * mv;
    }
  }
  return { A, K, lattice: { dims, step: p, dofOf }, ndofs };
}

function numberNodes(dims: number[], p: number, el: number[], active: Uint8Array): Int32Array {
  const dofOf = new Int32Array(dims[0] * dims[1] * dims[2]).fill(-1);
  const [ex, ey, ez] = el;
  for (let c = 0; c < ez; c++) for (let b = 0; b < ey; b++) for (let a = 0; a < ex; a++) {
    if (!active[a + ex * (b + ey * c)]) continue;
    for (let k = c * p; k <= c * p + p; k++) for (let j = b * p; j <= b * p + p; j++) for (let i = a * p; i <= a * p + p; i++) {
      dofOf[i + dims[0] * (j + dims[1] * k)] = 0;
    }
  }
  let n = 0;
  for (let l = 0; l < dofOf.length; l++) if (dofOf[l] === 0) dofOf[l] = n++;
  return dofOf;
}

function elementPattern(dims: number[], p: number, el: number[], active: Uint8Array, dofOf: Int32Array, n: number): SparsePattern {
  const [ex, ey, ez] = el;
  const nbrs: Set<number>[] = Array.from({ length: n }, () => new Set<number>());
  for (let c = 0; c < ez; c++) for (let b = 0; b < ey; b++) for (let a = 0; a < ex; a++) {
    if (!active[a + ex * (b + ey * c)]) continue;
    const nodes: number[] = [];
    for (let k = c * p; k <= c * p + p; k++) for (let j = b * p; j <= b * p + p; j++) for (let i = a * p; i <= a * p + p; i++) {
      nodes.push(dofOf[i + dims[0] * (j + dims[1] * k)]);
    }
    for (const s of nodes) for (const t of nodes) nbrs[s].add(t);
  }
  const rowPtr = new Int32Array(n + 1);
  let nnz = 0;
  for (let i = 0; i < n; i++) rowPtr[i + 1] = nnz += nbrs[i].size;
  const colIdx = new Int32Array(nnz);
  for (let i = 0; i < n; i++) colIdx.set(Int32Array.from(nbrs[i]).sort(), rowPtr[i]);
  return { n, rowPtr, colIdx };
}

function zeroValued(p: SparsePattern): ComplexCsr {
  const nnz = p.rowPtr[p.n];
  return { n: p.n, rowPtr: p.rowPtr, colIdx: p.colIdx, re: new Float64Array(nnz), im: new Float64Array(nnz) };
}

function position(p: SparsePattern, i: number, j: number): number {
  let lo = p.rowPtr[i], hi = p.rowPtr[i + 1] - 1;
  while (lo <= hi) {
    const mid = (lo + hi) >> 1, c = p.colIdx[mid];
    if (c === j) return mid;
    if (c < j) lo = mid + 1;
    else hi = mid - 1;
  }
  throw new Error(`entry (${i}, ${j}) is not in the pattern`);
}

/** Ke = Kx⊗My⊗Mz + Mx⊗Ky⊗Mz + Mx⊗My⊗Kz and Me = Mx⊗My⊗Mz, local node t = a + q(b + q c). */
function elementMatrices(p: number, h: number): { Ke: Float64Array; Me: Float64Array } {
  const { K, M } = lagrange1d(p, h);
  const q = p + 1, nloc = q * q * q;
  const Ke = new Float64Array(nloc * nloc), Me = new Float64Array(nloc * nloc);
  for (let s = 0; s < nloc; s++) for (let t = 0; t < nloc; t++) {
    const [a, b, c] = [s % q, Math.floor(s / q) % q, Math.floor(s / (q * q))];
    const [d, e, f] = [t % q, Math.floor(t / q) % q, Math.floor(t / (q * q))];
    Ke[s * nloc + t] = K[a][d] * M[b][e] * M[c][f] + M[a][d] * K[b][e] * M[c][f] + M[a][d] * M[b][e] * K[c][f];
    Me[s * nloc + t] = M[a][d] * M[b][e] * M[c][f];
  }
  return { Ke, Me };
}

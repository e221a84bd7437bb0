import { subtractLowerProducts, subtractProducts } from './denseProducts.ts';

/**
 * Dense kernels of one frontal matrix: partial LDLᵀ of its ns leading columns (complex symmetric,
 * no conjugation) and the Schur complement update of the rest.
 *
 * Storage, all complex entries interleaved (re, im):
 *  - panel P at offset off: F × ns, row-major, F = ns + m. Row i holds L[i, 0..ns); on output the
 *    diagonal entries hold D and the strict upper part of the leading ns × ns block is unused.
 *    Rows are contiguous so that every inner loop is a dot product over unit-stride memory.
 *  - update matrix C at offset cOff: the m × m lower triangle, packed by rows, (a, b) at a(a+1)/2 + b.
 *  - W: workspace of ns·max(ns, m) entries holding rows of L·D.
 * Golub & Van Loan, "Matrix Computations", 4th ed. (2013), §4.1.2 (LDLᵀ).
 */

/** Decides the value of pivot j (global index) from its computed value; writes the value to use into out[0..1]. */
export interface PivotPolicy {
  accept(j: number, dr: number, di: number, out: Float64Array): void;
}

export interface FrontDiagonal {
  dRe: Float64Array; // n: D
  dIm: Float64Array;
  invRe: Float64Array; // n: 1/D
  invIm: Float64Array;
}

const pivotOut = new Float64Array(2);
/** Pivot columns per block: inside a block the work is short dot products, across blocks it is subtractProducts. */
const NB = 32;

/**
 * Factors the front in place; `first` is the global index of its first pivot column.
 * rowStart is workspace of at least F entries.
 *
 * Left-looking blocked Crout: for each block K of pivot columns, first every row below subtracts
 * the contributions of the finished columns in one matrix product, then the block is finished
 * with short dot products (Golub & Van Loan, "Matrix Computations", 4th ed. 2013, §3.2.11, §4.2.9).
 */
export function factorFront(
  P: Float64Array, off: number, F: number, ns: number, C: Float64Array, cOff: number,
  W: Float64Array, first: number, D: FrontDiagonal, policy: PivotPolicy, rowStart: Int32Array,
): void {
  const len = 2 * ns;
  for (let i = 0; i < F; i++) rowStart[i] = off + i * len;
  for (let k0 = 0; k0 < ns; k0 += NB) {
    const k1 = Math.min(ns, k0 + NB);
    if (k0 > 0) {
      scaleRowsByD(P, off + k0 * len, k1 - k0, ns, 0, k0, W, k0 * len, first, D);
      subtractProducts(P, off + k0 * len, len, W, k0 * len, len, F - k0, k1 - k0, 2 * k0, P, rowStart, k0, k0);
    }
    factorDiagonalBlock(P, off, ns, k0, k1, W, first, D, policy);
    solvePanelRows(P, off, ns, k0, k1, F, W, first, D);
  }
  const m = F - ns;
  if (m === 0) return;
  scaleRowsByD(P, off + ns * len, m, ns, 0, ns, W, 0, first, D);
  for (let a = 0; a < m; a++) rowStart[a] = cOff + a * (a + 1);
  subtractLowerProducts(P, off + ns * len, W, 0, len, m, len, C, rowStart);
}

/**
 * Rows k0 ≤ i < k1 of the diagonal block, columns k0 ≤ k ≤ i (the earlier columns are already
 * subtracted); leaves W row i = L[i, k0..i)·D for the panel rows.
 */
function factorDiagonalBlock(P: Float64Array, off: number, ns: number, k0: number, k1: number, W: Float64Array, first: number, D: FrontDiagonal, policy: PivotPolicy): void {
  const { dRe, dIm, invRe, invIm } = D;
  const t0 = 2 * k0;
  for (let i = k0; i < k1; i++) {
    const ri = off + 2 * i * ns;
    for (let k = k0; k < i; k++) {
      const wk = 2 * k * ns;
      let sr = P[ri + 2 * k], si = P[ri + 2 * k + 1];
      for (let t = t0; t < 2 * k; t += 2) {
        const lr = P[ri + t], li = P[ri + t + 1], wr = W[wk + t], wi = W[wk + t + 1];
        sr -= lr * wr - li * wi;
        si -= lr * wi + li * wr;
      }
      const ar = invRe[first + k], ai = invIm[first + k];
      P[ri + 2 * k] = sr * ar - si * ai;
      P[ri + 2 * k + 1] = sr * ai + si * ar;
    }
    const wi0 = 2 * i * ns;
    let sr = P[ri + 2 * i], si = P[ri + 2 * i + 1];
    for (let t = k0; t < i; t++) {
      const lr = P[ri + 2 * t], li = P[ri + 2 * t + 1], dr = dRe[first + t], di = dIm[first + t];
      const wr = lr * dr - li * di, wi = lr * di + li * dr;
      W[wi0 + 2 * t] = wr;
      W[wi0 + 2 * t + 1] = wi;
      sr -= lr * wr - li * wi;
      si -= lr * wi + li * wr;
    }
    policy.accept(first + i, sr, si, pivotOut);
    const dr = pivotOut[0], di = pivotOut[1];
    const mag2 = dr * dr + di * di;
    dRe[first + i] = dr;
    dIm[first + i] = di;
    invRe[first + i] = dr / mag2;
    invIm[first + i] = -di / mag2;
    P[ri + 2 * i] = dr;
    P[ri + 2 * i + 1] = di;
  }
}

/** Columns k0 ≤ k < k1 of the rows below the diagonal block: L[i, k] = (A[i, k] − Σ L[i, t]·W[k, t]) / d_k, two rows at a time. */
function solvePanelRows(P: Float64Array, off: number, ns: number, k0: number, k1: number, F: number, W: Float64Array, first: number, D: FrontDiagonal): void {
  const { invRe, invIm } = D;
  const t0 = 2 * k0;
  let i = k1;
  for (; i + 1 < F; i += 2) {
    const r0 = off + 2 * i * ns, r1 = r0 + 2 * ns;
    for (let k = k0; k < k1; k++) {
      const wk = 2 * k * ns;
      let s0r = P[r0 + 2 * k], s0i = P[r0 + 2 * k + 1], s1r = P[r1 + 2 * k], s1i = P[r1 + 2 * k + 1];
      for (let t = t0; t < 2 * k; t += 2) {
        const wr = W[wk + t], wi = W[wk + t + 1];
        const ar = P[r0 + t], ai = P[r0 + t + 1], br = P[r1 + t], bi = P[r1 + t + 1];
        s0r -= ar * wr - ai * wi;
        s0i -= ar * wi + ai * wr;
        s1r -= br * wr - bi * wi;
        s1i -= br * wi + bi * wr;
      }
      const dr = invRe[first + k], di = invIm[first + k];
      P[r0 + 2 * k] = s0r * dr - s0i * di;
      P[r0 + 2 * k + 1] = s0r * di + s0i * dr;
      P[r1 + 2 * k] = s1r * dr - s1i * di;
      P[r1 + 2 * k + 1] = s1r * di + s1i * dr;
    }
  }
  if (i < F) {
    const r0 = off + 2 * i * ns;
    for (let k = k0; k < k1; k++) {
      const wk = 2 * k * ns;
      let sr = P[r0 + 2 * k], si = P[r0 + 2 * k + 1];
      for (let t = t0; t < 2 * k; t += 2) {
        const wr = W[wk + t], wi = W[wk + t + 1], ar = P[r0 + t], ai = P[r0 + t + 1];
        sr -= ar * wr - ai * wi;
        si -= ar * wi + ai * wr;
      }
      const dr = invRe[first + k], di = invIm[first + k];
      P[r0 + 2 * k] = sr * dr - si * di;
      P[r0 + 2 * k + 1] = sr * di + si * dr;
    }
  }
}

/** W rows w0.. = rows of P from p0 (count rows) times D, columns [c0, c1). */
function scaleRowsByD(P: Float64Array, p0: number, rows: number, ns: number, c0: number, c1: number, W: Float64Array, w0: number, first: number, D: FrontDiagonal): void {
  const { dRe, dIm } = D;
  for (let a = 0; a < rows; a++) {
    const ra = p0 + 2 * a * ns, wa = w0 + 2 * a * ns;
    for (let t = c0; t < c1; t++) {
      const lr = P[ra + 2 * t], li = P[ra + 2 * t + 1], dr = dRe[first + t], di = dIm[first + t];
      W[wa + 2 * t] = lr * dr - li * di;
      W[wa + 2 * t + 1] = lr * di + li * dr;
    }
  }
}

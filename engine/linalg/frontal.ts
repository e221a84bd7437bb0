import { subtractLowerProducts, subtractProducts } from './denseProducts.ts';
import { NB, type FrontArena } from './frontArena.ts';

/**
 * Dense factorisation of one frontal matrix: partial LDLᵀ of its ns leading columns (complex
 * symmetric, no conjugation) and the Schur complement update of the rest.
 *
 * The front is F × F (F = ns + m), row-major in the arena (frontArena.ts) with row stride 2F
 * doubles, lower triangle. On output its first ns columns hold L (unit diagonal implied, D on the
 * diagonal) and its trailing m × m block the update matrix for the parent. Rows are contiguous so
 * that every inner loop is a dot product over unit-stride memory.
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

/**
 * Factors the front in place; `first` is the global index of its first pivot column.
 *
 * Left-looking blocked Crout: for each block K of NB pivot columns, first every row below subtracts
 * the contributions of the finished columns in one matrix product, then the diagonal block is
 * factored (here, with the pivot policy) and the rows below it solved against it (the kernels);
 * last, the trailing block subtracts L₂ D L₂ᵀ in one product (Golub & Van Loan, 2013, §3.2.11, §4.2.9).
 * Flops: 8(ns³/6 + m·ns²/2 + m²·ns/2) in the products, about.
 */
export function factorFront(a: FrontArena, F: number, ns: number, first: number, D: FrontDiagonal, policy: PivotPolicy): void {
  const { kernels: K, layout: L } = a;
  const fo = L.front, fs = 2 * F;
  for (let k0 = 0; k0 < ns; k0 += NB) {
    const k1 = Math.min(ns, k0 + NB), nb = k1 - k0;
    if (k0 > 0) {
      K.packScaled(fo + k0 * fs, fs, nb, k0, L.d, L.w, 4 * k0);
      subtractProducts(K, fo + k0 * fs + 2 * k0, fs, fo + k0 * fs, fs, L.w, 4 * k0, F - k0, nb, k0);
    }
    factorDiagonalBlock(a, fo, fs, k0, k1, first, D, policy);
    if (k1 < F) K.solveRows(fo + k1 * fs + 2 * k0, fs, F - k1, nb, L.wBlock, 4 * NB, L.inv + 2 * k0);
  }
  const m = F - ns;
  if (m === 0) return;
  K.packScaled(fo + ns * fs, fs, m, ns, L.d, L.w, 4 * ns);
  subtractLowerProducts(K, fo + ns * fs + 2 * ns, fs, fo + ns * fs, fs, L.w, 4 * ns, m, ns);
}

/**
 * Rows k0 ≤ i < k1 of the diagonal block, columns k0 ≤ k ≤ i (the earlier columns are already
 * subtracted). Leaves the block's scaled rows L[i, k0..i)·D in wBlock (pairs, row stride 4·NB) for
 * solveRows, and the pivots and their inverses in the arena's d and inv and in D.
 */
function factorDiagonalBlock(a: FrontArena, fo: number, fs: number, k0: number, k1: number, first: number, D: FrontDiagonal, policy: PivotPolicy): void {
  const M = a.f64, { wBlock, d, inv } = a.layout;
  const { dRe, dIm, invRe, invIm } = D;
  for (let i = k0; i < k1; i++) {
    const ri = fo + i * fs;
    for (let k = k0; k < i; k++) {
      const wk = wBlock + 4 * NB * (k - k0) - 4 * k0;
      let sr = M[ri + 2 * k], si = M[ri + 2 * k + 1];
      for (let t = k0; t < k; t++) {
        const lr = M[ri + 2 * t], li = M[ri + 2 * t + 1], wr = M[wk + 4 * t], wi = M[wk + 4 * t + 1];
        sr -= lr * wr - li * wi;
        si -= lr * wi + li * wr;
      }
      const ar = M[inv + 2 * k], ai = M[inv + 2 * k + 1];
      M[ri + 2 * k] = sr * ar - si * ai;
      M[ri + 2 * k + 1] = sr * ai + si * ar;
    }
    const wi0 = wBlock + 4 * NB * (i - k0) - 4 * k0;
    let sr = M[ri + 2 * i], si = M[ri + 2 * i + 1];
    for (let t = k0; t < i; t++) {
      const lr = M[ri + 2 * t], li = M[ri + 2 * t + 1], dr = M[d + 2 * t], di = M[d + 2 * t + 1];
      const wr = lr * dr - li * di, wi = lr * di + li * dr;
      M[wi0 + 4 * t] = wr;
      M[wi0 + 4 * t + 1] = wi;
      M[wi0 + 4 * t + 2] = wi;
      M[wi0 + 4 * t + 3] = wr;
      sr -= lr * wr - li * wi;
      si -= lr * wi + li * wr;
    }
    policy.accept(first + i, sr, si, pivotOut);
    const dr = pivotOut[0], di = pivotOut[1];
    const mag2 = dr * dr + di * di, ir = dr / mag2, ii = -di / mag2;
    dRe[first + i] = dr;
    dIm[first + i] = di;
    invRe[first + i] = ir;
    invIm[first + i] = ii;
    M[d + 2 * i] = dr;
    M[d + 2 * i + 1] = di;
    M[inv + 2 * i] = ir;
    M[inv + 2 * i + 1] = ii;
    M[ri + 2 * i] = dr;
    M[ri + 2 * i + 1] = di;
  }
}

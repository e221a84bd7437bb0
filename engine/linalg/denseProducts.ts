/**
 * T −= X Wᵀ for complex interleaved row-major blocks (plain transpose, no conjugation): the update
 * that carries almost all the flops of the factorisation, tiled for the cache around the kernels'
 * register-blocked products (denseKernels.ts, simdKernels.ts).
 *
 * The work is tiled so that a panel of NC rows of W × KC entries stays in cache while every row of X
 * streams past it (Goto & van de Geijn, "Anatomy of high-performance matrix multiplication",
 * ACM TOMS 34(3), 2008). Offsets and strides are in doubles into the kernels' arena; W is packed
 * as pairs (4 doubles an entry).
 */
import type { DenseKernels } from './denseKernels.ts';

const KC = 192; // entries of each row in one tile
const NC = 48; // rows of W in one tile (even: the lower kernel's 2 × 2 blocks start on even rows)

/**
 * T[i, j] −= Σ_{t<len} X[i, t]·W[j, t] for i < rows, j < cols. Flops: 8·rows·cols·len.
 * Example: rows = cols = 2, len = 1, X = [1; i], W = pairs of [1; 2], T = 0 → T = −[1 2; i 2i].
 */
export function subtractProducts(K: DenseKernels, t: number, ts: number, x: number, xs: number, w: number, ws: number, rows: number, cols: number, len: number): void {
  for (let t0 = 0; t0 < len; t0 += KC) {
    const n = Math.min(KC, len - t0);
    for (let j0 = 0; j0 < cols; j0 += NC) {
      K.products(t + 2 * j0, ts, x + 2 * t0, xs, w + j0 * ws + 4 * t0, ws, rows, Math.min(NC, cols - j0), n);
    }
  }
}

/**
 * C[i, j] −= Σ_{t<len} X[i, t]·W[j, t] for j ≤ i < m, X and W the same m rows (C the front's trailing
 * block, row stride cs). Flops: 4·len·m(m+1). Example: m = 2, len = 1, X = [1; 2], W = pairs of
 * [d₀·1; d₀·2] with d₀ = 1 → C −= [1 ·; 2 4].
 */
export function subtractLowerProducts(K: DenseKernels, c: number, cs: number, x: number, xs: number, w: number, ws: number, m: number, len: number): void {
  for (let t0 = 0; t0 < len; t0 += KC) {
    const n = Math.min(KC, len - t0);
    for (let j0 = 0; j0 < m; j0 += NC) {
      const j1 = Math.min(m, j0 + NC);
      K.lowerProducts(c + j0 * cs + 2 * j0, cs, x + j0 * xs + 2 * t0, xs, w + j0 * ws + 4 * t0, ws, j1 - j0, n);
      if (j1 < m) K.products(c + j1 * cs + 2 * j0, cs, x + j1 * xs + 2 * t0, xs, w + j0 * ws + 4 * t0, ws, m - j1, j1 - j0, n);
    }
  }
}

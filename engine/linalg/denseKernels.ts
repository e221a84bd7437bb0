/**
 * The dense kernels of one frontal matrix, as an interface with two implementations: plain
 * JavaScript (this file, for platforms without WebAssembly SIMD, and the oracle of the other) and
 * WebAssembly SIMD (simdKernels.ts). Both work on one flat Float64Array, the front arena
 * (frontArena.ts); every argument is an offset or a stride in doubles into it.
 *
 * Layout, complex entries interleaved (re, im):
 *  - a matrix X with row stride xs: X[i, t] at x + i·xs + 2t;
 *  - a scaled, packed operand W with row stride ws: W[j, t] at w + j·ws + 4t holds the pair
 *    (w_re, w_im, w_im, w_re), so that a product of interleaved numbers needs no shuffles in the
 *    inner loop: with a = Σ (x_re·w_re, x_im·w_im) and b = Σ (x_re·w_im, x_im·w_re), Σ x·w is
 *    (a₀ − a₁) + i(b₀ + b₁).
 * Products are plain transposes (no conjugation): the matrices are complex symmetric.
 */

export type KernelKind = 'simd' | 'js';

export interface DenseKernels {
  readonly kind: KernelKind;
  /**
   * T[i, j] −= Σ_{t<len} X[i, t]·W[j, t] for i < rows, j < cols (T row stride ts, X stride xs, W stride ws).
   * Flops: 8·rows·cols·len. Example: rows = cols = len = 1, X = [1+2i], W = pair of 3+4i = [3, 4, 4, 3],
   * T = [10+0i] → T = 10 − (1+2i)(3+4i) = 10 − (−5+10i) = 15 − 10i.
   */
  products(t: number, ts: number, x: number, xs: number, w: number, ws: number, rows: number, cols: number, len: number): void;
  /**
   * The same for the lower triangle j ≤ i < m of a square target whose X and W rows are the same rows.
   * Flops: 8·len·m(m+1)/2. The SIMD kernel also writes T[i, i+1] for even i (a 2 × 2 block on the
   * diagonal is computed whole): callers keep the strict upper triangle as scratch.
   */
  lowerProducts(t: number, ts: number, x: number, xs: number, w: number, ws: number, m: number, len: number): void;
  /**
   * W[r, c] = X[r, c]·d_c written as pairs, for r < rows, c < cols, d_c at d + 2c.
   * Flops: 6·rows·cols. Example: X = [1+2i], d = [2−i] → W = pair of (1+2i)(2−i) = 4+3i = [4, 3, 3, 4].
   */
  packScaled(x: number, xs: number, rows: number, cols: number, d: number, w: number, ws: number): void;
  /**
   * The rows below a diagonal block of nb pivots: for each row r < rows and k < nb in order,
   * P[r, k] = (P[r, k] − Σ_{t<k} P[r, t]·W[k, t])·inv_k, with inv_k at inv + 2k (a triangular solve
   * with the block's unit lower factor, then the division by its pivots, row by row).
   * Flops: rows·(4·nb(nb−1) + 6·nb). Example: nb = 1, P = [6+2i], inv = [0.5] → P = [3+i].
   */
  solveRows(p: number, ps: number, rows: number, nb: number, w: number, ws: number, inv: number): void;
  /**
   * Adds a child's update matrix, its lower triangle packed by rows ((a, b) at src + a(a+1) + 2b), into
   * the front: entry (a, b) goes to F[rel[a], rel[b]] at f + rel[a]·fs + 2·rel[b]. rel is an index into
   * the arena's Int32 view (its increasing parent-local positions). Flops: mc(mc+1) real additions.
   */
  extendAdd(src: number, rel: number, mc: number, f: number, fs: number): void;
}

/** The kernels in plain JavaScript on the arena's views; also the reference the SIMD kernels are tested against. */
export function jsKernels(M: Float64Array, I: Int32Array): DenseKernels {
  return {
    kind: 'js',
    products(t, ts, x, xs, w, ws, rows, cols, len) {
      let i = 0;
      for (; i + 1 < rows; i += 2) {
        const ta = t + i * ts, xa = x + i * xs;
        let j = 0;
        for (; j + 1 < cols; j += 2) dot22(M, xa, xa + xs, w + j * ws, w + (j + 1) * ws, len, ta + 2 * j, ta + ts + 2 * j);
        if (j < cols) dot21(M, xa, xa + xs, w + j * ws, len, ta + 2 * j, ta + ts + 2 * j);
      }
      if (i < rows) for (let j = 0; j < cols; j++) dot11(M, x + i * xs, w + j * ws, len, t + i * ts + 2 * j);
    },
    lowerProducts(t, ts, x, xs, w, ws, m, len) {
      let i = 0;
      for (; i + 1 < m; i += 2) {
        const ta = t + i * ts, xa = x + i * xs;
        for (let j = 0; j < i; j += 2) dot22(M, xa, xa + xs, w + j * ws, w + (j + 1) * ws, len, ta + 2 * j, ta + ts + 2 * j);
        dot21(M, xa, xa + xs, w + i * ws, len, ta + 2 * i, ta + ts + 2 * i);
        dot11(M, xa + xs, w + (i + 1) * ws, len, ta + ts + 2 * i + 2);
      }
      if (i < m) for (let j = 0; j <= i; j++) dot11(M, x + i * xs, w + j * ws, len, t + i * ts + 2 * j);
    },
    packScaled(x, xs, rows, cols, d, w, ws) {
      for (let r = 0; r < rows; r++) {
        const xr = x + r * xs, wr = w + r * ws;
        for (let c = 0; c < cols; c++) {
          const lr = M[xr + 2 * c], li = M[xr + 2 * c + 1], dr = M[d + 2 * c], di = M[d + 2 * c + 1];
          const pr = lr * dr - li * di, pi = lr * di + li * dr;
          M[wr + 4 * c] = pr;
          M[wr + 4 * c + 1] = pi;
          M[wr + 4 * c + 2] = pi;
          M[wr + 4 * c + 3] = pr;
        }
      }
    },
    solveRows(p, ps, rows, nb, w, ws, inv) {
      for (let r = 0; r < rows; r++) {
        const pr = p + r * ps;
        for (let k = 0; k < nb; k++) {
          const wk = w + k * ws;
          let sr = M[pr + 2 * k], si = M[pr + 2 * k + 1];
          for (let t = 0; t < k; t++) {
            const ar = M[pr + 2 * t], ai = M[pr + 2 * t + 1], wr = M[wk + 4 * t], wi = M[wk + 4 * t + 1];
            sr -= ar * wr - ai * wi;
            si -= ar * wi + ai * wr;
          }
          const dr = M[inv + 2 * k], di = M[inv + 2 * k + 1];
          M[pr + 2 * k] = sr * dr - si * di;
          M[pr + 2 * k + 1] = sr * di + si * dr;
        }
      }
    },
    extendAdd(src, rel, mc, f, fs) {
      for (let a = 0; a < mc; a++) {
        const row = f + I[rel + a] * fs;
        for (let b = 0; b <= a; b++) {
          const d = row + 2 * I[rel + b];
          M[d] += M[src];
          M[d + 1] += M[src + 1];
          src += 2;
        }
      }
    },
  };
}

/** [T(a,j) T(a,j+1); T(b,j) T(b,j+1)] −= [x_a; x_b]·[w_j; w_k]ᵀ over len entries, at ta, tb. */
function dot22(M: Float64Array, xa: number, xb: number, wa: number, wb: number, len: number, ta: number, tb: number): void {
  let s00r = 0, s00i = 0, s01r = 0, s01i = 0, s10r = 0, s10i = 0, s11r = 0, s11i = 0;
  for (let t = 0; t < len; t++) {
    const pr = M[xa + 2 * t], pi = M[xa + 2 * t + 1], qr = M[xb + 2 * t], qi = M[xb + 2 * t + 1];
    const ur = M[wa + 4 * t], ui = M[wa + 4 * t + 1], vr = M[wb + 4 * t], vi = M[wb + 4 * t + 1];
    s00r += pr * ur - pi * ui;
    s00i += pr * ui + pi * ur;
    s01r += pr * vr - pi * vi;
    s01i += pr * vi + pi * vr;
    s10r += qr * ur - qi * ui;
    s10i += qr * ui + qi * ur;
    s11r += qr * vr - qi * vi;
    s11i += qr * vi + qi * vr;
  }
  M[ta] -= s00r;
  M[ta + 1] -= s00i;
  M[ta + 2] -= s01r;
  M[ta + 3] -= s01i;
  M[tb] -= s10r;
  M[tb + 1] -= s10i;
  M[tb + 2] -= s11r;
  M[tb + 3] -= s11i;
}

function dot21(M: Float64Array, xa: number, xb: number, wa: number, len: number, ta: number, tb: number): void {
  let s0r = 0, s0i = 0, s1r = 0, s1i = 0;
  for (let t = 0; t < len; t++) {
    const ur = M[wa + 4 * t], ui = M[wa + 4 * t + 1];
    const pr = M[xa + 2 * t], pi = M[xa + 2 * t + 1], qr = M[xb + 2 * t], qi = M[xb + 2 * t + 1];
    s0r += pr * ur - pi * ui;
    s0i += pr * ui + pi * ur;
    s1r += qr * ur - qi * ui;
    s1i += qr * ui + qi * ur;
  }
  M[ta] -= s0r;
  M[ta + 1] -= s0i;
  M[tb] -= s1r;
  M[tb + 1] -= s1i;
}

function dot11(M: Float64Array, xa: number, wa: number, len: number, ta: number): void {
  let sr = 0, si = 0;
  for (let t = 0; t < len; t++) {
    const pr = M[xa + 2 * t], pi = M[xa + 2 * t + 1], ur = M[wa + 4 * t], ui = M[wa + 4 * t + 1];
    sr += pr * ur - pi * ui;
    si += pr * ui + pi * ur;
  }
  M[ta] -= sr;
  M[ta + 1] -= si;
}

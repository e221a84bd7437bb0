/**
 * T −= X Yᵀ for complex interleaved row-major blocks (plain transpose, no conjugation): the one
 * kernel that carries almost all the flops of the factorisation.
 *
 * Every entry is a dot product of a row of X and a row of Y over unit-stride memory. Entries are
 * computed in 2 × 2 groups so each loaded number serves two products (register blocking), and the
 * work is tiled so a panel of Y rows × KC columns stays in cache while all rows of X stream past it
 * (Goto & van de Geijn, "Anatomy of high-performance matrix multiplication", ACM TOMS 34(3), 2008).
 * Row i of the target starts at rowStart[i] (in doubles), so the same code serves row-major panels
 * and packed lower triangles.
 */

const KC = 2 * 192; // doubles of each row in one tile
const NC = 48; // rows of Y in one tile

/** T[i, j] −= Σ_t X[i, t]·Y[j, t] for i < rows, j < cols, t < len (len, strides in doubles). */
export function subtractProducts(
  X: Float64Array, xOff: number, xStride: number, Y: Float64Array, yOff: number, yStride: number,
  rows: number, cols: number, len: number, T: Float64Array, rowStart: Int32Array, rowBase: number, colBase: number,
): void {
  for (let t0 = 0; t0 < len; t0 += KC) {
    const n2 = Math.min(KC, len - t0);
    for (let j0 = 0; j0 < cols; j0 += NC) {
      const j1 = Math.min(cols, j0 + NC);
      rectangle(X, xOff + t0, xStride, Y, yOff + t0, yStride, 0, rows, j0, j1, n2, T, rowStart, rowBase, colBase);
    }
  }
}

/** C[i, j] −= Σ_t X[i, t]·Y[j, t] for j ≤ i < m (the lower triangle only). */
export function subtractLowerProducts(
  X: Float64Array, xOff: number, Y: Float64Array, yOff: number, stride: number, m: number, len: number,
  C: Float64Array, rowStart: Int32Array,
): void {
  for (let t0 = 0; t0 < len; t0 += KC) {
    const n2 = Math.min(KC, len - t0);
    for (let j0 = 0; j0 < m; j0 += NC) {
      const j1 = Math.min(m, j0 + NC);
      lowerTile(X, xOff + t0, Y, yOff + t0, stride, j0, j1, n2, C, rowStart);
      rectangle(X, xOff + t0, stride, Y, yOff + t0, stride, j1, m, j0, j1, n2, C, rowStart, 0, 0);
    }
  }
}

/** Rows [i0, i1) × columns [j0, j1) of the target, in 2 × 2 groups and their odd edges. */
function rectangle(
  X: Float64Array, x0: number, xs: number, Y: Float64Array, y0: number, ys: number,
  i0: number, i1: number, j0: number, j1: number, n2: number, T: Float64Array, rowStart: Int32Array, rowBase: number, colBase: number,
): void {
  let i = i0;
  for (; i + 1 < i1; i += 2) {
    const xa = x0 + i * xs, ta = rowStart[rowBase + i] + 2 * colBase, tb = rowStart[rowBase + i + 1] + 2 * colBase;
    let j = j0;
    for (; j + 1 < j1; j += 2) dot22(X, xa, xa + xs, Y, y0 + j * ys, y0 + (j + 1) * ys, n2, T, ta + 2 * j, tb + 2 * j);
    if (j < j1) dot21(X, xa, xa + xs, Y, y0 + j * ys, n2, T, ta + 2 * j, tb + 2 * j);
  }
  if (i < i1) {
    const xa = x0 + i * xs, ta = rowStart[rowBase + i] + 2 * colBase;
    for (let j = j0; j < j1; j++) dot11(X, xa, Y, y0 + j * ys, n2, T, ta + 2 * j);
  }
}

/** The lower triangle of the square tile [j0, j1) × [j0, j1). */
function lowerTile(X: Float64Array, x0: number, Y: Float64Array, y0: number, s: number, j0: number, j1: number, n2: number, C: Float64Array, rowStart: Int32Array): void {
  let i = j0;
  for (; i + 1 < j1; i += 2) {
    const xa = x0 + i * s, ca = rowStart[i], cb = rowStart[i + 1];
    for (let j = j0; j < i; j += 2) dot22(X, xa, xa + s, Y, y0 + j * s, y0 + (j + 1) * s, n2, C, ca + 2 * j, cb + 2 * j);
    dot21(X, xa, xa + s, Y, y0 + i * s, n2, C, ca + 2 * i, cb + 2 * i); // (i, i) and (i+1, i)
    dot11(X, xa + s, Y, y0 + (i + 1) * s, n2, C, cb + 2 * i + 2); // (i+1, i+1)
  }
  if (i < j1) {
    const xa = x0 + i * s, ca = rowStart[i];
    for (let j = j0; j <= i; j++) dot11(X, xa, Y, y0 + j * s, n2, C, ca + 2 * j);
  }
}

/** [T(a,j) T(a,j+1); T(b,j) T(b,j+1)] −= [x_a; x_b]·[y_j; y_k]ᵀ, at ta, tb. */
function dot22(X: Float64Array, xa: number, xb: number, Y: Float64Array, ya: number, yb: number, n2: number, T: Float64Array, ta: number, tb: number): void {
  let s00r = 0, s00i = 0, s01r = 0, s01i = 0, s10r = 0, s10i = 0, s11r = 0, s11i = 0;
  for (let t = 0; t < n2; t += 2) {
    const pr = X[xa + t], pi = X[xa + t + 1], qr = X[xb + t], qi = X[xb + t + 1];
    const ur = Y[ya + t], ui = Y[ya + t + 1], vr = Y[yb + t], vi = Y[yb + t + 1];
    s00r += pr * ur - pi * ui;
    s00i += pr * ui + pi * ur;
    s01r += pr * vr - pi * vi;
    s01i += pr * vi + pi * vr;
    s10r += qr * ur - qi * ui;
    s10i += qr * ui + qi * ur;
    s11r += qr * vr - qi * vi;
    s11i += qr * vi + qi * vr;
  }
  T[ta] -= s00r;
  T[ta + 1] -= s00i;
  T[ta + 2] -= s01r;
  T[ta + 3] -= s01i;
  T[tb] -= s10r;
  T[tb + 1] -= s10i;
  T[tb + 2] -= s11r;
  T[tb + 3] -= s11i;
}

function dot21(X: Float64Array, xa: number, xb: number, Y: Float64Array, ya: number, n2: number, T: Float64Array, ta: number, tb: number): void {
  let s0r = 0, s0i = 0, s1r = 0, s1i = 0;
  for (let t = 0; t < n2; t += 2) {
    const ur = Y[ya + t], ui = Y[ya + t + 1];
    const pr = X[xa + t], pi = X[xa + t + 1], qr = X[xb + t], qi = X[xb + t + 1];
    s0r += pr * ur - pi * ui;
    s0i += pr * ui + pi * ur;
    s1r += qr * ur - qi * ui;
    s1i += qr * ui + qi * ur;
  }
  T[ta] -= s0r;
  T[ta + 1] -= s0i;
  T[tb] -= s1r;
  T[tb + 1] -= s1i;
}

function dot11(X: Float64Array, xa: number, Y: Float64Array, ya: number, n2: number, T: Float64Array, ta: number): void {
  let sr = 0, si = 0;
  for (let t = 0; t < n2; t += 2) {
    const pr = X[xa + t], pi = X[xa + t + 1], ur = Y[ya + t], ui = Y[ya + t + 1];
    sr += pr * ur - pi * ui;
    si += pr * ui + pi * ur;
  }
  T[ta] -= sr;
  T[ta + 1] -= si;
}

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
 * Golub & Van Loan, "Matrix Computations", 4th ed. (2013), §4.1.2 (LDLᵀ), §1.5 (blocking for
 * register reuse): the update loops compute 2 × 2 blocks of dot products so each loaded entry is
 * used twice.
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

/** Factors the front in place; `first` is the global index of its first pivot column. */
export function factorFront(
  P: Float64Array, off: number, F: number, ns: number, C: Float64Array, cOff: number,
  W: Float64Array, first: number, D: FrontDiagonal, policy: PivotPolicy,
): void {
  factorDiagonalBlock(P, off, ns, W, first, D, policy);
  solvePanelRows(P, off, ns, F, W, first, D);
  const m = F - ns;
  if (m === 0) return;
  scaleRowsByD(P, off + 2 * ns * ns, m, ns, W, first, D);
  updateSchurComplement(P, off + 2 * ns * ns, m, ns, W, C, cOff);
}

/** Row-oriented Crout on the ns × ns block; leaves W row k = L[k, 0..k)·D for the panel solve. */
function factorDiagonalBlock(P: Float64Array, off: number, ns: number, W: Float64Array, first: number, D: FrontDiagonal, policy: PivotPolicy): void {
  const { dRe, dIm, invRe, invIm } = D;
  for (let i = 0; i < ns; i++) {
    const ri = off + 2 * i * ns;
    for (let k = 0; k < i; k++) {
      const wk = 2 * k * ns;
      let sr = P[ri + 2 * k], si = P[ri + 2 * k + 1];
      for (let t = 0; t < 2 * k; t += 2) {
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
    for (let t = 0; t < i; t++) {
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

/** L21 = A21 L11⁻ᵀ D⁻¹, two rows at a time sharing the loads of W. */
function solvePanelRows(P: Float64Array, off: number, ns: number, F: number, W: Float64Array, first: number, D: FrontDiagonal): void {
  const { invRe, invIm } = D;
  let i = ns;
  for (; i + 1 < F; i += 2) {
    const r0 = off + 2 * i * ns, r1 = r0 + 2 * ns;
    for (let k = 0; k < ns; k++) {
      const wk = 2 * k * ns;
      let s0r = P[r0 + 2 * k], s0i = P[r0 + 2 * k + 1], s1r = P[r1 + 2 * k], s1i = P[r1 + 2 * k + 1];
      for (let t = 0; t < 2 * k; t += 2) {
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
    for (let k = 0; k < ns; k++) {
      const wk = 2 * k * ns;
      let sr = P[r0 + 2 * k], si = P[r0 + 2 * k + 1];
      for (let t = 0; t < 2 * k; t += 2) {
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

/** W row a = L21 row a · D. */
function scaleRowsByD(P: Float64Array, l2: number, m: number, ns: number, W: Float64Array, first: number, D: FrontDiagonal): void {
  const { dRe, dIm } = D;
  for (let a = 0; a < m; a++) {
    const ra = l2 + 2 * a * ns, wa = 2 * a * ns;
    for (let t = 0; t < ns; t++) {
      const lr = P[ra + 2 * t], li = P[ra + 2 * t + 1], dr = dRe[first + t], di = dIm[first + t];
      W[wa + 2 * t] = lr * dr - li * di;
      W[wa + 2 * t + 1] = lr * di + li * dr;
    }
  }
}

/** C −= L21 D L21ᵀ on the lower triangle, in 2 × 2 blocks of (row of L21) · (row of W). */
function updateSchurComplement(P: Float64Array, l2: number, m: number, ns: number, W: Float64Array, C: Float64Array, cOff: number): void {
  const len = 2 * ns;
  let a = 0;
  for (; a + 1 < m; a += 2) {
    const la = l2 + a * len, lb = la + len;
    const ca = cOff + a * (a + 1), cb = cOff + (a + 1) * (a + 2);
    let b = 0;
    for (; b + 1 <= a; b += 2) {
      const wa = b * len, wb = wa + len;
      let s00r = 0, s00i = 0, s01r = 0, s01i = 0, s10r = 0, s10i = 0, s11r = 0, s11i = 0;
      for (let t = 0; t < len; t += 2) {
        const xr = P[la + t], xi = P[la + t + 1], yr = P[lb + t], yi = P[lb + t + 1];
        const ur = W[wa + t], ui = W[wa + t + 1], vr = W[wb + t], vi = W[wb + t + 1];
        s00r += xr * ur - xi * ui;
        s00i += xr * ui + xi * ur;
        s01r += xr * vr - xi * vi;
        s01i += xr * vi + xi * vr;
        s10r += yr * ur - yi * ui;
        s10i += yr * ui + yi * ur;
        s11r += yr * vr - yi * vi;
        s11i += yr * vi + yi * vr;
      }
      C[ca + 2 * b] -= s00r;
      C[ca + 2 * b + 1] -= s00i;
      C[ca + 2 * b + 2] -= s01r;
      C[ca + 2 * b + 3] -= s01i;
      C[cb + 2 * b] -= s10r;
      C[cb + 2 * b + 1] -= s10i;
      C[cb + 2 * b + 2] -= s11r;
      C[cb + 2 * b + 3] -= s11i;
    }
    // the 2 × 2 diagonal block (a, a), (a+1, a), (a+1, a+1)
    const wa = a * len, wb = wa + len;
    let s00r = 0, s00i = 0, s10r = 0, s10i = 0, s11r = 0, s11i = 0;
    for (let t = 0; t < len; t += 2) {
      const xr = P[la + t], xi = P[la + t + 1], yr = P[lb + t], yi = P[lb + t + 1];
      const ur = W[wa + t], ui = W[wa + t + 1], vr = W[wb + t], vi = W[wb + t + 1];
      s00r += xr * ur - xi * ui;
      s00i += xr * ui + xi * ur;
      s10r += yr * ur - yi * ui;
      s10i += yr * ui + yi * ur;
      s11r += yr * vr - yi * vi;
      s11i += yr * vi + yi * vr;
    }
    C[ca + 2 * a] -= s00r;
    C[ca + 2 * a + 1] -= s00i;
    C[cb + 2 * a] -= s10r;
    C[cb + 2 * a + 1] -= s10i;
    C[cb + 2 * a + 2] -= s11r;
    C[cb + 2 * a + 3] -= s11i;
  }
  if (a < m) updateLastRow(P, l2 + a * len, a, len, W, C, cOff + a * (a + 1));
}

/** The odd row left over by the 2 × 2 blocking: C[a, 0..a] −= L21[a]·W[b]. */
function updateLastRow(P: Float64Array, la: number, a: number, len: number, W: Float64Array, C: Float64Array, ca: number): void {
  for (let b = 0; b <= a; b++) {
    const wb = b * len;
    let sr = 0, si = 0;
    for (let t = 0; t < len; t += 2) {
      const xr = P[la + t], xi = P[la + t + 1], ur = W[wb + t], ui = W[wb + t + 1];
      sr += xr * ur - xi * ui;
      si += xr * ui + xi * ur;
    }
    C[ca + 2 * b] -= sr;
    C[ca + 2 * b + 1] -= si;
  }
}

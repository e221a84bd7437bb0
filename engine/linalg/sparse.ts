/**
 * Compressed sparse row storage for complex symmetric matrices.
 * Both triangles are stored, column indices sorted within each row, the diagonal always present:
 * the assembler fills it that way and the factorisation reads whichever half it needs.
 */
import type { ComplexVector } from '../core/complex.ts';

export interface SparsePattern {
  n: number;
  rowPtr: Int32Array; // n + 1
  colIdx: Int32Array; // nnz, sorted within each row
}

export interface ComplexCsr extends SparsePattern {
  re: Float64Array; // nnz
  im: Float64Array; // nnz
}

export type { ComplexVector };

export function zeroVector(n: number): ComplexVector {
  return { re: new Float64Array(n), im: new Float64Array(n) };
}

/** y = A x */
export function multiply(A: ComplexCsr, x: ComplexVector, y: ComplexVector = zeroVector(A.n)): ComplexVector {
  const { n, rowPtr, colIdx, re, im } = A;
  for (let i = 0; i < n; i++) {
    let sr = 0, si = 0;
    for (let k = rowPtr[i]; k < rowPtr[i + 1]; k++) {
      const j = colIdx[k], ar = re[k], ai = im[k], xr = x.re[j], xi = x.im[j];
      sr += ar * xr - ai * xi;
      si += ar * xi + ai * xr;
    }
    y.re[i] = sr;
    y.im[i] = si;
  }
  return y;
}

export function norm2(v: ComplexVector): number {
  let s = 0;
  for (let i = 0; i < v.re.length; i++) s += v.re[i] * v.re[i] + v.im[i] * v.im[i];
  return Math.sqrt(s);
}

/** ‖A x − b‖ / ‖b‖ */
export function relativeResidual(A: ComplexCsr, x: ComplexVector, b: ComplexVector): number {
  const r = multiply(A, x);
  for (let i = 0; i < A.n; i++) {
    r.re[i] -= b.re[i];
    r.im[i] -= b.im[i];
  }
  const nb = norm2(b);
  return nb === 0 ? norm2(r) : norm2(r) / nb;
}

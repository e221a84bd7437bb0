/**
 * Complex numbers, in the two shapes the engine uses (DEVELOPERS.md, "Complex arrays"):
 *  - `Complex`, one scalar {re, im}: material coefficients, admittances, wavenumbers, mode factors,
 *    the small dense plane-wave algebra. Never in a loop over many values.
 *  - `ComplexVector`, split re/im Float64Arrays of equal length: fields, right-hand sides, matrix values.
 * Time dependence e^{+jωt} throughout; these helpers are plain algebra and take no side on it.
 */

export interface Complex {
  re: number;
  im: number;
}

/** n complex values as two arrays of length n (read without creating objects). */
export interface ComplexVector {
  re: Float64Array;
  im: Float64Array;
}

export const cx = (re: number, im = 0): Complex => ({ re, im });
export const ZERO: Complex = cx(0);
export const ONE: Complex = cx(1);

export const add = (a: Complex, b: Complex): Complex => cx(a.re + b.re, a.im + b.im);
export const sub = (a: Complex, b: Complex): Complex => cx(a.re - b.re, a.im - b.im);
export const mul = (a: Complex, b: Complex): Complex => cx(a.re * b.re - a.im * b.im, a.re * b.im + a.im * b.re);
export const scale = (a: Complex, s: number): Complex => cx(a.re * s, a.im * s);
export const abs = (a: Complex): number => Math.hypot(a.re, a.im);

export function div(a: Complex, b: Complex): Complex {
  // Smith's algorithm: avoids overflow when |b| is large or small.
  if (Math.abs(b.re) >= Math.abs(b.im)) {
    const r = b.im / b.re;
    const d = b.re + b.im * r;
    return cx((a.re + a.im * r) / d, (a.im - a.re * r) / d);
  }
  const r = b.re / b.im;
  const d = b.re * r + b.im;
  return cx((a.re * r + a.im) / d, (a.im * r - a.re) / d);
}

/**
 * Eigenvalues of a small dense complex matrix: Householder reduction to upper Hessenberg form, then
 * the single-shift complex QR iteration with Wilkinson shifts and deflation on negligible
 * subdiagonals (Golub & Van Loan, Matrix Computations, 4th ed. (2013), §7.4–7.5). Eigenvalues only:
 * the rotations touch the active window alone. The rational fit's poles are the eigenvalues of a
 * matrix of order (support points − 1), a few tens at most.
 *
 * Layout as in svd.ts: column-major, split re/im.
 */
import type { ComplexMatrix } from './svd.ts';
import type { ComplexVector } from '../core/complex.ts';

/** n complex values, split re/im (engine/core's ComplexVector). */
export type ComplexList = ComplexVector;

const EPS = 2 ** -52;

/** All n eigenvalues of the n×n matrix a (a is not modified). */
export function eigenvalues(a: ComplexMatrix): ComplexList {
  const n = a.rows;
  if (a.cols !== n) throw new RangeError(`eigenvalues need a square matrix (got ${a.rows}×${a.cols})`);
  const hr = Float64Array.from(a.re), hi = Float64Array.from(a.im);
  hessenberg(hr, hi, n);
  return hessenbergQr(hr, hi, n);
}

function hessenberg(hr: Float64Array, hi: Float64Array, n: number): void {
  const vr = new Float64Array(n), vi = new Float64Array(n);
  for (let k = 0; k < n - 2; k++) {
    let norm2 = 0;
    for (let i = k + 1; i < n; i++) norm2 += hr[i + k * n] ** 2 + hi[i + k * n] ** 2;
    const norm = Math.sqrt(norm2);
    if (norm === 0) continue;
    const x0r = hr[k + 1 + k * n], x0i = hi[k + 1 + k * n], x0 = Math.hypot(x0r, x0i);
    const pr = x0 === 0 ? 1 : x0r / x0, pi = x0 === 0 ? 0 : x0i / x0;
    for (let i = k + 1; i < n; i++) {
      vr[i] = hr[i + k * n];
      vi[i] = hi[i + k * n];
    }
    vr[k + 1] += pr * norm;
    vi[k + 1] += pi * norm;
    let vv = 0;
    for (let i = k + 1; i < n; i++) vv += vr[i] ** 2 + vi[i] ** 2;
    // H ← (I − 2vvᴴ/vᴴv) H: rows k+1.., every column from k
    for (let j = k; j < n; j++) {
      let sr = 0, si = 0;
      for (let i = k + 1; i < n; i++) {
        const ar = hr[i + j * n], ai = hi[i + j * n];
        sr += vr[i] * ar + vi[i] * ai;
        si += vr[i] * ai - vi[i] * ar;
      }
      const fr = (2 * sr) / vv, fi = (2 * si) / vv;
      for (let i = k + 1; i < n; i++) {
        hr[i + j * n] -= vr[i] * fr - vi[i] * fi;
        hi[i + j * n] -= vr[i] * fi + vi[i] * fr;
      }
    }
    // H ← H (I − 2vvᴴ/vᴴv): columns k+1.., every row
    for (let i = 0; i < n; i++) {
      let sr = 0, si = 0; // s = Σ_j H_ij v_j
      for (let j = k + 1; j < n; j++) {
        const ar = hr[i + j * n], ai = hi[i + j * n];
        sr += ar * vr[j] - ai * vi[j];
        si += ar * vi[j] + ai * vr[j];
      }
      const fr = (2 * sr) / vv, fi = (2 * si) / vv;
      for (let j = k + 1; j < n; j++) {
        // H_ij −= f·conj(v_j)
        hr[i + j * n] -= fr * vr[j] + fi * vi[j];
        hi[i + j * n] -= fi * vr[j] - fr * vi[j];
      }
    }
    for (let i = k + 2; i < n; i++) {
      hr[i + k * n] = 0;
      hi[i + k * n] = 0;
    }
  }
}

function hessenbergQr(hr: Float64Array, hi: Float64Array, n: number): ComplexList {
  const out = { re: new Float64Array(n), im: new Float64Array(n) };
  const cs = new Float64Array(n), snr = new Float64Array(n), sni = new Float64Array(n);
  let hiIdx = n - 1, iter = 0, total = 0;
  const at = (i: number, j: number) => i + j * n;
  while (hiIdx >= 0) {
    // the lowest row l of the unreduced block ending at hiIdx
    let l = hiIdx;
    while (l > 0) {
      const sub = Math.hypot(hr[at(l, l - 1)], hi[at(l, l - 1)]);
      const diag = Math.hypot(hr[at(l - 1, l - 1)], hi[at(l - 1, l - 1)]) + Math.hypot(hr[at(l, l)], hi[at(l, l)]);
      if (sub <= EPS * (diag === 0 ? 1 : diag)) {
        hr[at(l, l - 1)] = 0;
        hi[at(l, l - 1)] = 0;
        break;
      }
      l--;
    }
    if (l === hiIdx) {
      out.re[hiIdx] = hr[at(hiIdx, hiIdx)];
      out.im[hiIdx] = hi[at(hiIdx, hiIdx)];
      hiIdx--;
      iter = 0;
      continue;
    }
    if (++total > 100 * n) throw new Error('eigenvalues: the QR iteration did not converge');
    iter++;
    const [mr, mi] = iter % 11 === 0 ? exceptionalShift(hr, hi, n, hiIdx) : wilkinsonShift(hr, hi, n, hiIdx);
    for (let k = l; k <= hiIdx; k++) {
      hr[at(k, k)] -= mr;
      hi[at(k, k)] -= mi;
    }
    // H − μI = QR by Givens rotations from the left …
    for (let k = l; k < hiIdx; k++) {
      const ar = hr[at(k, k)], ai = hi[at(k, k)], br = hr[at(k + 1, k)], bi = hi[at(k + 1, k)];
      const na = Math.hypot(ar, ai), nrm = Math.hypot(na, Math.hypot(br, bi));
      let c: number, sr: number, si: number;
      if (nrm === 0) {
        c = 1; sr = 0; si = 0;
      } else if (na === 0) {
        c = 0; sr = 1; si = 0;
        // with a = 0, G = [0 1; −1 0] maps (0, b) to (b, 0)
      } else {
        // s = (a/|a|)·conj(b)/‖(a, b)‖
        c = na / nrm;
        const ur = ar / na, ui = ai / na;
        sr = (ur * br + ui * bi) / nrm;
        si = (ui * br - ur * bi) / nrm;
      }
      cs[k] = c; snr[k] = sr; sni[k] = si;
      for (let j = k; j <= hiIdx; j++) {
        const xr = hr[at(k, j)], xi = hi[at(k, j)], yr = hr[at(k + 1, j)], yi = hi[at(k + 1, j)];
        // x' = c x + s y, y' = −conj(s) x + c y
        hr[at(k, j)] = c * xr + sr * yr - si * yi;
        hi[at(k, j)] = c * xi + sr * yi + si * yr;
        hr[at(k + 1, j)] = -(sr * xr + si * xi) + c * yr;
        hi[at(k + 1, j)] = -(sr * xi - si * xr) + c * yi;
      }
    }
    // … then RQ + μI by the same rotations from the right.
    for (let k = l; k < hiIdx; k++) {
      const c = cs[k], sr = snr[k], si = sni[k];
      const top = Math.min(k + 2, hiIdx);
      for (let i = l; i <= top; i++) {
        const xr = hr[at(i, k)], xi = hi[at(i, k)], yr = hr[at(i, k + 1)], yi = hi[at(i, k + 1)];
        // col_k' = c col_k + conj(s) col_{k+1}, col_{k+1}' = −s col_k + c col_{k+1}
        hr[at(i, k)] = c * xr + sr * yr + si * yi;
        hi[at(i, k)] = c * xi + sr * yi - si * yr;
        hr[at(i, k + 1)] = -(sr * xr - si * xi) + c * yr;
        hi[at(i, k + 1)] = -(sr * xi + si * xr) + c * yi;
      }
    }
    for (let k = l; k <= hiIdx; k++) {
      hr[at(k, k)] += mr;
      hi[at(k, k)] += mi;
    }
  }
  return out;
}

/** The eigenvalue of the trailing 2×2 block nearer its last diagonal entry. */
function wilkinsonShift(hr: Float64Array, hi: Float64Array, n: number, k: number): [number, number] {
  const a = [hr[k - 1 + (k - 1) * n], hi[k - 1 + (k - 1) * n]], b = [hr[k - 1 + k * n], hi[k - 1 + k * n]];
  const c = [hr[k + (k - 1) * n], hi[k + (k - 1) * n]], d = [hr[k + k * n], hi[k + k * n]];
  // λ = (a + d)/2 ± sqrt(((a − d)/2)² + bc)
  const hr0 = (a[0] - d[0]) / 2, hi0 = (a[1] - d[1]) / 2;
  const disc = [hr0 * hr0 - hi0 * hi0 + b[0] * c[0] - b[1] * c[1], 2 * hr0 * hi0 + b[0] * c[1] + b[1] * c[0]];
  const [sr, si] = csqrt(disc[0], disc[1]);
  const mr = (a[0] + d[0]) / 2, mi = (a[1] + d[1]) / 2;
  const l1 = [mr + sr, mi + si], l2 = [mr - sr, mi - si];
  return Math.hypot(l1[0] - d[0], l1[1] - d[1]) <= Math.hypot(l2[0] - d[0], l2[1] - d[1]) ? [l1[0], l1[1]] : [l2[0], l2[1]];
}

/** An ad hoc shift that breaks the rare cycles of the Wilkinson shift (Golub & Van Loan §7.5.7). */
function exceptionalShift(hr: Float64Array, hi: Float64Array, n: number, k: number): [number, number] {
  const s = Math.hypot(hr[k + (k - 1) * n], hi[k + (k - 1) * n]) + (k >= 2 ? Math.hypot(hr[k - 1 + (k - 2) * n], hi[k - 1 + (k - 2) * n]) : 0);
  return [hr[k + k * n] + 0.75 * s, hi[k + k * n] - 0.4375 * s];
}

function csqrt(re: number, im: number): [number, number] {
  const r = Math.hypot(re, im);
  if (r === 0) return [0, 0];
  const sr = Math.sqrt((r + Math.abs(re)) / 2);
  if (re >= 0) return [sr, im / (2 * sr)];
  return [Math.abs(im) / (2 * sr), im >= 0 ? sr : -sr];
}

/**
 * Element matrices of a(p, v) = ∫ c₁ Σ_a (S/s_a²) ∂_a p ∂_a v − c₂ S p v dV on an axis-aligned box,
 * c₁ = 1/ρ, c₂ = ω²/κ (complex, constant per element), S = s_x s_y s_z.
 *
 * 1D factors per axis:  K_ab = ∫ (1/s) φ_a' φ_b' dx,  M_ab = ∫ s φ_a φ_b dx, each with the axis's own rule.
 * 3D matrix:            A = c₁ (K_x⊗M_y⊗M_z + M_x⊗K_y⊗M_z + M_x⊗M_y⊗K_z) − c₂ M_x⊗M_y⊗M_z,
 * with local index I = a + n(b + n c), n = p + 1 (a along x). Every array here is complex, split re/im.
 * One integrator for every cell: an interior cell has s = 1 on all three axes, an absorbing-layer cell a
 * stretch on one (face), two (edge) or three (corner) axes (the vocabulary: engine/assembly/layers.ts).
 */
import { tabulate } from './basis.ts';
import { ruleFor, stretchAt, type AxisStretch } from './stretch.ts';

export interface Matrix1D {
  n: number; // p + 1
  kRe: Float64Array; kIm: Float64Array; // n × n
  mRe: Float64Array; mIm: Float64Array; // n × n
}

export function element1D(p: number, x0: number, x1: number, st: AxisStretch): Matrix1D {
  const n = p + 1, rule = ruleFor(st, p), tab = tabulate(p, rule.points);
  const h = x1 - x0, out: Matrix1D = { n, kRe: new Float64Array(n * n), kIm: new Float64Array(n * n), mRe: new Float64Array(n * n), mIm: new Float64Array(n * n) };
  const s = new Float64Array(2);
  for (let q = 0; q < rule.points.length; q++) {
    stretchAt(st, x0 + 0.5 * h * (rule.points[q] + 1), s);
    const mag2 = s[0] * s[0] + s[1] * s[1];
    const wk = (rule.weights[q] * 2) / h, wm = (rule.weights[q] * h) / 2;
    const invRe = s[0] / mag2, invIm = -s[1] / mag2;
    for (let a = 0; a < n; a++) {
      const da = tab.slopes[q * n + a], va = tab.values[q * n + a];
      for (let b = 0; b < n; b++) {
        const dd = wk * da * tab.slopes[q * n + b], vv = wm * va * tab.values[q * n + b];
        out.kRe[a * n + b] += dd * invRe;
        out.kIm[a * n + b] += dd * invIm;
        out.mRe[a * n + b] += vv * s[0];
        out.mIm[a * n + b] += vv * s[1];
      }
    }
  }
  return out;
}

export interface ElementWork {
  n3: number;
  re: Float64Array; im: Float64Array; // n3 × n3, the element matrix
  // yz products, (n²) × (n²): MyMz, KyMz + MyKz
  mmRe: Float64Array; mmIm: Float64Array;
  kmRe: Float64Array; kmIm: Float64Array;
}

export function elementWork(p: number): ElementWork {
  const n = p + 1, n3 = n * n * n, n4 = n * n * n * n;
  return { n3, re: new Float64Array(n3 * n3), im: new Float64Array(n3 * n3), mmRe: new Float64Array(n4), mmIm: new Float64Array(n4), kmRe: new Float64Array(n4), kmIm: new Float64Array(n4) };
}

/**
 * The 3D element matrix from 1D factors, into w.re / w.im. c1 = (c1re, c1im), c2 = (c2re, c2im).
 * The yz products are formed once, so the cost is O(n⁶) multiply-adds of a few flops each.
 */
export function kroneckerElement(X: Matrix1D, Y: Matrix1D, Z: Matrix1D, c1re: number, c1im: number, c2re: number, c2im: number, w: ElementWork): void {
  const n = X.n, nn = n * n, n3 = w.n3;
  const { mmRe, mmIm, kmRe, kmIm } = w;
  for (let c = 0; c < n; c++) for (let b = 0; b < n; b++) {
    const row = (b + n * c) * nn;
    for (let c2 = 0; c2 < n; c2++) {
      const zc = c * n + c2, mzr = Z.mRe[zc], mzi = Z.mIm[zc], kzr = Z.kRe[zc], kzi = Z.kIm[zc];
      for (let b2 = 0; b2 < n; b2++) {
        const yb = b * n + b2, myr = Y.mRe[yb], myi = Y.mIm[yb], kyr = Y.kRe[yb], kyi = Y.kIm[yb];
        const col = row + b2 + n * c2;
        mmRe[col] = myr * mzr - myi * mzi;
        mmIm[col] = myr * mzi + myi * mzr;
        kmRe[col] = kyr * mzr - kyi * mzi + myr * kzr - myi * kzi;
        kmIm[col] = kyr * mzi + kyi * mzr + myr * kzi + myi * kzr;
      }
    }
  }
  // A[(a,β),(a',β')] = c1·(Kx[aa']·MM[ββ'] + Mx[aa']·KM[ββ']) − c2·Mx[aa']·MM[ββ'],  β = b + n c.
  for (let a = 0; a < n; a++) for (let a2 = 0; a2 < n; a2++) {
    const xa = a * n + a2;
    const kxr = X.kRe[xa], kxi = X.kIm[xa], mxr = X.mRe[xa], mxi = X.mIm[xa];
    // fold the coefficients into the x factors once per (a, a')
    const pr = c1re * kxr - c1im * kxi, pi = c1re * kxi + c1im * kxr; // c1·Kx
    const qr = c1re * mxr - c1im * mxi, qi = c1re * mxi + c1im * mxr; // c1·Mx
    const rr = c2re * mxr - c2im * mxi, ri = c2re * mxi + c2im * mxr; // c2·Mx
    const ur = pr - rr, ui = pi - ri; // (c1·Kx − c2·Mx) multiplies MM
    for (let beta = 0; beta < nn; beta++) {
      const I = a + n * beta, rowOff = I * n3;
      for (let beta2 = 0; beta2 < nn; beta2++) {
        const k = beta * nn + beta2, J = a2 + n * beta2;
        const m_r = mmRe[k], m_i = mmIm[k], k_r = kmRe[k], k_i = kmIm[k];
        w.re[rowOff + J] = ur * m_r - ui * m_i + qr * k_r - qi * k_i;
        w.im[rowOff + J] = ur * m_i + ui * m_r + qr * k_i + qi * k_r;
      }
    }
  }
}

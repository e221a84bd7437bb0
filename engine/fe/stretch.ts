/**
 * The complex coordinate stretch of one axis over one element, and the 1D rule that integrates it.
 * Along a stretched axis x̃ = ∫ s dx, so ∂/∂x̃ = (1/s)∂/∂x and dx̃ = s dx (Chew & Weedon,
 * Microwave Opt. Technol. Lett. 7, 1994). Because s depends on that axis alone, the 3D integrand
 * separates and every element matrix stays a Kronecker product of 1D factors.
 *
 * - none:     s = 1, full (p+1)-point Gauss–Legendre rule.
 * - constant: s constant over the element; `reduced` selects the p-point Gauss–Legendre rule along
 *             this axis (the discrete-layer variant: Guddati & Lim, IJNME 66, 2006, for p = 1;
 *             arXiv:2308.12255 for p ≥ 1), otherwise the full rule.
 * - smooth:   s(d) = 1 + (α − jβ)(d/D)^m at depth d into a layer of depth D (Bérenger, J. Comput.
 *             Phys. 114, 1994, with a real part for evanescent waves), full rule.
 */
import { gaussLegendre, type Rule } from './quadrature.ts';
import type { Complex } from '../core/complex.ts';

export type AxisStretch =
  | { kind: 'none' }
  | { kind: 'constant'; re: number; im: number; reduced: boolean }
  | { kind: 'smooth'; origin: number; direction: 1 | -1; depth: number; power: number; alpha: number; beta: number };

export const NO_STRETCH: AxisStretch = { kind: 'none' };

export function ruleFor(st: AxisStretch, p: number): Rule {
  return st.kind === 'constant' && st.reduced ? gaussLegendre(p) : gaussLegendre(p + 1);
}

/** s at physical coordinate x, written into out[0] (re), out[1] (im). */
export function stretchAt(st: AxisStretch, x: number, out: Float64Array): void {
  if (st.kind === 'none') {
    out[0] = 1;
    out[1] = 0;
  } else if (st.kind === 'constant') {
    out[0] = st.re;
    out[1] = st.im;
  } else {
    const d = Math.max(0, (x - st.origin) * st.direction) / st.depth;
    const g = Math.pow(d, st.power);
    out[0] = 1 + st.alpha * g;
    out[1] = -st.beta * g;
  }
}

/** ∫ s dx over [x0, x1]: the complex length the element contributes along this axis. */
export function complexLength(st: AxisStretch, x0: number, x1: number): Complex {
  const rule = gaussLegendre(8), s = new Float64Array(2);
  let re = 0, im = 0;
  const half = 0.5 * (x1 - x0), mid = 0.5 * (x0 + x1);
  for (let q = 0; q < rule.points.length; q++) {
    stretchAt(st, mid + half * rule.points[q], s);
    re += rule.weights[q] * half * s[0];
    im += rule.weights[q] * half * s[1];
  }
  return { re, im };
}

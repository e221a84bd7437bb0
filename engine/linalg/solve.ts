/**
 * Triangular solves with the supernodal LDLᵀ factor: x = Pᵀ L⁻ᵀ D⁻¹ L⁻¹ P b, with Lᵀ the plain
 * transpose (A is complex symmetric, not Hermitian), and iterative refinement in working precision,
 * which restores a small backward error after perturbed pivots or moderate element growth (Skeel, "Iterative refinement
 * implies numerical stability for Gaussian elimination", Math. Comp. 35(151):817–832, 1980;
 * Li & Demmel, Proc. SC98, 1998).
 */
import { multiply, norm2, type ComplexCsr, type ComplexVector } from './sparse.ts';
import type { Numeric } from './factor.ts';
import { SingularSystemError } from './errors.ts';

/** A solution whose relative residual stays above this after refinement is refused. */
export const REFINED_RESIDUAL_LIMIT = 1e-8;
/** solve() refines when the first residual is above this, or when pivots were perturbed. */
const REFINE_ABOVE = 1e-12;
const AUTOMATIC_REFINEMENT_STEPS = 10;
const CONVERGED = 1e-15;

/**
 * Solves A x = b with the factor of A. The residual is always checked (one product with A): when it
 * is not near round-off, or pivots were perturbed, the solution is refined; if it still cannot reach
 * REFINED_RESIDUAL_LIMIT the system is singular to working precision and SingularSystemError is thrown.
 * (LDLᵀ without pivoting loses accuracy through element growth after a tiny pivot; the residual is
 * the one honest witness of that.)
 */
export function solve(N: Numeric, b: ComplexVector): ComplexVector {
  return refine(N.matrix, N, b, N.perturbed > 0 ? AUTOMATIC_REFINEMENT_STEPS : 0, AUTOMATIC_REFINEMENT_STEPS);
}

/** One solve per right-hand side, sharing the factor. */
export function solveMany(N: Numeric, bs: readonly ComplexVector[]): ComplexVector[] {
  return bs.map((b) => solve(N, b));
}

/**
 * At least `steps` rounds of x ← x + A⁻¹(b − A x) with the factor (more, up to 10, while the residual
 * is above 1e-12), stopping early once the residual stops decreasing or reaches round-off. Throws SingularSystemError if it ends above REFINED_RESIDUAL_LIMIT.
 */
export function solveRefined(A: ComplexCsr, N: Numeric, b: ComplexVector, steps = 1): ComplexVector {
  return refine(A, N, b, steps, Math.max(steps, AUTOMATIC_REFINEMENT_STEPS));
}

function refine(A: ComplexCsr, N: Numeric, b: ComplexVector, steps: number, maxSteps: number): ComplexVector {
  const n = A.n;
  if (b.re.length !== n || b.im.length !== n) throw new RangeError(`solve: right-hand side has length ${b.re.length}, expected ${n}`);
  for (let i = 0; i < n; i++) {
    if (b.re[i] - b.re[i] !== 0 || b.im[i] - b.im[i] !== 0) throw new RangeError(`solve: right-hand side entry ${i} is not finite`);
  }
  const nb = norm2(b) || 1;
  let x = solveOnce(N, b);
  const r = { re: new Float64Array(n), im: new Float64Array(n) };
  let res = residual(A, x, b, r) / nb;
  for (let step = 0; step < maxSteps && res > CONVERGED; step++) {
    if (step >= steps && res <= REFINE_ABOVE) break;
    const dx = solveOnce(N, r);
    const y = { re: x.re.slice(), im: x.im.slice() };
    for (let i = 0; i < n; i++) {
      y.re[i] += dx.re[i];
      y.im[i] += dx.im[i];
    }
    const resY = residual(A, y, b, r) / nb;
    if (!(resY < res)) break; // stagnation: keep the better iterate
    x = y;
    res = resY; // r now holds b − A x for the next round
  }
  if (!(res <= REFINED_RESIDUAL_LIMIT)) throw unsolvable(N, res);
  return x;
}

function unsolvable(N: Numeric, res: number): SingularSystemError {
  const p = N.smallestPivot ?? { permuted: -1, original: -1, magnitude: NaN, scale: NaN };
  const perturbed = N.perturbed > 0 ? `${N.perturbed} perturbed pivot(s); ` : '';
  return new SingularSystemError(
    { permuted: p.permuted, original: p.original }, p.magnitude, p.scale,
    `${perturbed}refinement leaves a relative residual of ${res.toExponential(2)}`,
  );
}

/** r = b − A x; returns ‖r‖. */
function residual(A: ComplexCsr, x: ComplexVector, b: ComplexVector, r: ComplexVector): number {
  multiply(A, x, r);
  for (let i = 0; i < A.n; i++) {
    r.re[i] = b.re[i] - r.re[i];
    r.im[i] = b.im[i] - r.im[i];
  }
  return norm2(r);
}

function solveOnce(N: Numeric, b: ComplexVector): ComplexVector {
  const S = N.symbolic;
  const n = S.n;
  if (N.generation !== N.workspace.generation) throw new RangeError('solve: this factor was overwritten by a later factor() in the same workspace');
  if (b.re.length !== n || b.im.length !== n) throw new RangeError(`solve: right-hand side has length ${b.re.length}, expected ${n}`);
  const xr = new Float64Array(n), xi = new Float64Array(n);
  for (let k = 0; k < n; k++) {
    xr[k] = b.re[S.perm[k]];
    xi[k] = b.im[S.perm[k]];
  }
  forward(N, xr, xi);
  const { invRe, invIm } = N.diagonal;
  for (let k = 0; k < n; k++) {
    const ar = xr[k], ai = xi[k];
    xr[k] = ar * invRe[k] - ai * invIm[k];
    xi[k] = ar * invIm[k] + ai * invRe[k];
  }
  backward(N, xr, xi);
  const out = { re: new Float64Array(n), im: new Float64Array(n) };
  for (let k = 0; k < n; k++) {
    out.re[S.perm[k]] = xr[k];
    out.im[S.perm[k]] = xi[k];
  }
  return out;
}

/** L y = b, supernode by supernode: the unit diagonal block, then the rows below it. */
function forward(N: Numeric, xr: Float64Array, xi: Float64Array): void {
  const { superStart, rowPtr, rowIdx, panelPtr, nSuper } = N.symbolic;
  const P = N.panels;
  for (let s = 0; s < nSuper; s++) {
    const first = superStart[s], ns = superStart[s + 1] - first;
    const off = 2 * panelPtr[s];
    for (let k = 1; k < ns; k++) {
      const rk = off + 2 * k * ns;
      let sr = xr[first + k], si = xi[first + k];
      for (let t = 0; t < k; t++) {
        const lr = P[rk + 2 * t], li = P[rk + 2 * t + 1], yr = xr[first + t], yi = xi[first + t];
        sr -= lr * yr - li * yi;
        si -= lr * yi + li * yr;
      }
      xr[first + k] = sr;
      xi[first + k] = si;
    }
    const r0 = rowPtr[s], m = rowPtr[s + 1] - r0;
    for (let a = 0; a < m; a++) {
      const ra = off + 2 * (ns + a) * ns;
      let sr = 0, si = 0;
      for (let t = 0; t < ns; t++) {
        const lr = P[ra + 2 * t], li = P[ra + 2 * t + 1], yr = xr[first + t], yi = xi[first + t];
        sr += lr * yr - li * yi;
        si += lr * yi + li * yr;
      }
      const row = rowIdx[r0 + a];
      xr[row] -= sr;
      xi[row] -= si;
    }
  }
}

/** Lᵀ x = y, supernodes in reverse: subtract the rows below, then the transposed diagonal block. */
function backward(N: Numeric, xr: Float64Array, xi: Float64Array): void {
  const { superStart, rowPtr, rowIdx, panelPtr, nSuper } = N.symbolic;
  const P = N.panels;
  for (let s = nSuper - 1; s >= 0; s--) {
    const first = superStart[s], ns = superStart[s + 1] - first;
    const off = 2 * panelPtr[s];
    const r0 = rowPtr[s], m = rowPtr[s + 1] - r0;
    for (let a = 0; a < m; a++) {
      const ra = off + 2 * (ns + a) * ns;
      const row = rowIdx[r0 + a];
      const yr = xr[row], yi = xi[row];
      for (let t = 0; t < ns; t++) {
        const lr = P[ra + 2 * t], li = P[ra + 2 * t + 1];
        xr[first + t] -= lr * yr - li * yi;
        xi[first + t] -= lr * yi + li * yr;
      }
    }
    for (let i = ns - 1; i > 0; i--) {
      const ri = off + 2 * i * ns;
      const yr = xr[first + i], yi = xi[first + i];
      for (let t = 0; t < i; t++) {
        const lr = P[ri + 2 * t], li = P[ri + 2 * t + 1];
        xr[first + t] -= lr * yr - li * yi;
        xi[first + t] -= lr * yi + li * yr;
      }
    }
  }
}

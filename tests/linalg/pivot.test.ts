import { describe, expect, it } from 'vitest';
import {
  analyze, factor, identityPermutation, latticeDissection, NonFiniteMatrixError, relativeResidual, SingularSystemError, solve,
} from '../../engine/linalg/index.ts';
import { multiply, norm2, type ComplexCsr } from '../../engine/linalg/sparse.ts';
import { csrFromTriplets, latticeHelmholtz, randomVector } from './problems.ts';

/** Runs factor and solve; returns the error thrown, or the solution's residual. */
function attempt(A: ComplexCsr, perm?: Int32Array): { error: unknown; residual: number } {
  const b = randomVector(A.n, 3);
  try {
    const x = solve(factor(A, analyze(A, perm)), b);
    return { error: null, residual: relativeResidual(A, x, b) };
  } catch (error) {
    return { error, residual: NaN };
  }
}

/**
 * Generalized eigenvalue of the Neumann problem K v = λ M v for linear elements on N uniform
 * intervals of length h, mode m: λ = (6/h²)(1 − cos θ)/(2 + cos θ), θ = mπ/N, with v_i = cos(iθ)
 * (substituting v into the interior and both boundary rows of K = [−1 2 −1]/h, M = h/6 [1 4 1]).
 */
function neumannEigenvalue1d(m: number, N: number, h: number): number {
  const c = Math.cos((m * Math.PI) / N);
  return (6 / (h * h)) * ((1 - c) / (2 + c));
}

describe('pivot guard', () => {
  it('throws SingularSystemError for the Neumann Laplacian (zero shift), never a silent answer', () => {
    for (const order of [1, 2] as const) {
      const P = latticeHelmholtz({ elements: [6, 5, 4], order, k2: { re: 0, im: 0 } });
      for (const perm of [undefined, latticeDissection(P.lattice, P.ndofs), identityPermutation(P.ndofs)]) {
        const { error } = attempt(P.A, perm);
        // common practice: constants span the null space of the Neumann Laplacian, so K is singular
        expect(error).toBeInstanceOf(SingularSystemError);
      }
    }
  });

  it('throws on an exactly zero pivot, naming it and its original row', () => {
    // rows 0 and 1 equal: [[1, 1], [1, 1]] ⊕ [2]; eliminating 0 leaves exactly 0 at 1
    const A = csrFromTriplets(3, [0, 0, 1, 1, 2], [0, 1, 0, 1, 2], [1, 1, 1, 1, 2], [0, 0, 0, 0, 0]);
    const perm = Int32Array.from([2, 0, 1]);
    let caught: unknown = null;
    try {
      factor(A, analyze(A, perm));
    } catch (e) {
      caught = e;
    }
    // common practice: the Schur complement 1 − 1·1⁻¹·1 is exactly zero
    expect(caught).toBeInstanceOf(SingularSystemError);
    const e = caught as SingularSystemError;
    expect(e.magnitude).toBe(0);
    expect(e.scale).toBe(1);
    expect([0, 1]).toContain(e.pivot.original);
    expect(e.message).toMatch(/^the matrix is singular or nearly so \(pivot \d+ = row \d+ of size 0\.000e\+0 against 1\.000e\+0\)/);
  });

  it('near a resonance of a closed lossless box: throws, or refines to a residual below 1e-8', () => {
    const [ex, ey, ez] = [8, 5, 4], h = 0.1;
    const lambda = neumannEigenvalue1d(1, ex, h); // mode (1, 0, 0): λx + λy(0) + λz(0)
    const P0 = latticeHelmholtz({ elements: [ex, ey, ez], h, k2: { re: 0, im: 0 } });
    // check the closed form on the assembled K and M: residual of K v − λ M v for v = cos(π i/ex)
    const v = { re: new Float64Array(P0.ndofs), im: new Float64Array(P0.ndofs) };
    for (let l = 0; l < P0.lattice.dofOf.length; l++) v.re[P0.lattice.dofOf[l]] = Math.cos((Math.PI * (l % (ex + 1))) / ex);
    const Pl = latticeHelmholtz({ elements: [ex, ey, ez], h, k2: { re: lambda, im: 0 } });
    // derivation in neumannEigenvalue1d's comment: (K − λM) v = 0 up to round-off, relative to K v
    expect(norm2(multiply(Pl.A, v)) / norm2(multiply(Pl.K, v))).toBeLessThan(1e-12);
    const threw: boolean[] = [];
    for (const distance of [1e-6, 1e-10, 1e-13, 0]) {
      const P = latticeHelmholtz({ elements: [ex, ey, ez], h, k2: { re: lambda * (1 + distance), im: 0 } });
      const { error, residual } = attempt(P.A, latticeDissection(P.lattice, P.ndofs));
      threw.push(error !== null);
      if (error === null) {
        // Skeel, Math. Comp. 35 (1980): refinement restores a small backward error
        expect(residual).toBeLessThan(1e-8);
      } else {
        // common practice: a matrix singular to working precision is reported, not solved
        expect(error).toBeInstanceOf(SingularSystemError);
      }
    }
    // common practice: 1e-6 away from the eigenvalue is an ordinary solve; on it, singular in floating point
    expect(threw[0]).toBe(false);
    expect(threw[3]).toBe(true);
  });

  it('perturbs a tiny pivot of a well-conditioned matrix and refines it back', () => {
    // [[1e-20, 1], [1, 1]] in this order: the first pivot is tiny though the matrix is not singular
    const A = csrFromTriplets(2, [0, 0, 1, 1], [0, 1, 0, 1], [1e-20, 1, 1, 1], [0, 0, 0, 0]);
    const N = factor(A, analyze(A, identityPermutation(2)));
    // Li & Demmel, Proc. SC98 (1998): tiny pivots replaced, then iterative refinement
    expect(N.perturbed).toBe(1);
    expect(N.smallestPivot!.magnitude).toBe(1e-20);
    const b = { re: Float64Array.from([1, 2]), im: Float64Array.from([0.5, -1]) };
    expect(relativeResidual(A, solve(N, b), b)).toBeLessThan(1e-12);
  });

  it('throws when too many pivots need perturbing', () => {
    const I: number[] = [], J: number[] = [], R: number[] = [];
    for (let t = 0; t < 20; t++) {
      I.push(2 * t, 2 * t, 2 * t + 1, 2 * t + 1);
      J.push(2 * t, 2 * t + 1, 2 * t, 2 * t + 1);
      R.push(1e-20, 1, 1, 1);
    }
    const A = csrFromTriplets(40, I, J, R, R.map(() => 0));
    const S = analyze(A, identityPermutation(40));
    // common practice: a static-pivoting budget; beyond it the factor is not trusted
    expect(() => factor(A, S, { maxPerturbed: 5 })).toThrow(SingularSystemError);
    expect(factor(A, S, { maxPerturbed: 20 }).perturbed).toBe(20);
  });

  it('refuses NaN and Infinity in the matrix', () => {
    for (const bad of [NaN, Infinity, -Infinity]) {
      const A = csrFromTriplets(3, [0, 1, 2, 1, 2], [0, 1, 2, 2, 1], [1, 1, 1, 0.5, 0.5], [0, 0, 0, 0, 0]);
      A.re[A.rowPtr[2] - 1] = bad; // entry (1, 2)
      // common practice: non-finite entries are an assembly failure, not a pivot problem
      expect(() => factor(A, analyze(A))).toThrow(NonFiniteMatrixError);
    }
  });
});

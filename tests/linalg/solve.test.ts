import { describe, expect, it } from 'vitest';
import { Matrix, solve as denseSolve } from 'ml-matrix';
import { analyze, factor, FactorWorkspace, relativeResidual, solve, solveMany, solveRefined } from '../../engine/linalg/index.ts';
import type { ComplexCsr, ComplexVector } from '../../engine/linalg/sparse.ts';
import { csrFromTriplets, randomSymmetric, randomVector, rng } from './problems.ts';

/** Random symmetric matrix whose couplings stay within `width` of the diagonal plus a few long ones: sparse fill at any size. */
function localRandomSymmetric(n: number, width: number, seed: number): ComplexCsr {
  const r = rng(seed);
  const I: number[] = [], J: number[] = [], R: number[] = [], M: number[] = [];
  const sum = new Float64Array(n);
  const add = (i: number, j: number): void => {
    const vr = 2 * r() - 1, vi = 2 * r() - 1;
    I.push(i, j); J.push(j, i); R.push(vr, vr); M.push(vi, vi);
    sum[i] += Math.hypot(vr, vi);
    sum[j] += Math.hypot(vr, vi);
  };
  for (let i = 0; i < n; i++) {
    for (let t = 0; t < 3; t++) {
      const j = i + 1 + Math.floor(r() * width);
      if (j < n) add(i, j);
    }
    if (r() < 0.01) add(i, Math.floor(r() * n));
  }
  for (let i = 0; i < n; i++) {
    I.push(i); J.push(i); R.push((r() < 0.5 ? -1 : 1) * (sum[i] + 1)); M.push(0.2 * (2 * r() - 1));
  }
  return csrFromTriplets(n, I, J, R, M);
}

/** x from the real 2n × 2n embedding [[Ar, −Ai], [Ai, Ar]] [xr; xi] = [br; bi] solved densely. */
function denseReference(A: ComplexCsr, b: ComplexVector): ComplexVector {
  const n = A.n;
  const E = Matrix.zeros(2 * n, 2 * n);
  for (let i = 0; i < n; i++) {
    for (let k = A.rowPtr[i]; k < A.rowPtr[i + 1]; k++) {
      const j = A.colIdx[k];
      E.set(i, j, A.re[k]);
      E.set(i, n + j, -A.im[k]);
      E.set(n + i, j, A.im[k]);
      E.set(n + i, n + j, A.re[k]);
    }
  }
  const rhs = Matrix.columnVector([...b.re, ...b.im]);
  const x = denseSolve(E, rhs).to1DArray();
  return { re: Float64Array.from(x.slice(0, n)), im: Float64Array.from(x.slice(n)) };
}

describe('factor and solve', () => {
  it('solves random complex symmetric indefinite systems to a residual below 1e-10', () => {
    for (const [n, degree] of [[1, 0], [2, 1], [10, 3], [100, 4], [1000, 4]] as const) {
      const A = randomSymmetric(n, degree, 31 * n + degree);
      const N = factor(A, analyze(A));
      const b = randomVector(n, n);
      // common practice: a backward-stable direct solve leaves a residual near round-off
      expect(relativeResidual(A, solve(N, b), b)).toBeLessThan(1e-10);
      expect(N.perturbed).toBe(0);
    }
    for (const n of [5000, 30000]) {
      const A = localRandomSymmetric(n, 40, n);
      const b = randomVector(n, n + 1);
      // common practice
      expect(relativeResidual(A, solve(factor(A, analyze(A)), b), b)).toBeLessThan(1e-10);
    }
  });

  it('agrees with a dense solve of the real 2n × 2n embedding', () => {
    const A = randomSymmetric(40, 5, 77);
    const b = randomVector(40, 78);
    const x = solve(factor(A, analyze(A)), b);
    const ref = denseReference(A, b);
    let err = 0, size = 0;
    for (let i = 0; i < A.n; i++) {
      err = Math.max(err, Math.hypot(x.re[i] - ref.re[i], x.im[i] - ref.im[i]));
      size = Math.max(size, Math.hypot(ref.re[i], ref.im[i]));
    }
    // common practice: (Ar + iAi)(xr + ixi) = b is the real system [[Ar, −Ai], [Ai, Ar]]
    expect(err / size).toBeLessThan(1e-10);
  });

  it('reuses one Symbolic for matrices of the same pattern with other values', () => {
    const A1 = localRandomSymmetric(3000, 30, 5);
    // other values, still symmetric and diagonally dominant: off-diagonals scaled by a symmetric factor in (0, 1]
    const A2: ComplexCsr = { ...A1, re: A1.re.slice(), im: A1.im.slice() };
    for (let i = 0; i < A1.n; i++) {
      for (let k = A1.rowPtr[i]; k < A1.rowPtr[i + 1]; k++) {
        const j = A1.colIdx[k];
        const f = i === j ? 1.5 : 0.5 + 0.5 * Math.abs(Math.sin(i + j));
        A2.re[k] *= f;
        A2.im[k] = i === j ? A2.im[k] - 0.3 : A2.im[k] * f;
      }
    }
    const S = analyze(A1);
    const b = randomVector(A1.n, 6);
    for (const A of [A1, A2]) {
      // common practice: the symbolic phase depends on the pattern only
      expect(relativeResidual(A, solve(factor(A, S), b), b)).toBeLessThan(1e-10);
    }
    const other = randomSymmetric(3000, 3, 1);
    expect(() => factor(other, S)).toThrow(RangeError);
  });

  it('factors in a kept workspace exactly as in fresh memory, and refuses a factor the workspace has since overwritten', () => {
    const A1 = localRandomSymmetric(3000, 30, 5);
    const A2: ComplexCsr = { ...A1, re: A1.re.map((v, k) => v * (1 + 0.1 * Math.sin(k))), im: A1.im.map((v) => v - 0.2) };
    const S = analyze(A1), ws = new FactorWorkspace(S), b = randomVector(A1.n, 8);
    const N1 = factor(A1, S, {}, ws), x1 = solve(N1, b);
    const N2 = factor(A2, S, {}, ws), x2 = solve(N2, b);
    // common practice: the same arithmetic in the same order gives the same bits, whatever the memory held before
    expect([Array.from(x1.re), Array.from(x1.im)]).toEqual([Array.from(solve(factor(A1, S), b).re), Array.from(solve(factor(A1, S), b).im)]);
    expect([Array.from(x2.re), Array.from(x2.im)]).toEqual([Array.from(solve(factor(A2, S), b).re), Array.from(solve(factor(A2, S), b).im)]);
    expect(() => solve(N1, b)).toThrow(/overwritten/);
    expect(() => factor(A1, analyze(A1), {}, ws)).toThrow(/another analysis/);
  });

  it('solves several right-hand sides and refines without harm', () => {
    const A = localRandomSymmetric(2000, 25, 9);
    const N = factor(A, analyze(A));
    const bs = [randomVector(A.n, 1), randomVector(A.n, 2), randomVector(A.n, 3)];
    const xs = solveMany(N, bs);
    for (let t = 0; t < bs.length; t++) {
      // common practice
      expect(relativeResidual(A, xs[t], bs[t])).toBeLessThan(1e-10);
      expect(relativeResidual(A, solveRefined(A, N, bs[t], 2), bs[t])).toBeLessThan(1e-12);
    }
    expect(() => solve(N, randomVector(A.n - 1, 4))).toThrow(RangeError);
  });

  it('solves with the plain transpose: a complex symmetric matrix that is not Hermitian', () => {
    // A = [[2+i, 1−2i], [1−2i, −1+3i]], x = [1, i] → b = A x
    const A = csrFromTriplets(2, [0, 0, 1, 1], [0, 1, 0, 1], [2, 1, 1, -1], [1, -2, -2, 3]);
    const b = { re: Float64Array.from([2 + 1 * 2, 1 - 3]), im: Float64Array.from([1 + 1, -2 - 1]) };
    const x = solve(factor(A, analyze(A)), b);
    // common practice: hand computation of A·[1, i]
    expect(Math.hypot(x.re[0] - 1, x.im[0], x.re[1], x.im[1] - 1)).toBeLessThan(1e-14);
  });
});

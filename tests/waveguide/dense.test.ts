/** The waveguide's dense complex eigen-solver and LU against ml-matrix and against their own definitions. */
import { describe, expect, it } from 'vitest';
import { EigenvalueDecomposition, Matrix } from 'ml-matrix';
import { cmatrix, eigenvalues, hessenberg, hessenbergEigenvectors, luFactor, luSolve, matmul, type CMatrix } from '../../engine/waveguide/dense.ts';

function random(n: number, seed: number, complex: boolean): CMatrix {
  let s = seed;
  const r = () => ((s = (s * 16807) % 2147483647) / 2147483647) - 0.5;
  const A = cmatrix(n, n);
  for (let i = 0; i < n * n; i++) { A.re[i] = r(); A.im[i] = complex ? r() : 0; }
  return A;
}

/** max over a of min over b of |a − b|: every eigenvalue of one list found in the other. */
function distance(a: [number, number][], b: [number, number][]): number {
  return Math.max(...a.map((x) => Math.min(...b.map((y) => Math.hypot(x[0] - y[0], x[1] - y[1])))));
}

describe('dense complex eigenvalues (Hessenberg reduction + shifted QR)', () => {
  for (const n of [1, 2, 7, 40, 90]) {
    it(`agree with ml-matrix's real eigen-solver on a random real ${n} × ${n} matrix`, () => {
      const A = random(n, 11 + n, false), M = new Matrix(n, n);
      for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) M.set(i, j, A.re[i * n + j]);
      const ours = eigenvalues(A), ref = new EigenvalueDecomposition(M);
      const a = Array.from(ours.re, (x, i) => [x, ours.im[i]] as [number, number]);
      const b = ref.realEigenvalues.map((x, i) => [x, ref.imaginaryEigenvalues[i]] as [number, number]);
      // common practice: a backward-stable eigen-solver's eigenvalues of a well-conditioned random matrix agree to ~n·ε·‖A‖
      expect(distance(a, b)).toBeLessThan(1e-11);
      expect(distance(b, a)).toBeLessThan(1e-11);
    });
  }

  it('give eigenvectors with H y = λ y to round-off on a complex matrix', () => {
    const n = 60, H = hessenberg(random(n, 5, true)), ev = eigenvalues(H), Y = hessenbergEigenvectors(H, n, ev), HY = matmul(H, Y);
    let worst = 0;
    for (let c = 0; c < n; c++) for (let i = 0; i < n; i++) {
      const yr = Y.re[i * n + c], yi = Y.im[i * n + c], lr = ev.re[c], li = ev.im[c];
      worst = Math.max(worst, Math.hypot(HY.re[i * n + c] - (lr * yr - li * yi), HY.im[i * n + c] - (lr * yi + li * yr)));
    }
    // common practice: inverse iteration on a backward-stable factorisation leaves residuals of order ε‖H‖
    expect(worst).toBeLessThan(1e-12);
  });

  it('give independent eigenvectors for a repeated eigenvalue', () => {
    const n = 5, A = cmatrix(n, n), d = [2, 2, 2, 1, 3];
    for (let i = 0; i < n; i++) A.re[i * n + i] = d[i];
    const ev = eigenvalues(A), Y = hessenbergEigenvectors(A, n, ev), G = new Matrix(n, n);
    for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) {
      let s = 0;
      for (let r = 0; r < n; r++) s += Y.re[r * n + i] * Y.re[r * n + j] + Y.im[r * n + i] * Y.im[r * n + j];
      G.set(i, j, s);
    }
    // common practice: a basis of an eigenspace has a non-singular Gram matrix
    expect(Math.abs(new EigenvalueDecomposition(G).realEigenvalues.reduce((p, x) => p * x, 1))).toBeGreaterThan(1e-6);
  });
});

describe('dense complex LU', () => {
  it('solves A X = B to round-off', () => {
    const n = 50, A = random(n, 3, true), B = random(n, 4, true), X = luSolve(luFactor(A), B), R = matmul(A, X);
    let worst = 0;
    for (let i = 0; i < n * n; i++) worst = Math.max(worst, Math.hypot(R.re[i] - B.re[i], R.im[i] - B.im[i]));
    // common practice: Gaussian elimination with partial pivoting is backward stable
    expect(worst).toBeLessThan(1e-11);
  });
});

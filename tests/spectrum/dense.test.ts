import { describe, expect, it } from 'vitest';
import { EigenvalueDecomposition, Matrix, SingularValueDecomposition } from 'ml-matrix';
import { complexMatrix, rightSingular, triangleOf, type ComplexMatrix } from '../../engine/spectrum/svd.ts';
import { eigenvalues } from '../../engine/spectrum/eigenvalues.ts';
import { seeded } from './helpers.ts';

function randomMatrix(rows: number, cols: number, rnd: () => number, decades = 0): ComplexMatrix {
  const a = complexMatrix(rows, cols);
  for (let j = 0; j < cols; j++) for (let i = 0; i < rows; i++) {
    const s = 10 ** (-(decades * j) / Math.max(cols - 1, 1));
    a.re[i + j * rows] = (rnd() - 0.5) * s;
    a.im[i + j * rows] = (rnd() - 0.5) * s;
  }
  return a;
}

/** The real 2M×2n matrix [Re −Im; Im Re]: its singular values are A's, each twice. */
function realEmbedding(a: ComplexMatrix): Matrix {
  const m = new Matrix(2 * a.rows, 2 * a.cols);
  for (let i = 0; i < a.rows; i++) for (let j = 0; j < a.cols; j++) {
    const re = a.re[i + j * a.rows], im = a.im[i + j * a.rows];
    m.set(i, j, re); m.set(i, j + a.cols, -im);
    m.set(i + a.rows, j, im); m.set(i + a.rows, j + a.cols, re);
  }
  return m;
}

/** ‖A v‖ for column k of V. */
function residualNorm(a: ComplexMatrix, v: ComplexMatrix, k: number): number {
  let s = 0;
  for (let i = 0; i < a.rows; i++) {
    let re = 0, im = 0;
    for (let j = 0; j < a.cols; j++) {
      const ar = a.re[i + j * a.rows], ai = a.im[i + j * a.rows], vr = v.re[j + k * v.rows], vi = v.im[j + k * v.rows];
      re += ar * vr - ai * vi;
      im += ar * vi + ai * vr;
    }
    s += re * re + im * im;
  }
  return Math.sqrt(s);
}

describe('complex singular value decomposition (QR + one-sided Jacobi)', () => {
  it('gives the singular values of the real embedding, and orthonormal right vectors with ‖Av_k‖ = σ_k', () => {
    const rnd = seeded(11);
    for (const [rows, cols, decades] of [[12, 5, 0], [40, 9, 6], [7, 7, 3], [3, 6, 0]]) {
      const a = randomMatrix(rows, cols, rnd, decades);
      const { values, vectors } = rightSingular(a);
      const oracle = new SingularValueDecomposition(realEmbedding(a)).diagonal;
      for (let k = 0; k < cols; k++) {
        // common practice: [Re −Im; Im Re] has each singular value of A twice (Golub & Van Loan, Matrix Computations, 2013, §8.6)
        expect(Math.abs(values[k] - (oracle[2 * k] ?? 0))).toBeLessThan(1e-12 * values[0]);
        expect(Math.abs(residualNorm(a, vectors, k) - values[k])).toBeLessThan(1e-12 * values[0]);
        for (let l = 0; l < cols; l++) {
          let re = 0, im = 0;
          for (let i = 0; i < cols; i++) {
            re += vectors.re[i + k * cols] * vectors.re[i + l * cols] + vectors.im[i + k * cols] * vectors.im[i + l * cols];
            im += vectors.re[i + k * cols] * vectors.im[i + l * cols] - vectors.im[i + k * cols] * vectors.re[i + l * cols];
          }
          expect(Math.hypot(re - (k === l ? 1 : 0), im)).toBeLessThan(1e-12);
        }
      }
    }
  });

  it('finds the null vector of a rank-deficient matrix', () => {
    const rnd = seeded(5);
    const a = randomMatrix(10, 4, rnd);
    // column 3 = column 0 − 2j·column 1: the null vector is (1, −2j, 0, −1)/√6 up to a phase
    for (let i = 0; i < 10; i++) {
      a.re[i + 30] = a.re[i] + 2 * a.im[i + 10];
      a.im[i + 30] = a.im[i] - 2 * a.re[i + 10];
    }
    const { values, vectors } = rightSingular(a);
    expect(values[3]).toBeLessThan(1e-14 * values[0]);
    expect(residualNorm(a, vectors, 3)).toBeLessThan(1e-13 * values[0]);
  });

  it('keeps the triangle of QR: RᴴR = AᴴA', () => {
    const rnd = seeded(3);
    const a = randomMatrix(9, 4, rnd), r = triangleOf(a);
    for (let k = 0; k < 4; k++) for (let l = 0; l < 4; l++) {
      const dot = (m: ComplexMatrix) => {
        let re = 0, im = 0;
        for (let i = 0; i < m.rows; i++) {
          const xr = m.re[i + k * m.rows], xi = m.im[i + k * m.rows], yr = m.re[i + l * m.rows], yi = m.im[i + l * m.rows];
          re += xr * yr + xi * yi;
          im += xr * yi - xi * yr;
        }
        return [re, im];
      };
      const [ar, ai] = dot(a), [rr, ri] = dot(r);
      expect(Math.hypot(ar - rr, ai - ri)).toBeLessThan(1e-13);
    }
  });
});

describe('complex eigenvalues (Hessenberg QR)', () => {
  it('returns the diagonal of a triangular matrix hidden by a unitary similarity', () => {
    const rnd = seeded(17);
    for (const n of [1, 2, 5, 12, 25]) {
      // T upper triangular with known diagonal, Q from the QR of a random matrix: A = Q T Qᴴ
      const t = randomMatrix(n, n, rnd);
      for (let j = 0; j < n; j++) for (let i = j + 1; i < n; i++) { t.re[i + j * n] = 0; t.im[i + j * n] = 0; }
      const diag = Array.from({ length: n }, (_, i) => [t.re[i + i * n], t.im[i + i * n]]);
      const q = unitary(n, rnd);
      const a = multiply(multiply(q, t), adjoint(q));
      const ev = eigenvalues(a);
      for (const [re, im] of diag) {
        let best = Infinity;
        for (let k = 0; k < n; k++) best = Math.min(best, Math.hypot(ev.re[k] - re, ev.im[k] - im));
        // common practice: eigenvalues are invariant under similarity (Golub & Van Loan, Matrix Computations, 2013, §7.1)
        expect(best).toBeLessThan(1e-11);
      }
    }
  });

  it('agrees with ml-matrix on real nonsymmetric matrices (complex pairs included)', () => {
    const rnd = seeded(23);
    for (const n of [3, 8, 15]) {
      const a = complexMatrix(n, n), m = new Matrix(n, n);
      for (let j = 0; j < n; j++) for (let i = 0; i < n; i++) {
        const x = rnd() - 0.5;
        a.re[i + j * n] = x;
        m.set(i, j, x);
      }
      const ev = eigenvalues(a), oracle = new EigenvalueDecomposition(m);
      oracle.realEigenvalues.forEach((re, k) => {
        const im = oracle.imaginaryEigenvalues[k];
        let best = Infinity;
        for (let p = 0; p < n; p++) best = Math.min(best, Math.hypot(ev.re[p] - re, ev.im[p] - im));
        expect(best).toBeLessThan(1e-10);
      });
    }
  });
});

function unitary(n: number, rnd: () => number): ComplexMatrix {
  // Gram–Schmidt on random columns, twice for orthogonality to rounding
  const q = randomMatrix(n, n, rnd);
  for (let pass = 0; pass < 2; pass++) {
    for (let j = 0; j < n; j++) {
      for (let k = 0; k < j; k++) {
        let re = 0, im = 0;
        for (let i = 0; i < n; i++) {
          re += q.re[i + k * n] * q.re[i + j * n] + q.im[i + k * n] * q.im[i + j * n];
          im += q.re[i + k * n] * q.im[i + j * n] - q.im[i + k * n] * q.re[i + j * n];
        }
        for (let i = 0; i < n; i++) {
          q.re[i + j * n] -= re * q.re[i + k * n] - im * q.im[i + k * n];
          q.im[i + j * n] -= re * q.im[i + k * n] + im * q.re[i + k * n];
        }
      }
      let s = 0;
      for (let i = 0; i < n; i++) s += q.re[i + j * n] ** 2 + q.im[i + j * n] ** 2;
      s = Math.sqrt(s);
      for (let i = 0; i < n; i++) { q.re[i + j * n] /= s; q.im[i + j * n] /= s; }
    }
  }
  return q;
}

function multiply(a: ComplexMatrix, b: ComplexMatrix): ComplexMatrix {
  const out = complexMatrix(a.rows, b.cols);
  for (let j = 0; j < b.cols; j++) for (let k = 0; k < a.cols; k++) for (let i = 0; i < a.rows; i++) {
    const ar = a.re[i + k * a.rows], ai = a.im[i + k * a.rows], br = b.re[k + j * b.rows], bi = b.im[k + j * b.rows];
    out.re[i + j * a.rows] += ar * br - ai * bi;
    out.im[i + j * a.rows] += ar * bi + ai * br;
  }
  return out;
}

function adjoint(a: ComplexMatrix): ComplexMatrix {
  const out = complexMatrix(a.cols, a.rows);
  for (let j = 0; j < a.cols; j++) for (let i = 0; i < a.rows; i++) {
    out.re[j + i * a.cols] = a.re[i + j * a.rows];
    out.im[j + i * a.cols] = -a.im[i + j * a.rows];
  }
  return out;
}

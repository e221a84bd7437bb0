import { describe, expect, it } from 'vitest';
import { readMatrixMarket, readMatrixMarketVector, writeMatrixMarket, writeMatrixMarketVector } from '../../engine/linalg/index.ts';
import type { ComplexCsr } from '../../engine/linalg/sparse.ts';
import { randomSymmetric, randomVector } from './problems.ts';

const same = (A: ComplexCsr, B: ComplexCsr): void => {
  expect(B.n).toBe(A.n);
  expect(Array.from(B.rowPtr)).toEqual(Array.from(A.rowPtr));
  expect(Array.from(B.colIdx)).toEqual(Array.from(A.colIdx));
  expect(Array.from(B.re)).toEqual(Array.from(A.re));
  expect(Array.from(B.im)).toEqual(Array.from(A.im));
};

describe('Matrix Market', () => {
  it('round-trips a complex symmetric matrix bit for bit, lower triangle or all entries', () => {
    const A = randomSymmetric(200, 5, 11);
    const text = writeMatrixMarket(A);
    const lines = text.split('\n');
    // Boisvert, Pozo & Remington, NIST IR 5935 (1996): header, then "rows cols entries", then 1-based lower-triangle entries
    expect(lines[0]).toBe('%%MatrixMarket matrix coordinate complex symmetric');
    const [rows, cols, entries] = lines[1].split(' ').map(Number);
    expect([rows, cols]).toEqual([200, 200]);
    expect(entries).toBe((A.rowPtr[200] + 200) / 2);
    for (const line of lines.slice(2, -1)) {
      const [i, j] = line.split(' ').map(Number);
      expect(j).toBeLessThanOrEqual(i);
      expect(j).toBeGreaterThanOrEqual(1);
    }
    same(A, readMatrixMarket(text));
    const general = writeMatrixMarket(A, false);
    // NIST IR 5935 (1996): the general symmetry lists every entry
    expect(general.split('\n')[0]).toBe('%%MatrixMarket matrix coordinate complex general');
    same(A, readMatrixMarket(general));
  });

  it('round-trips a complex vector bit for bit', () => {
    const v = randomVector(50, 3);
    v.re[0] = 1e-300;
    v.im[1] = -123456789.123456789;
    const text = writeMatrixMarketVector(v);
    // NIST IR 5935 (1996): array format, column by column, real and imaginary part per line
    expect(text.split('\n').slice(0, 2)).toEqual(['%%MatrixMarket matrix array complex general', '50 1']);
    const w = readMatrixMarketVector(text);
    expect(Array.from(w.re)).toEqual(Array.from(v.re));
    expect(Array.from(w.im)).toEqual(Array.from(v.im));
  });

  it('reads the real general example of the format description, with comments', () => {
    const text = [
      '%%MatrixMarket matrix coordinate real general',
      '% a 5 × 5 example',
      '  5  5  8',
      '    1     1   1.000e+00',
      '    2     2   1.050e+01',
      '    3     3   1.500e-02',
      '    1     4   6.000e+00',
      '    4     2   2.505e+02',
      '    4     4  -2.800e+02',
      '    4     5   3.332e+01',
      '    5     5   1.200e+01',
    ].join('\n');
    const A = readMatrixMarket(text);
    // from memory: the 5 × 5 example of Boisvert, Pozo & Remington, NIST IR 5935 (1996)
    expect(Array.from(A.rowPtr)).toEqual([0, 2, 3, 4, 7, 8]);
    expect(Array.from(A.colIdx)).toEqual([0, 3, 1, 2, 1, 3, 4, 4]);
    expect(Array.from(A.re)).toEqual([1, 6, 10.5, 0.015, 250.5, -280, 33.32, 12]);
    expect(A.im.every((v) => v === 0)).toBe(true);
  });

  it('expands Hermitian and skew-symmetric files and adds missing diagonal zeros', () => {
    const A = readMatrixMarket('%%MatrixMarket matrix coordinate complex hermitian\n3 3 2\n2 1 1 2\n3 3 4 0\n');
    // NIST IR 5935 (1996): Hermitian files store the lower triangle, a_ji = conj(a_ij)
    expect(Array.from(A.colIdx)).toEqual([0, 1, 0, 1, 2]);
    expect(Array.from(A.im)).toEqual([0, -2, 2, 0, 0]);
    const K = readMatrixMarket('%%MatrixMarket matrix coordinate real skew-symmetric\n2 2 1\n2 1 3\n');
    // NIST IR 5935 (1996): skew-symmetric, a_ji = −a_ij
    expect(Array.from(K.re)).toEqual([0, -3, 3, 0]);
    expect(() => readMatrixMarket('%%MatrixMarket matrix coordinate real general\n2 3 0\n')).toThrow(RangeError);
    expect(() => readMatrixMarket('%%NotMatrixMarket\n')).toThrow(SyntaxError);
  });
});

import { describe, expect, it } from 'vitest';
import {
  analyze, assertPermutation, columnCounts, eliminationTree, identityPermutation, invertPermutation, minimumDegree, postorder,
} from '../../engine/linalg/index.ts';
import { randomPattern, rng } from './problems.ts';
import { bruteForceFill, bruteForceTree, gridPattern } from './oracles.ts';

function shuffled(n: number, seed: number): Int32Array {
  const r = rng(seed);
  const perm = identityPermutation(n);
  for (let i = n - 1; i > 0; i--) {
    const j = Math.floor(r() * (i + 1));
    [perm[i], perm[j]] = [perm[j], perm[i]];
  }
  return perm;
}

const cases = [
  ...[5, 17, 40, 70].flatMap((n) => [1, 3, 6].map((degree) => ({ n, degree, seed: 97 * n + degree }))),
];

describe('elimination tree and column counts', () => {
  it('match a brute-force symbolic elimination on random patterns and orderings', () => {
    for (const { n, degree, seed } of cases) {
      const p = randomPattern(n, degree, seed);
      for (const perm of [identityPermutation(n), shuffled(n, seed), minimumDegree(p)]) {
        const pinv = invertPermutation(perm);
        const parent = eliminationTree(p, perm, pinv);
        const post = postorder(parent);
        const counts = columnCounts(p, perm, pinv, parent, post);
        const ref = bruteForceTree(p, perm);
        // Liu, SIAM J. Matrix Anal. Appl. 11(1) (1990): parent(j) = min{i > j : L_ij ≠ 0}
        expect(Array.from(parent)).toEqual(Array.from(ref.parent));
        // Gilbert, Ng & Peyton, SIAM J. Matrix Anal. Appl. 15(4) (1994): column counts of L without forming it
        expect(Array.from(counts)).toEqual(Array.from(ref.colCount));
        // common practice: a postorder is a permutation with every child before its parent
        assertPermutation(post, n);
        const at = invertPermutation(post);
        for (let j = 0; j < n; j++) if (parent[j] !== -1) expect(at[j]).toBeLessThan(at[parent[j]]);
      }
    }
  });
});

describe('analyze', () => {
  it('keeps the exact fill of its ordering and covers it with its supernodes', () => {
    for (const { n, degree, seed } of [...cases, { n: 125, degree: 0, seed: 5 }]) {
      const p = n === 125 ? gridPattern(5, 5, 5, true) : randomPattern(n, degree, seed);
      const S = analyze(p, shuffled(n, seed + 1));
      assertPermutation(S.perm, n);
      const filled = bruteForceFill(p, S.perm);
      let nnz = 0;
      for (let k = 0; k < n * n; k++) nnz += filled[k];
      // George & Liu, Computer Solution of Large Sparse Positive Definite Systems (1981): postorder and amalgamation keep the fill of the ordering
      expect(S.nnzL).toBe(nnz);
      for (let s = 0; s < S.nSuper; s++) {
        const rows = new Set(Array.from(S.rowIdx.subarray(S.rowPtr[s], S.rowPtr[s + 1])));
        const last = S.superStart[s + 1] - 1;
        for (let j = S.superStart[s]; j <= last; j++) {
          for (let i = last + 1; i < n; i++) {
            // common practice: a supernode's rows hold every nonzero of its columns below its diagonal block
            if (filled[i * n + j]) expect(rows.has(i)).toBe(true);
          }
        }
        const up = S.superParent[s];
        if (up !== -1) expect(S.superStart[up]).toBeGreaterThan(last);
      }
      // common practice: the estimate covers at least the factor itself
      expect(S.memoryBytes).toBeGreaterThanOrEqual(16 * S.storedEntries);
      expect(S.storedEntries).toBeGreaterThanOrEqual(S.nnzL);
    }
  });

  it('refuses an ordering that is not a permutation', () => {
    const p = randomPattern(10, 2, 3);
    expect(() => analyze(p, Int32Array.from([0, 1, 2, 3, 4, 5, 6, 7, 8, 8]))).toThrow(RangeError);
  });
});

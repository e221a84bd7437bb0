import { describe, expect, it } from 'vitest';
import { analyze, assertPermutation, identityPermutation, latticeDissection, minimumDegree } from '../../engine/linalg/index.ts';
import type { SparsePattern } from '../../engine/linalg/sparse.ts';
import { csrFromTriplets, latticeHelmholtz, randomPattern, rng } from './problems.ts';
import { exactMinimumDegree, gridPattern } from './oracles.ts';

const isPermutation = (perm: Int32Array, n: number): boolean => {
  try {
    assertPermutation(perm, n);
    return true;
  } catch {
    return false;
  }
};

describe('minimumDegree', () => {
  it('returns a permutation on random, empty, tiny and disconnected patterns', () => {
    // common practice: an ordering must list every index exactly once
    expect(isPermutation(minimumDegree({ n: 0, rowPtr: new Int32Array(1), colIdx: new Int32Array(0) }), 0)).toBe(true);
    for (const n of [1, 2, 3, 7, 40, 300]) {
      for (const degree of [0, 1, 3, 8]) {
        const p = randomPattern(n, degree, 1000 * n + degree);
        // common practice
        expect(isPermutation(minimumDegree(p), n)).toBe(true);
      }
    }
  });

  it('puts dense rows last and still orders every node', () => {
    const n = 400;
    const I: number[] = [], J: number[] = [];
    for (let i = 0; i + 1 < n; i++) {
      I.push(i, i + 1);
      J.push(i + 1, i);
    }
    for (let i = 0; i < n; i++) {
      if (i === 7) continue; // node 7 couples with all
      I.push(7, i);
      J.push(i, 7);
    }
    const A = csrFromTriplets(n, I, J, I.map(() => 1), I.map(() => 0));
    const perm = minimumDegree(A);
    expect(isPermutation(perm, n)).toBe(true);
    // from memory: Davis, Direct Methods for Sparse Linear Systems (SIAM 2006), ch. 7, orders rows denser than 10√n last
    expect(perm[n - 1]).toBe(7);
  });

  it('fills no more than an exact greedy minimum degree on 2D and 3D grids (within 10 %)', () => {
    for (const [nx, ny, nz, box] of [[30, 30, 1, false], [12, 12, 12, false], [10, 10, 10, true]] as const) {
      const p = gridPattern(nx, ny, nz, box);
      const amd = analyze(p, minimumDegree(p)).nnzL;
      const exact = analyze(p, exactMinimumDegree(p)).nnzL;
      const natural = analyze(p, identityPermutation(p.n)).nnzL;
      // from memory: Amestoy, Davis & Duff, SIAM J. Matrix Anal. Appl. 17(4) (1996) report AMD fill within a few per cent of exact minimum degree
      expect(amd).toBeLessThan(1.1 * exact);
      // common practice: minimum degree beats the band of a lattice numbering
      expect(amd).toBeLessThan(natural);
    }
  });

  it('orders a random sparse pattern with less fill than the identity', () => {
    const p = randomPattern(600, 4, 42);
    // common practice
    expect(analyze(p, minimumDegree(p)).nnzL).toBeLessThan(analyze(p, identityPermutation(p.n)).nnzL);
  });
});

describe('latticeDissection', () => {
  it('orders each dof once on masked order-2 lattices', () => {
    for (const seed of [1, 2, 3]) {
      const r = rng(seed);
      const P = latticeHelmholtz({
        elements: [9, 5, 4], order: 2, k2: { re: 1, im: 0 },
        solid: () => r() < 0.25,
      });
      for (const leaf of ['minimumDegree', 'lattice'] as const) {
        const perm = latticeDissection(P.lattice, P.ndofs, { leaf, leafSize: 16 });
        // common practice
        expect(isPermutation(perm, P.ndofs)).toBe(true);
      }
    }
  });

  it('puts the separator of the first cut last: every later dof lies on one element-boundary plane', () => {
    const P = latticeHelmholtz({ elements: [20, 3, 3], order: 2, k2: { re: 1, im: 0 } });
    const perm = latticeDissection(P.lattice, P.ndofs, { leafSize: 20 });
    const [nx, ny, nz] = P.lattice.dims;
    const xOf = new Int32Array(P.ndofs);
    for (let l = 0; l < nx * ny * nz; l++) if (P.lattice.dofOf[l] >= 0) xOf[P.lattice.dofOf[l]] = l % nx;
    const plane = ny * nz;
    const last = Array.from(perm.subarray(P.ndofs - plane), (d) => xOf[d]);
    // George, SIAM J. Numer. Anal. 10(2) (1973): the top separator is ordered last; cuts lie on element boundaries (x = multiple of p)
    expect(new Set(last).size).toBe(1);
    expect(last[0] % 2).toBe(0);
    expect(Math.abs(last[0] - (nx - 1) / 2)).toBeLessThanOrEqual(2);
  });

  it('rejects a lattice whose dofs are repeated or missing', () => {
    const dofOf = Int32Array.from([0, 1, 1, 2]);
    expect(() => latticeDissection({ dims: [4, 1, 1], step: 1, dofOf }, 3)).toThrow(RangeError);
    expect(() => latticeDissection({ dims: [4, 1, 1], step: 1, dofOf: Int32Array.from([0, 1, -1, 2]) }, 4)).toThrow(RangeError);
  });

  it('fills less than the lattice numbering and than minimum degree on an elongated duct', () => {
    const P = latticeHelmholtz({ elements: [40, 8, 8], k2: { re: 0.5, im: -0.01 } });
    const p: SparsePattern = P.A;
    const nd = analyze(p, latticeDissection(P.lattice, P.ndofs)).nnzL;
    const natural = analyze(p, identityPermutation(P.ndofs)).nnzL;
    const amd = analyze(p, minimumDegree(p)).nnzL;
    // George, SIAM J. Numer. Anal. 10(2) (1973): nested dissection of a regular mesh beats band orderings
    expect(nd).toBeLessThan(natural / 3);
    // common practice: on lattice problems geometric dissection beats local greedy orderings
    expect(nd).toBeLessThan(amd);
  });
});

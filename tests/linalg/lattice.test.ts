import { describe, expect, it } from 'vitest';
import { analyze, factor, identityPermutation, latticeDissection, minimumDegree, relativeResidual, solve } from '../../engine/linalg/index.ts';
import { latticeHelmholtz, randomVector } from './problems.ts';

describe('3D lattice Helmholtz problems', () => {
  it('duct of trilinear hexahedra (27-point coupling), 25 600 unknowns: nested dissection solves it and fills least', () => {
    // K − k²M with a small loss (k² = 150 − 1.5j, kh ≈ 0.24): indefinite, complex symmetric
    const P = latticeHelmholtz({ elements: [99, 15, 15], h: 0.02, k2: { re: 150, im: -1.5 } });
    expect(P.ndofs).toBe(25600);
    const S = analyze(P.A, latticeDissection(P.lattice, P.ndofs));
    const b = randomVector(P.ndofs, 1);
    const N = factor(P.A, S);
    // common practice: a direct solve of a well-posed system leaves a residual near round-off
    expect(relativeResidual(P.A, solve(N, b), b)).toBeLessThan(1e-10);
    expect(N.perturbed).toBe(0);
    const natural = analyze(P.A, identityPermutation(P.ndofs)).nnzL;
    const amd = analyze(P.A, minimumDegree(P.A)).nnzL;
    console.log(`lattice 100×16×16: nnz(L) dissection ${S.nnzL}, minimum degree ${amd}, natural ${natural}; flops ${S.flops.toExponential(2)}`);
    // George, SIAM J. Numer. Anal. 10(2) (1973): nested dissection of a regular mesh fills far less than its band ordering
    expect(S.nnzL).toBeLessThan(natural / 4);
    // common practice: geometric dissection beats minimum degree on lattice meshes
    expect(S.nnzL).toBeLessThan(amd);
  });

  it('masked order-2 duct with a baffle: dissection with masks gives a correct factor', () => {
    // a solid baffle across most of the duct at x elements 14–15, open for y elements 0–1
    const P = latticeHelmholtz({
      elements: [30, 6, 6], order: 2, h: 0.05, k2: { re: 60, im: -0.6 },
      solid: (ex, ey) => (ex === 14 || ex === 15) && ey >= 2,
    });
    for (const leaf of ['minimumDegree', 'lattice'] as const) {
      const S = analyze(P.A, latticeDissection(P.lattice, P.ndofs, { leaf }));
      const b = randomVector(P.ndofs, 2);
      // common practice
      expect(relativeResidual(P.A, solve(factor(P.A, S), b), b)).toBeLessThan(1e-10);
    }
  });
});

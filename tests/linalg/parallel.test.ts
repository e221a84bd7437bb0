import { afterAll, describe, expect, it } from 'vitest';
import { analyze, factor, FactorWorkspace, latticeDissection, NonFiniteMatrixError, planParallel, relativeResidual, solve, SingularSystemError } from '../../engine/linalg/index.ts';
import { nodeFactorThreads } from '../../engine/node/factorThreads.ts';
import { latticeHelmholtz, randomVector } from './problems.ts';

const open: FactorWorkspace[] = [];
afterAll(() => { for (const w of open) w.close(); });

function threaded(S: ReturnType<typeof analyze>, helpers: number): FactorWorkspace {
  const w = new FactorWorkspace(S, { threads: nodeFactorThreads(helpers) });
  open.push(w);
  return w;
}

describe('the parallel plan', () => {
  it('gives every front to one thread or to the top part, whole subtrees to threads, children before parents', () => {
    const P = latticeHelmholtz({ elements: [30, 4, 3], order: 2, h: 0.1, k2: { re: 40, im: -0.4 } });
    const S = analyze(P.A, latticeDissection(P.lattice, P.ndofs));
    for (const threads of [1, 2, 3]) {
      const plan = planParallel(S, threads);
      const where = new Int32Array(S.nSuper).fill(-2);
      plan.lists.forEach((l, t) => l.forEach((s) => { expect(where[s]).toBe(-2); where[s] = t; }));
      plan.top.forEach((s) => { expect(where[s]).toBe(-2); where[s] = -1; });
      // common practice: a partition of the fronts
      expect(where.every((t) => t >= -1)).toBe(true);
      for (let s = 0; s < S.nSuper; s++) {
        const p = S.superParent[s];
        // a thread's front has its parent on the same thread or in the top part; the top part's children are anywhere
        if (p !== -1 && where[s] >= 0) expect([where[s], -1]).toContain(where[p]);
        if (p !== -1 && where[p] >= 0) expect(where[s]).toBe(where[p]);
      }
      for (const l of [...plan.lists, plan.top]) for (let k = 1; k < l.length; k++) expect(l[k]).toBeGreaterThan(l[k - 1]);
      const total = plan.work.reduce((a, w) => a + w, 0) + plan.topWork;
      // common practice: a long duct's tree has two heavy, nearly equal halves; the estimated time (fullest thread, then the top part) nears total / threads
      if (threads === 2) expect(Math.max(...plan.work) + plan.topWork).toBeLessThan((1.25 * total) / threads);
    }
  });
});

describe('one factorisation on two threads', () => {
  it('gives the same bits as on one thread, several times in the same workspace', () => {
    const P = latticeHelmholtz({ elements: [24, 4, 3], order: 2, h: 0.1, k2: { re: 40, im: -0.4 } });
    const S = analyze(P.A, latticeDissection(P.lattice, P.ndofs));
    const one = factor(P.A, S), ws = threaded(S, 1), b = randomVector(P.ndofs, 4);
    for (let round = 0; round < 3; round++) {
      const two = factor(P.A, S, {}, ws);
      // common practice: the same arithmetic in the same order on each front, whichever thread did it
      expect(Buffer.from(two.panels.buffer, two.panels.byteOffset, two.panels.byteLength).equals(Buffer.from(one.panels.buffer, one.panels.byteOffset, one.panels.byteLength))).toBe(true);
      expect(Array.from(two.diagonal.dRe)).toEqual(Array.from(one.diagonal.dRe));
      // common practice
      expect(relativeResidual(P.A, solve(two, b), b)).toBeLessThan(1e-12);
    }
  });

  it('reports a zero pivot or a non-finite entry met by the helper thread as the single-thread factor does', () => {
    const P = latticeHelmholtz({ elements: [16, 3, 3], order: 1, h: 0.1, k2: { re: 40, im: -0.4 } });
    const S = analyze(P.A, latticeDissection(P.lattice, P.ndofs));
    const leaf = planParallel(S, 2).lists[1][0], j = S.superStart[leaf], row = S.perm[j];
    const diag = (() => { for (let k = P.A.rowPtr[row]; k < P.A.rowPtr[row + 1]; k++) if (P.A.colIdx[k] === row) return k; throw new Error('no diagonal'); })();
    const zero = { ...P.A, re: P.A.re.slice(), im: P.A.im.slice() };
    zero.re[diag] = 0;
    zero.im[diag] = 0;
    const errors = [factor, (A: typeof zero) => factor(A, S, {}, threaded(S, 1))].map((f) => {
      try {
        f(zero, S);
        return null;
      } catch (e) {
        return e as SingularSystemError;
      }
    });
    // common practice: the first pivot of a leaf front is its diagonal entry, here exactly zero
    expect(errors[1]).toBeInstanceOf(SingularSystemError);
    expect(errors[1]!.message).toBe(errors[0]!.message);
    expect(errors[1]!.pivot).toEqual({ permuted: j, original: row });
    const nan = { ...P.A, re: P.A.re.slice(), im: P.A.im.slice() };
    nan.im[diag] = NaN;
    // common practice: a NaN is refused wherever it is met
    expect(() => factor(nan, S, {}, threaded(S, 1))).toThrow(NonFiniteMatrixError);
  });
});

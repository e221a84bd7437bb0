import { describe, expect, it } from 'vitest';
import { jsKernels, type DenseKernels } from '../../engine/linalg/denseKernels.ts';
import { simdAvailable, simdKernels, simdModuleBytes } from '../../engine/linalg/simdKernels.ts';
import { arenaLayout, createArena, NB } from '../../engine/linalg/frontArena.ts';
import { factorFront, type PivotPolicy } from '../../engine/linalg/frontal.ts';
import { analyze, defaultKernel, factor, FactorWorkspace, relativeResidual, solve } from '../../engine/linalg/index.ts';
import { latticeHelmholtz, randomSymmetric, randomVector, rng } from './problems.ts';

/** Two copies of one random memory: the SIMD kernels on a WebAssembly memory, the JS kernels on a copy. */
function twins(doubles: number, seed: number): { simd: DenseKernels; js: DenseKernels; a: Float64Array; b: Float64Array; ai: Int32Array; bi: Int32Array; sync(): void } {
  const memory = new WebAssembly.Memory({ initial: Math.ceil((8 * doubles) / 65536) });
  const a = new Float64Array(memory.buffer), ai = new Int32Array(memory.buffer);
  const b = new Float64Array(a.length), bi = new Int32Array(b.buffer);
  const r = rng(seed);
  for (let i = 0; i < a.length; i++) a[i] = 2 * r() - 1;
  return { simd: simdKernels(memory), js: jsKernels(b, bi), a, b, ai, bi, sync: () => b.set(a) };
}

/** Writes rows × cols packed pairs at w (row stride ws) from random numbers. */
function pairs(M: Float64Array, w: number, ws: number, rows: number, cols: number, r: () => number): void {
  for (let i = 0; i < rows; i++) {
    for (let t = 0; t < cols; t++) {
      const q = w + i * ws + 4 * t, re = 2 * r() - 1, im = 2 * r() - 1;
      M.set([re, im, im, re], q);
    }
  }
}

function maxDiff(a: Float64Array, b: Float64Array, from = 0, to = a.length): number {
  let e = 0;
  for (let i = from; i < to; i++) e = Math.max(e, Math.abs(a[i] - b[i]));
  return e;
}

const eps = Number.EPSILON;

describe.skipIf(!simdAvailable())('WebAssembly SIMD kernels against the plain-JS kernels', () => {
  it('emits a module the runtime validates, plain and shared', () => {
    expect(WebAssembly.validate(simdModuleBytes(false))).toBe(true);
    expect(WebAssembly.validate(simdModuleBytes(true))).toBe(true);
  });

  it('gives the worked examples of the doc comments', () => {
    const t = twins(64, 1);
    for (const [K, M] of [[t.simd, t.a], [t.js, t.b]] as const) {
      M.set([10, 0, 1, 2, 3, 4, 4, 3], 0);
      K.products(0, 2, 2, 2, 4, 4, 1, 1, 1);
      // common practice: 10 − (1+2i)(3+4i) = 15 − 10i
      expect([M[0], M[1]]).toEqual([15, -10]);
      M.set([1, 2, 2, -1], 8);
      K.packScaled(8, 2, 1, 1, 10, 16, 4);
      // common practice: (1+2i)(2−i) = 4+3i as the pair (4, 3, 3, 4)
      expect(Array.from(M.subarray(16, 20))).toEqual([4, 3, 3, 4]);
      M.set([6, 2, 0.5, 0], 24);
      K.solveRows(24, 2, 1, 1, 40, 4, 26);
      // common practice: (6+2i)·0.5
      expect([M[24], M[25]]).toEqual([3, 1]);
    }
  });

  it('agree to round-off on seeded random blocks of every shape the factor uses', () => {
    const r = rng(7);
    for (let trial = 0; trial < 60; trial++) {
      const rows = 1 + Math.floor(r() * 13), cols = 1 + Math.floor(r() * 9), len = Math.floor(r() * 40);
      const t = twins(40000, trial);
      const ts = 2 * cols + 2 * Math.floor(r() * 5), xs = 2 * len + 2 * Math.floor(r() * 5), ws = 4 * len + 4 * Math.floor(r() * 3);
      const T = 2 * Math.floor(r() * 100), X = 4000 + 2 * Math.floor(r() * 100), W = 12000;
      pairs(t.a, W, ws, Math.max(rows, cols), len, r);
      t.sync();
      t.simd.products(T, ts, X, xs, W, ws, rows, cols, len);
      t.js.products(T, ts, X, xs, W, ws, rows, cols, len);
      // common practice: the same sums in another order differ by a few ulps of the terms' size (len ≤ 40 terms of modulus ≤ 2)
      expect(maxDiff(t.a, t.b)).toBeLessThan(64 * len * eps + 1e-300);
      t.sync();
      const m = rows;
      t.simd.lowerProducts(T, ts + 2 * m, X, xs, W, ws, m, len);
      t.js.lowerProducts(T, ts + 2 * m, X, xs, W, ws, m, len);
      let e = 0;
      for (let i = 0; i < m; i++) e = Math.max(e, maxDiff(t.a, t.b, T + i * (ts + 2 * m), T + i * (ts + 2 * m) + 2 * (i + 1)));
      // common practice: the lower triangles agree (the SIMD kernel may also write one entry above the diagonal)
      expect(e).toBeLessThan(64 * len * eps + 1e-300);
      t.sync();
      t.simd.packScaled(X, xs, rows, len, 30000, W, ws);
      t.js.packScaled(X, xs, rows, len, 30000, W, ws);
      // common practice: the same products
      expect(maxDiff(t.a, t.b)).toBeLessThan(8 * eps);
      t.sync();
      const nb = Math.min(cols, 8);
      pairs(t.a, W, 4 * nb, nb, nb, r);
      t.sync();
      t.simd.solveRows(X, xs, rows, nb, W, 4 * nb, 30000);
      t.js.solveRows(X, xs, rows, nb, W, 4 * nb, 30000);
      let size = 0;
      for (let i = 0; i < rows; i++) for (let k = 0; k < 2 * nb; k++) size = Math.max(size, Math.abs(t.b[X + i * xs + k]));
      // common practice: the same triangular solve summed in another order: a few ulps of the largest value it produced
      expect(maxDiff(t.a, t.b) / size).toBeLessThan(256 * eps);
      const mc = Math.min(rows + cols, 20), rel = 2 * 36000;
      let pos = 0;
      for (let q = 0; q < mc; q++) { pos += 1 + Math.floor(r() * 3); t.ai[rel + q] = pos; }
      t.sync();
      t.simd.extendAdd(34000, rel, mc, 100, 2 * (pos + 1));
      t.js.extendAdd(34000, rel, mc, 100, 2 * (pos + 1));
      // common practice: the same additions
      expect(maxDiff(t.a, t.b)).toBe(0);
    }
  });

  it('factor seeded random fronts alike, blocks of pivots and trailing update included', () => {
    const accept: PivotPolicy = { accept: (_j, dr, di, out) => { out[0] = dr; out[1] = di; } };
    for (const [ns, m] of [[1, 0], [5, 7], [NB, 3], [NB + 7, 2 * NB + 5], [3 * NB + 1, 40]]) {
      const F = ns + m;
      const layout = arenaLayout({ maxFront: F, maxPivots: ns, workEntries: 2 * ns * Math.max(m, Math.min(ns, NB)), stackPeak: 1 });
      const out = [createArena(layout, 'simd'), createArena(layout, 'js')].map((arena) => {
        const r = rng(ns * 1000 + m), M = arena.f64, fo = layout.front;
        expect(arena.kernels.kind).toBe(arena.memory ? 'simd' : 'js');
        for (let i = 0; i < F; i++) {
          for (let j = 0; j <= i; j++) {
            // diagonally dominant, complex symmetric: no pivot trouble
            M[fo + 2 * (i * F + j)] = i === j ? F + r() : r() - 0.5;
            M[fo + 2 * (i * F + j) + 1] = r() - 0.5;
          }
        }
        const D = { dRe: new Float64Array(ns), dIm: new Float64Array(ns), invRe: new Float64Array(ns), invIm: new Float64Array(ns) };
        factorFront(arena, F, ns, 0, D, accept);
        const lower: number[] = [];
        for (let i = 0; i < F; i++) for (let j = 0; j <= i; j++) lower.push(M[fo + 2 * (i * F + j)], M[fo + 2 * (i * F + j) + 1]);
        return lower;
      });
      let e = 0;
      for (let k = 0; k < out[0].length; k++) e = Math.max(e, Math.abs(out[0][k] - out[1][k]));
      // common practice: a diagonally dominant LDLᵀ is backward stable, so two summation orders agree near round-off
      expect(e).toBeLessThan(1e-12);
    }
  });

  it('factor a lattice Helmholtz system alike, each to a residual at round-off', () => {
    const P = latticeHelmholtz({ elements: [10, 4, 3], order: 2, h: 0.1, k2: { re: 40, im: -0.4 } });
    const S = analyze(P.A), b = randomVector(P.ndofs, 3);
    const Ns = factor(P.A, S, {}, new FactorWorkspace(S, { kernel: 'simd' })), Nj = factor(P.A, S, {}, new FactorWorkspace(S, { kernel: 'js' }));
    expect([Ns.kernel, Nj.kernel]).toEqual(['simd', 'js']);
    const xs = solve(Ns, b), xj = solve(Nj, b);
    let e = 0, size = 0;
    for (let i = 0; i < P.ndofs; i++) {
      e = Math.max(e, Math.hypot(xs.re[i] - xj.re[i], xs.im[i] - xj.im[i]));
      size = Math.max(size, Math.hypot(xj.re[i], xj.im[i]));
    }
    // common practice: both backward stable on the same system
    expect(relativeResidual(P.A, xs, b)).toBeLessThan(1e-12);
    expect(e / size).toBeLessThan(1e-9);
  });
});

describe('the kernel switch', () => {
  it('follows QUIETGRID_KERNEL (tests/setup.ts), SIMD by default where the runtime has it', () => {
    const expected = process.env.QUIETGRID_KERNEL ?? (simdAvailable() ? 'simd' : 'js');
    expect(defaultKernel()).toBe(expected);
    const A = randomSymmetric(50, 4, 2), S = analyze(A);
    expect(factor(A, S).kernel).toBe(expected);
  });
});

describe('the front arena', () => {
  it('holds fronts and the update stack, not the factor: its size follows the largest front, whatever the factor size', () => {
    const P = latticeHelmholtz({ elements: [40, 4, 3], order: 2, h: 0.1, k2: { re: 40, im: -0.4 } });
    const S = analyze(P.A);
    const ws = new FactorWorkspace(S);
    const N = factor(P.A, S, {}, ws);
    // common practice: the panels are an ordinary array of their own, so a factor larger than one WebAssembly memory still fits
    expect(N.panels.length).toBe(2 * S.storedEntries);
    expect(S.arena.bytes).toBeLessThan(16 * (S.maxFront * S.maxFront + S.workEntries + S.stackPeak) + 16 * NB * NB * 4 + 65536 + 64 * S.maxFront);
    expect(S.memoryBytes).toBe(16 * S.storedEntries + S.arena.bytes + 44 * S.n);
  });

  it('uses the same layout for both kernels, so the memory estimate does not depend on the kernel', () => {
    const A = randomSymmetric(300, 6, 5);
    const S = analyze(A);
    const a = createArena(S.arena, 'js'), b = createArena(S.arena, 'simd');
    expect([a.f64.buffer.byteLength, b.f64.buffer.byteLength]).toEqual([S.arena.bytes, S.arena.bytes]);
  });
});

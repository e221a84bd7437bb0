/**
 * The frontal update's speed alone: T −= X·Wᵀ (subtractProducts, the tiled products of the factorisation)
 * on blocks of the size of a large front's trailing update, with the SIMD and the plain-JS kernels, and
 * the machine's peak for the same operation: OpenBLAS zgemm through NumPy, one thread.
 *   npx tsx bench/kernel.ts     → one JSON line: { simd, js, zgemm } in GFlop/s (best of several runs), shapes
 */
import { spawnSync } from 'node:child_process';
import { subtractProducts } from '../engine/linalg/denseProducts.ts';
import { createArena, arenaLayout } from '../engine/linalg/frontArena.ts';
import { simdAvailable } from '../engine/linalg/index.ts';

/** rows × cols targets, len terms: a 1 200-row front with 400 pivots, and a squarer one. */
const SHAPES: [number, number, number][] = [[800, 800, 400], [1200, 400, 400]];

function gflops(kind: 'simd' | 'js', [rows, cols, len]: [number, number, number], repeats: number): number {
  const a = createArena(arenaLayout({ maxFront: 1, maxPivots: 1, workEntries: 1, stackPeak: rows * len + 2 * cols * len + rows * cols + 64 }), kind);
  const M = a.f64, X = 0, W = 2 * rows * len, T = W + 4 * cols * len;
  for (let i = 0; i < T + 2 * rows * cols; i++) M[i] = Math.sin(i);
  let best = Infinity;
  for (let r = 0; r < repeats; r++) {
    const t = performance.now();
    subtractProducts(a.kernels, T, 2 * cols, X, 2 * len, W, 4 * len, rows, cols, len);
    best = Math.min(best, (performance.now() - t) / 1000);
  }
  return (8 * rows * cols * len) / best / 1e9;
}

/** OpenBLAS zgemm on one thread through NumPy, GFlop/s (8 real flops a complex multiply-add); null without NumPy. */
function zgemm(): number | null {
  const code = 'import numpy as np, time\nn=1000\na=np.random.rand(n,n)+1j*np.random.rand(n,n)\nb=a.copy()\nbest=1e9\nfor _ in range(7):\n  t=time.perf_counter(); c=a@b; best=min(best,time.perf_counter()-t)\nprint(8*n**3/best/1e9)';
  const r = spawnSync('/usr/bin/python3', ['-c', code], { encoding: 'utf8', env: { ...process.env, OPENBLAS_NUM_THREADS: '1', OMP_NUM_THREADS: '1' } });
  return r.status === 0 ? Number(r.stdout.trim()) : null;
}

const simd = simdAvailable() ? Math.max(...SHAPES.map((s) => gflops('simd', s, 7))) : null;
const js = Math.max(...SHAPES.map((s) => gflops('js', s, 3)));
console.log(JSON.stringify({ simd, js, zgemm: zgemm(), shapes: SHAPES }));

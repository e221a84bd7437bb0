/**
 * One factorisation case in a process of its own (so that its memory peak is its own):
 *   node --expose-gc --import tsx bench/factor-case.ts NAME OUTDIR
 * prepares the case, times assembly, analysis, factorisation and one solve, then the factorisation again
 * on one and on two threads in kept workspaces; measures the resident-set
 * peak of the factorisation alone, writes A.mtx, b.mtx and our ordering perm.txt (for MUMPS) into OUTDIR
 * and prints one JSON line.
 */
import { createWriteStream, writeFileSync } from 'node:fs';
import { once } from 'node:events';
import { join } from 'node:path';
import { readScenario } from '../engine/scenario/index.ts';
import { prepareProblem } from '../engine/solve/prepare.ts';
import { analyzeMesh } from '../engine/solve/linear.ts';
import { factor, solve, matrixMarketChunks, writeMatrixMarketVector, relativeResidual, FactorWorkspace, planParallel } from '../engine/linalg/index.ts';
import { nodeFactorThreads } from '../engine/node/factorThreads.ts';
import { chamberScenario, FACTOR_CASES } from './scenarios.ts';
import { peakBytes, resetPeak } from './memory.ts';

const [name, outDir] = process.argv.slice(2);
const c = FACTOR_CASES.find((x) => x.name === name);
if (!c || !outDir) throw new Error('usage: factor-case.ts NAME OUTDIR');
const gc = (globalThis as { gc?: () => void }).gc ?? (() => {});
const now = () => performance.now() / 1000;

const p = prepareProblem(readScenario(chamberScenario(c)).scenario, { maxDofs: Infinity });
if (p.kind !== 'duct') throw new Error('a duct case');
const pattern = p.system(c.topHz).A; // warm-up: the first call compiles the kernels
let t = now();
const S = analyzeMesh(p.mesh, pattern);
const analyseSeconds = now() - t;
t = now();
const { A, b } = p.system(c.topHz);
const assembleSeconds = now() - t;
gc();
const rss0 = process.memoryUsage().rss;
const reset = resetPeak();
const peak0 = peakBytes();
t = now();
const cpu0 = process.cpuUsage();
const N = factor(A, S);
const factorSeconds = now() - t;
const cpu = process.cpuUsage(cpu0), factorCpuSeconds = (cpu.user + cpu.system) / 1e6;
const peak = peakBytes() - (reset ? rss0 : peak0 > rss0 ? peak0 : rss0);
t = now();
const x = solve(N, b);
const solveSeconds = now() - t;
const residual = relativeResidual(A, x, b);

// one and two threads on a kept workspace (the second factorisation in each: memory touched, helper started), alternated
const timed = (w: FactorWorkspace): number => { const t0 = now(); factor(A, S, {}, w); return now() - t0; };
const w1 = new FactorWorkspace(S), w2 = new FactorWorkspace(S, { threads: nodeFactorThreads(1) });
timed(w1);
const firstTwoThreadsSeconds = timed(w2); // includes starting the helper thread
const kept1: number[] = [], kept2: number[] = [];
for (let r = 0; r < 2; r++) {
  kept1.push(timed(w1));
  kept2.push(timed(w2));
}
w2.close();
const plan = planParallel(S, 2), planTotal = plan.work.reduce((a, w) => a + w, 0) + plan.topWork;

const mtx = createWriteStream(join(outDir, 'A.mtx'));
for (const chunk of matrixMarketChunks(A)) if (!mtx.write(chunk)) await once(mtx, 'drain');
mtx.end();
await once(mtx, 'finish');
writeFileSync(join(outDir, 'b.mtx'), writeMatrixMarketVector(b));
// our ordering for MUMPS (ICNTL(7) = 1): line k holds the 1-based pivot position of unknown k
writeFileSync(join(outDir, 'perm.txt'), `${Array.from(S.pinv, (p) => p + 1).join('\n')}\n`);

console.log(JSON.stringify({
  name: c.name, order: c.order, topHz: c.topHz, chamberLength: c.chamberLength, dofs: S.n, nnzA: S.nnzA, nnzL: S.nnzL, storedEntries: S.storedEntries,
  flops: S.flops, frontFlops: S.frontFlops, maxFront: S.maxFront, kernel: N.kernel, memoryBytes: S.memoryBytes, peakBytes: peak, peakReset: reset,
  analyseSeconds, assembleSeconds, factorSeconds, factorCpuSeconds, solveSeconds, residual, perturbed: N.perturbed,
  keptOneThreadSeconds: Math.min(...kept1), keptTwoThreadsSeconds: Math.min(...kept2), firstTwoThreadsSeconds, planSpeedup: planTotal / (Math.max(...plan.work) + plan.topWork),
}));

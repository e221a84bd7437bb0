/**
 * The Node host of the factorisation's helper threads (engine/linalg/parallelFactor.ts): one
 * worker_thread per helper, started when the workspace first factors and given its setup of shared
 * memory; it serves that workspace until the workspace is closed.
 */
import { Worker } from 'node:worker_threads';
import type { HelperThreads } from '../linalg/index.ts';

const ENTRY = new URL('./factorHelper.mjs', import.meta.url);

/** `size` helper threads for one FactorWorkspace (close the workspace to end them). */
export function nodeFactorThreads(size: number): HelperThreads {
  if (!(Number.isInteger(size) && size >= 0)) throw new RangeError(`helper threads must be a whole number, 0 or more (got ${size})`);
  const workers: Worker[] = [];
  return {
    size,
    post(i, setup) {
      const w = new Worker(ENTRY, { workerData: setup });
      w.unref(); // a helper waiting for work does not keep the process alive
      w.on('error', (e) => process.stderr.write(`quietgrid: a factorisation helper thread failed: ${e instanceof Error ? e.message : String(e)}\n`));
      workers[i] = w;
    },
    close() {
      for (const w of workers) void w.terminate();
      workers.length = 0;
    },
  };
}

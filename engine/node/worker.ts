/**
 * One worker thread of the command line's sweep (pool.ts): the engine's worker-side job
 * (engine/sweep/job.ts) on a worker_threads port, results posted as soon as they are ready, field arrays
 * transferred rather than copied. The thread ends when the host terminates it.
 */
import { parentPort } from 'node:worker_threads';
import { performance } from 'node:perf_hooks';
import { createWorkerJob } from '../sweep/job.ts';
import { transferOf, type ToWorker } from '../sweep/protocol.ts';
import { applyKernelChoice } from './kernelChoice.ts';

applyKernelChoice(); // the main thread has checked the value
const port = parentPort!;
const job = createWorkerJob((message) => port.postMessage(message, transferOf(message)), { now: () => performance.now() });
port.on('message', (message: ToWorker) => job.receive(message));

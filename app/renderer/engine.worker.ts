/**
 * The engine in a Web Worker: the only place the renderer's solves, mesh estimates and field slices run.
 * A thin host of the engine's worker-side job (engine/sweep/job.ts), which does the same in the command
 * line's worker threads; this file only wires it to the worker's scope, transferring buffers.
 */
import { createWorkerJob } from '../../engine/sweep/job.ts';
import { transferOf, type FromWorker, type ToWorker } from '../../engine/sweep/protocol.ts';

/** What the job needs of the worker's global scope (a DedicatedWorkerGlobalScope), typed without the WebWorker lib. */
export interface WorkerScope {
  postMessage(message: FromWorker, options: { transfer: ArrayBuffer[] }): void;
  onmessage: ((event: { data: ToWorker }) => void) | null;
}

const scope = self as unknown as WorkerScope;
const job = createWorkerJob((message) => scope.postMessage(message, { transfer: transferOf(message) }), { now: () => performance.now() });
scope.onmessage = (event) => job.receive(event.data);

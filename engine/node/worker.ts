/**
 * One worker thread of the pool (pool.ts): prepares the scenario once, then solves one frequency per
 * 'solve' message and posts each result, with the accuracy figures that need no other solve, as soon as
 * it is ready, the field's arrays transferred rather than copied. A failure at one frequency is reported
 * and the worker goes on with the next. An order-check job ('solve' with finer) is solved on the scenario
 * at element order p + 1, prepared on the first such job.
 */
import { parentPort, workerData } from 'node:worker_threads';
import { performance } from 'node:perf_hooks';
import { prepareProblem } from '../solve/prepare.ts';
import type { Problem } from '../solve/problem.ts';
import type { FromWorker, ToWorker, WorkerSetup } from './pool.ts';
import { applyKernelChoice } from './kernelChoice.ts';

applyKernelChoice(); // the main thread has checked the value
const port = parentPort!;
const setup = workerData as WorkerSetup;
const now = () => performance.now();

function post(message: FromWorker, transfer: ArrayBuffer[] = []): void {
  port.postMessage(message, transfer);
}

function messageOf(e: unknown): string {
  return e instanceof Error ? e.message : String(e);
}

function solveOne(prepared: Problem, frequencyHz: number): void {
  try {
    const solved = prepared.solve(frequencyHz, now, setup.keepFields), point = { ...solved, accuracy: prepared.assess(solved) };
    const transfer = point.field ? [point.field.re.buffer as ArrayBuffer, point.field.im.buffer as ArrayBuffer] : [];
    post({ type: 'result', point }, transfer);
  } catch (e) {
    post({ type: 'failure', frequencyHz, message: messageOf(e) });
  }
}

let finer: Problem | Error | undefined;

function checkOne(frequencyHz: number): void {
  try {
    if (finer === undefined) {
      try {
        finer = prepared!.finer();
      } catch (e) {
        finer = e instanceof Error ? e : new Error(String(e));
      }
    }
    if (finer instanceof Error) throw finer;
    post({ type: 'result', point: finer.solve(frequencyHz, now, false), finer: true });
  } catch (e) {
    post({ type: 'failure', frequencyHz, message: messageOf(e), finer: true });
  }
}

let prepared: Problem | undefined;
try {
  prepared = prepareProblem(setup.scenario, { maxDofs: Infinity }); // the client (CLI: --yes) has already decided on the size
  post({ type: 'ready' });
} catch (e) {
  post({ type: 'fatal', message: messageOf(e) });
}

port.on('message', (message: ToWorker) => {
  if (message.type === 'stop' || prepared === undefined) port.close();
  else if (message.finer) checkOne(message.frequencyHz);
  else solveOne(prepared, message.frequencyHz);
});

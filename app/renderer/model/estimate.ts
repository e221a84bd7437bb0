/**
 * What a run will cost before it starts: memory from what each worker holds (MeshInfo.workerMemoryBytes),
 * time from the factorisation's operation count and the matrix size, scaled by what this machine
 * measured on its last run (a single factor kept between sessions).
 */
import type { MeshInfo } from '../../../engine/solve/problem.ts';
import { defaultWorkerCount } from '../../../engine/sweep/plan.ts';

/** Rough costs of a plain-JavaScript frontal factorisation and assembly on one core (measured on the demos). */
const SECONDS_PER_FLOP = 1e-9;
const SECONDS_PER_ENTRY = 4e-7;
const OVERHEAD_SECONDS = 0.02;

export function predictedSecondsPerFrequency(info: MeshInfo, calibration = 1): number {
  return calibration * (info.factorFlops * SECONDS_PER_FLOP + info.nnz * SECONDS_PER_ENTRY + OVERHEAD_SECONDS);
}

export interface RunEstimate { workers: number; seconds: number; memoryBytes: number; perWorkerBytes: number }

export function estimateRun(info: MeshInfo, frequencies: number, workers: number, calibration = 1, prepareSeconds = 0): RunEstimate {
  const w = Math.max(1, Math.min(workers, frequencies));
  const perWorkerBytes = info.workerMemoryBytes; // each worker holds its own prepared problem, matrix, factor and vectors
  return { workers: w, seconds: prepareSeconds + Math.ceil(frequencies / w) * predictedSecondsPerFrequency(info, calibration), memoryBytes: w * perWorkerBytes, perWorkerBytes };
}

/** The calibration after a run: measured over predicted seconds per frequency, blended with the old value. */
export function recalibrate(previous: number, info: MeshInfo, measuredSecondsPerFrequency: number): number {
  const ratio = measuredSecondsPerFrequency / predictedSecondsPerFrequency(info, 1);
  if (!Number.isFinite(ratio) || ratio <= 0) return previous;
  return Math.min(100, Math.max(0.01, 0.5 * previous + 0.5 * ratio));
}

/** The share of the device's memory (when the browser tells it) the workers of one run may take together. */
const DEVICE_MEMORY_SHARE = 0.5;

/** Workers to start by default: the engine's rule (engine/sweep/plan.ts) with this device's cores and memory. */
export function defaultWorkers(cores: number, frequencies: number, perWorkerBytes: number, deviceMemoryGb?: number): number {
  return defaultWorkerCount({ cores, frequencies, workerMemoryBytes: perWorkerBytes, memoryBytes: deviceMemoryGb ? DEVICE_MEMORY_SHARE * deviceMemoryGb * 1e9 : Infinity });
}

/** The workers a run uses: the user's choice, else the default; never more than the frequencies. */
export function runWorkers(chosen: number | null, cores: number, frequencies: number, perWorkerBytes: number, deviceMemoryGb?: number): number {
  return Math.max(1, Math.min(chosen ?? defaultWorkers(cores, frequencies, perWorkerBytes, deviceMemoryGb), Math.max(1, frequencies)));
}

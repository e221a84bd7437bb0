/**
 * Which frequencies a sweep solves, and which of them it checks one element order higher. Light: no
 * numerics, so a host's main thread (the app's renderer) may call it before any worker exists.
 */

/** The default frequencies of the order check: the top of the sweep and two more spread over it (at most 3). */
export function defaultOrderCheckFrequencies(frequenciesHz: readonly number[]): number[] {
  const f = [...frequenciesHz].sort((a, b) => a - b), n = f.length;
  if (n === 0) return [];
  return [...new Set([f[n - 1], f[Math.round((2 * (n - 1)) / 3)], f[Math.round((n - 1) / 3)]])].sort((a, b) => a - b);
}

/** The order-check frequencies of a sweep: every one, none, or by default at most three. */
export function orderCheckFrequencies(frequenciesHz: readonly number[], mode: 'default' | 'all' | 'none'): number[] {
  return mode === 'none' ? [] : mode === 'all' ? [...frequenciesHz] : defaultOrderCheckFrequencies(frequenciesHz);
}

/** What a host knows when it picks the number of workers. */
export interface WorkerBudget {
  /** Cores (threads) the host may use. */
  cores: number;
  /** Frequencies to solve at the start. */
  frequencies: number;
  /** What one worker holds while it solves (MeshInfo.workerMemoryBytes). */
  workerMemoryBytes: number;
  /** The memory the workers may take together: the CLI a share of the free memory, the app a share of the device's. */
  memoryBytes: number;
}

/**
 * How many workers by default: one per core, no more than there are frequencies, and no more than the
 * memory holds, each worker holding its own prepared problem, matrix, factor and vectors.
 */
export function defaultWorkerCount(b: WorkerBudget): number {
  const byMemory = Math.floor(b.memoryBytes / Math.max(1, b.workerMemoryBytes));
  return Math.max(1, Math.min(Math.max(1, b.cores), Math.max(1, b.frequencies), byMemory));
}

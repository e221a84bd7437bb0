// The cost shown before a run (app/renderer/model/estimate.ts): memory per worker is what a worker
// holds (MeshInfo.workerMemoryBytes), time scales with the frequencies each worker takes.
import { describe, expect, it } from 'vitest';
import type { MeshInfo } from '../../engine/solve/problem.ts';
import { defaultWorkers, estimateRun, predictedSecondsPerFrequency, recalibrate } from '../../app/renderer/model/estimate.ts';

const INFO: MeshInfo = { order: 4, pointsPerWavelength: 6, topFrequencyHz: 500, absorberKind: 'discrete', layers: 3, elements: 10, dofs: 100, nnz: 1000, factorNonzeros: 500, factorFlops: 1e9, memoryEstimateBytes: 1e6, workerMemoryBytes: 3e6 };

describe('estimateRun', () => {
  it('counts each worker at workerMemoryBytes, not at the factor estimate', () => {
    const e = estimateRun(INFO, 11, 2);
    expect(e.perWorkerBytes).toBe(3e6);
    expect(e.memoryBytes).toBe(6e6);
  });

  it('starts no more workers than frequencies, and gives each its share of the time after preparing', () => {
    const per = predictedSecondsPerFrequency(INFO);
    const e = estimateRun(INFO, 3, 8, 1, 0.5);
    expect(e.workers).toBe(3);
    expect(e.seconds).toBeCloseTo(0.5 + per, 12);
    expect(estimateRun(INFO, 11, 2).seconds).toBeCloseTo(6 * per, 12);
  });
});

describe('recalibrate and defaultWorkers', () => {
  it('blends the measured ratio with the old calibration and ignores a meaningless measurement', () => {
    const per = predictedSecondsPerFrequency(INFO);
    expect(recalibrate(1, INFO, 3 * per)).toBeCloseTo(2, 12);
    expect(recalibrate(1.5, INFO, 0)).toBe(1.5);
    expect(recalibrate(1.5, INFO, Number.NaN)).toBe(1.5);
  });

  it('takes one worker per core unless the frequencies or half the device memory allow fewer', () => {
    expect(defaultWorkers(4, 24, 1e9)).toBe(4);
    expect(defaultWorkers(4, 2, 1e9)).toBe(2);
    expect(defaultWorkers(4, 24, 1e9, 4)).toBe(2);
    expect(defaultWorkers(4, 24, 1e10, 4)).toBe(1);
  });
});

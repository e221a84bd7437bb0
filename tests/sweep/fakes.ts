// Stand-ins for the scheduler's tests: a worker port that records what it is sent and replies on demand,
// and plain points and descriptions of the shapes the engine's job posts.
import type { FromWorker, SweepDescription, ToWorker, WorkerPort } from '../../engine/sweep/protocol.ts';
import type { MeshInfo } from '../../engine/solve/problem.ts';
import type { AssessedPoint, PointAccuracy } from '../../engine/solve/points.ts';
import { ACCURACY_LEGEND } from '../../engine/solve/assess.ts';

export const INFO: MeshInfo = { order: 4, pointsPerWavelength: 6, topFrequencyHz: 500, absorberKind: 'discrete', layers: 3, elements: 10, dofs: 100, nnz: 1000, factorNonzeros: 500, factorFlops: 1e6, memoryEstimateBytes: 1e6, workerMemoryBytes: 2e6 };

export const DESCRIPTION: SweepDescription = {
  problem: { kind: 'duct', info: INFO, cutOns: [], planeWaveValidBelowHz: null, planeWaveUnavailable: 'a test', accuracy: ACCURACY_LEGEND },
  scenario: { title: 't', kind: 'duct', defaultsUsed: [], sweep: { spacing: 'list', frequenciesHz: [] } },
  warnings: [],
};

export const ready = (): FromWorker => ({ type: 'ready', description: DESCRIPTION, prepareSeconds: 0 });

export function accuracy(f: number, over: Partial<PointAccuracy> = {}): PointAccuracy {
  return { frequencyHz: f, reflectionEstimate: 1e-5, energyBalance: 1e-6, orderCheckDb: null, tlPlaneDb: null, planeWaveValid: null, flags: [], ...over };
}

export function point(f: number, tlDb = 10, field = false): AssessedPoint {
  return {
    kind: 'duct', frequencyHz: f, tlDb, tlIntensityDb: tlDb, tlDecompositionDb: tlDb, method: 'intensity', inletReflection: 0.5, inletAbsorption: 0.75,
    incidentPower: 1, transmittedPower: 0.1, reflectedPower: 0.25, energyBalance: 0.65,
    stats: { factorSeconds: 0, solveSeconds: 0, perturbedPivots: 0, residual: 1e-15, assembleSeconds: 0 },
    field: field ? { re: new Float64Array(4), im: new Float64Array(4) } : undefined, accuracy: accuracy(f),
  };
}

export class FakeWorker implements WorkerPort {
  onmessage: ((e: { data: FromWorker }) => void) | null = null;
  onerror: ((e: { message?: string }) => void) | null = null;
  received: ToWorker[] = [];
  terminated = false;
  postMessage(m: ToWorker) { this.received.push(m); }
  terminate() { this.terminated = true; }
  reply(m: FromWorker) { this.onmessage?.({ data: m }); }
  last(): ToWorker | undefined { return this.received.at(-1); }
  lastSolve(): number | undefined { const s = this.received.filter((m) => m.type === 'solve').pop(); return s?.type === 'solve' ? s.frequencyHz : undefined; }
}

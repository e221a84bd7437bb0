import { readScenario, type NormalisedScenario } from '../../engine/scenario/index.ts';
import { prepareScenario, solvePoint, type PointResult, type Prepared } from '../../engine/solve/scenario.ts';

export const AIR = { soundSpeed: 343, density: 1.2 };

export function normalised(scenario: object): NormalisedScenario {
  return readScenario(JSON.stringify({ format: 'quietgrid/1', ...scenario })).scenario;
}

export function prepare(scenario: object): Prepared {
  return prepareScenario(normalised(scenario));
}

export function ductPoint(p: Prepared, f: number): Extract<PointResult, { kind: 'duct' }> {
  const r = solvePoint(p, f, () => performance.now());
  if (r.kind !== 'duct') throw new Error('not a duct');
  return r;
}

/** The m = 9 expansion chamber of tests/duct (0.15 × 0.10 pipes, 0.45 × 0.30 × 0.5 m chamber, cut-on 381 Hz). */
export function expansionChamber(toHz: number, extra: object = {}): object {
  return {
    air: AIR, sweep: { fromHz: 50, toHz, spacing: 'third-octave' }, mesh: { order: 4, pointsPerWavelength: 8 },
    duct: { sections: [{ name: 'in', length: 0.5, width: 0.15, height: 0.1 }, { name: 'chamber', length: 0.5, width: 0.45, height: 0.3 }, { name: 'out', length: 0.5, width: 0.15, height: 0.1 }] },
    ...extra,
  };
}

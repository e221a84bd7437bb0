import { readScenario, type NormalisedScenario } from '../../engine/scenario/index.ts';
import { prepareProblem } from '../../engine/solve/prepare.ts';
import type { Problem } from '../../engine/solve/problem.ts';
import type { DuctPoint } from '../../engine/solve/points.ts';

export const AIR = { soundSpeed: 343, density: 1.2 };

export function normalised(scenario: object): NormalisedScenario {
  return readScenario(JSON.stringify({ format: 'quietgrid/1', ...scenario })).scenario;
}

export function prepare(scenario: object): Problem {
  return prepareProblem(normalised(scenario));
}

export function ductPoint(p: Problem, f: number): DuctPoint {
  const r = p.solve(f, () => performance.now());
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

import { readScenario } from '../../engine/scenario/index.ts';
import { prepareProblem } from '../../engine/solve/prepare.ts';
import type { Problem } from '../../engine/solve/problem.ts';
import type { DuctPoint } from '../../engine/solve/points.ts';

export function prepare(scenario: object): Problem {
  return prepareProblem(readScenario(JSON.stringify({ format: 'quietgrid/1', ...scenario })).scenario);
}

export function duct(p: Problem, f: number): DuctPoint {
  const r = p.solve(f, () => performance.now());
  if (r.kind !== 'duct') throw new Error('not a duct');
  return r;
}

import { readScenario } from '../../engine/scenario/index.ts';
import { prepareScenario, solvePoint, type Prepared, type PointResult } from '../../engine/solve/scenario.ts';

export function prepare(scenario: object): Prepared {
  return prepareScenario(readScenario(JSON.stringify({ format: 'quietgrid/1', ...scenario })).scenario);
}

export function duct(p: Prepared, f: number): Extract<PointResult, { kind: 'duct' }> {
  const r = solvePoint(p, f, () => performance.now());
  if (r.kind !== 'duct') throw new Error('not a duct');
  return r;
}

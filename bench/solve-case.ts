/**
 * One frequency of a long expansion chamber solved the way `quietgrid solve` solves it (prepare, assemble,
 * factor, solve, port results), in a process of its own so that its memory peak is its own:
 *   node --import tsx bench/solve-case.ts ORDER TOP_HZ CHAMBER_M
 * Prints one JSON line: dofs, seconds per phase, the TL found, and the peak resident set of the whole
 * process from its start (Linux VmHWM, else maxRSS): what the machine must hold for this solve.
 */
import { readScenario } from '../engine/scenario/index.ts';
import { prepareProblem } from '../engine/solve/prepare.ts';
import { chamberScenario } from './scenarios.ts';
import { peakBytes } from './memory.ts';

const [order, topHz, chamberLength] = process.argv.slice(2).map(Number);
if (![order, topHz, chamberLength].every((v) => v > 0)) throw new Error('usage: solve-case.ts ORDER TOP_HZ CHAMBER_M');
const now = () => performance.now();
const t0 = now();
const p = prepareProblem(readScenario(chamberScenario({ name: 'long', order, topHz, chamberLength })).scenario, { maxDofs: Infinity });
const prepareSeconds = (now() - t0) / 1000;
const point = p.solve(topHz, now);
if (point.kind !== 'duct') throw new Error('a duct case');
console.log(JSON.stringify({
  dofs: p.info.dofs, prepareSeconds, assembleSeconds: point.stats.assembleSeconds, factorSeconds: point.stats.factorSeconds, solveSeconds: point.stats.solveSeconds,
  tlDb: point.tlDb, energyBalance: point.energyBalance, residual: point.stats.residual, peakBytes: peakBytes(),
}));

/**
 * npm run bench — what one frequency of a 3D duct costs: dofs, nonzeros, fill, and the time of each phase,
 * for an expansion-chamber silencer meshed at three sizes (the largest near 50 000 dofs). Timings are
 * printed, never asserted: they belong here, not in the tests.
 */
import { readScenario } from '../engine/scenario/index.ts';
import { prepareScenario, solvePoint } from '../engine/solve/scenario.ts';

const now = () => performance.now();

function silencer(topHz: number): string {
  return JSON.stringify({
    format: 'quietgrid/1', title: 'bench: expansion chamber',
    sweep: { frequenciesHz: [topHz] }, mesh: { order: 4, pointsPerWavelength: 8 },
    duct: { sections: [{ name: 'in', length: 0.6, width: 0.2, height: 0.15 }, { name: 'chamber', length: 0.8, width: 0.6, height: 0.45 }, { name: 'out', length: 0.6, width: 0.2, height: 0.15 }] },
  });
}

const rows: string[][] = [['top Hz', 'dofs', 'nnz(A)', 'nnz(L)', 'fill L/A', 'GFlop', 'memory est. MB', 'prepare s', 'assemble s', 'factor s', 'solve s', 'GFlop/s']];
for (const topHz of [800, 1250, 2000]) {
  const t0 = now();
  const p = prepareScenario(readScenario(silencer(topHz)).scenario);
  const t1 = now();
  const r = solvePoint(p, topHz, now);
  const i = p.info, fill = i.factorNonzeros / ((i.nnz + i.dofs) / 2);
  rows.push([String(topHz), String(i.dofs), String(i.nnz), String(i.factorNonzeros), fill.toFixed(2), (i.factorFlops / 1e9).toFixed(2), (i.memoryEstimateBytes / 2 ** 20).toFixed(0),
    ((t1 - t0) / 1000).toFixed(2), r.stats.assembleSeconds.toFixed(2), r.stats.factorSeconds.toFixed(2), r.stats.solveSeconds.toFixed(2), (i.factorFlops / 1e9 / r.stats.factorSeconds).toFixed(2)]);
}
const widths = rows[0].map((_, c) => Math.max(...rows.map((r) => r[c].length)));
for (const r of rows) console.log(r.map((v, c) => v.padStart(widths[c])).join('  '));
console.log('\nfill: nonzeros of L against the lower triangle of A; prepare = grid, numbering, pattern and symbolic analysis (once per geometry).');

/**
 * A silencer's transmission loss, from the scenario file to the report, one layer of the engine at a time.
 *
 * What this shows
 *   The path every quietgrid sweep takes, written out: read a scenario, build its grid, analyse the matrix
 *   pattern once, then per frequency assemble, factor and solve, and finally turn the points into the report
 *   the command line writes. The sweep here runs the steps by hand in this thread; `quietgrid solve` and the
 *   app run the same steps through engine/sweep's scheduler in worker threads, and at the end this example
 *   checks that its hand-made sweep gives, bit for bit, what the problem's own solve gives.
 *
 * How to run
 *   npx tsx examples/sweep-a-silencer.ts                                  (the plant-room silencer demo)
 *   npx tsx examples/sweep-a-silencer.ts scenarios/office-plenum-offset-ports.json
 * It prints each step's figures and the spectrum; it writes nothing. The tests run it (tests/examples).
 */
import { readFileSync } from 'node:fs';
import { performance } from 'node:perf_hooks';
import { readScenario } from '../engine/scenario/index.ts';
import { prepareProblem } from '../engine/solve/prepare.ts';
import { analyzeMesh, SweepMemory } from '../engine/solve/linear.ts';
import { layerCellCounts } from '../engine/assembly/layers.ts';
import { factor, solve, relativeResidual } from '../engine/linalg/index.ts';
import { describeSweep } from '../engine/sweep/job.ts';
import { recordOf, reportInput } from '../engine/sweep/record.ts';
import type { SweepEvent } from '../engine/sweep/scheduler.ts';
import { buildReport, tableCsv } from '../engine/report/results.ts';

const file = process.argv[2] ?? 'scenarios/plant-room-supply-silencer.json';
const now = () => performance.now();

// 1. Read the scenario. The scenario layer owns the file: it parses and validates it (every problem named by
//    its field and fix) and fills in every default, listing what it chose.
const { scenario, warnings } = readScenario(readFileSync(file, 'utf8'));
console.log(`1. ${scenario.title}: ${scenario.kind}, ${scenario.sweep.frequenciesHz.length} frequencies, defaults used: ${scenario.defaultsUsed.map((d) => d.path).join(', ') || 'none'}`);

// 2. Build the grid. The problem owns its decisions (engine/solve/problem.ts): from the scenario's geometry it
//    grades a tensor grid for the top of the sweep, masks the solid cells, adds absorbing-layer cells beyond
//    every opening (a face cell has one stretched axis, an edge cell two, a corner cell three) and numbers the dofs.
const problem = prepareProblem(scenario);
const cells = layerCellCounts(problem.mesh.grid), i = problem.info;
console.log(`2. grid: ${i.elements} elements of order ${i.order}, ${i.dofs} dofs; cells ${cells.interior} interior, ${cells.face} face, ${cells.edge} edge, ${cells.corner} corner`);

// 3. Analyse once. The sparse direct solver orders the unknowns (nested dissection on the node lattice) and
//    computes the elimination tree and the factor's size from the matrix pattern alone, which no frequency changes.
const frequencies = scenario.sweep.frequenciesHz.filter((_, k) => k % 3 === 0);
const pattern = problem.system(frequencies[0]).A;
const symbolic = analyzeMesh(problem.mesh, pattern);
console.log(`3. analysis: ${pattern.colIdx.length} matrix entries, ${symbolic.nnzL} factor entries, ${(symbolic.flops / 1e9).toFixed(2)} Gflop per factorisation`);

// 4. Sweep: assemble, factor, solve. Per frequency the problem assembles A and b (its absorbing layers chosen
//    for that frequency), the solver factors A = LDLᵀ in memory kept from the last frequency and solves; the
//    problem reads the transmission loss off the solution and assesses it (its accuracy figures and flags).
const memory = new SweepMemory(symbolic);
const events: SweepEvent[] = [
  { type: 'queued', frequenciesHz: [...frequencies], checkHz: [], at: 0 },
  { type: 'ready', description: describeSweep(scenario, warnings, problem), prepareSeconds: 0, at: 0 },
];
for (const f of frequencies) {
  const t0 = now();
  const { A, b } = problem.system(f, memory.matrixValues());
  const t1 = now();
  const N = factor(A, symbolic, {}, memory.factor);
  const x = solve(N, b);
  const t2 = now();
  const stats = { assembleSeconds: (t1 - t0) / 1000, factorSeconds: (t2 - t1) / 1000, solveSeconds: 0, perturbedPivots: N.perturbed, residual: relativeResidual(A, x, b) };
  const point = problem.results(f, x, stats);
  events.push({ type: 'result', point: { ...point, accuracy: problem.assess(point) }, at: t2 });
  console.log(`4. ${f.toFixed(1)} Hz: assembled in ${stats.assembleSeconds.toFixed(2)} s, factored and solved in ${stats.factorSeconds.toFixed(2)} s, residual ${stats.residual.toExponential(1)}`);
}

// 5. Report. The run's events fold into a record (engine/sweep/record.ts), the record into the report's input,
//    and the report layer builds the tables and the summary exactly as `quietgrid solve` writes them.
const report = buildReport(reportInput(recordOf(events, 0), { totalSeconds: 0, peakMemoryBytes: null })!);
console.log('5. spectrum.csv:');
console.log(tableCsv(report.spectrum).trimEnd());
const flagged = report.summary.accuracy.flagsByFrequency.filter((x) => x.flags.length > 0);
console.log(`   flags: ${flagged.length === 0 ? 'none' : flagged.map((x) => `${x.frequencyHz.toFixed(1)} Hz ${x.flags.join(';')}`).join(', ')}`);

// The hand-made sweep is the problem's own: its solve (in its own kept memory) gives the same bits.
const last = frequencies[frequencies.length - 1], mine = events.at(-1) as Extract<SweepEvent, { type: 'result' }>, own = problem.solve(last, now);
if (mine.point.kind !== own.kind || JSON.stringify({ ...mine.point, stats: 0, accuracy: 0 }) !== JSON.stringify({ ...own, stats: 0, field: undefined, accuracy: 0 })) {
  throw new Error('the step-by-step sweep differs from problem.solve');
}
console.log(`   the step-by-step sweep equals problem.solve at ${last.toFixed(1)} Hz, bit for bit`);

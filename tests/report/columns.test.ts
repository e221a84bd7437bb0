// A per-point output declared once (engine/report/columns.ts) appears in the CLI's spectrum.csv and in the
// app's spectrum table: the solve's relative residual, solved here and read from both.
import { createElement } from 'react';
import { renderToStaticMarkup } from 'react-dom/server';
import { describe, expect, it } from 'vitest';
import { performance } from 'node:perf_hooks';
import { readScenario } from '../../engine/scenario/index.ts';
import { prepareProblem } from '../../engine/solve/prepare.ts';
import { ACCEPTED_RESIDUAL } from '../../engine/solve/linear.ts';
import { describeSweep, solveAndAssess } from '../../engine/sweep/job.ts';
import { recordOf, reportInput } from '../../engine/sweep/record.ts';
import { buildReport, tableCsv } from '../../engine/report/results.ts';
import { parseCsv } from '../../engine/report/csv.ts';
import { columnOf, DUCT_SPECTRUM, ROOM_SPECTRUM_TAIL } from '../../engine/report/columns.ts';
import { DataTable } from '../../app/renderer/components/ResultsView.tsx';

function report(json: object, f: number) {
  const s = readScenario(JSON.stringify({ format: 'quietgrid/1', sweep: { frequenciesHz: [f] }, ...json })).scenario, p = prepareProblem(s);
  const point = solveAndAssess(p, f, () => performance.now(), false);
  const record = recordOf([
    { type: 'queued', frequenciesHz: [f], checkHz: [], at: 0 },
    { type: 'ready', description: describeSweep(s, [], p), prepareSeconds: 0, at: 0 },
    { type: 'result', point, at: 0 },
  ], 0);
  return { point, report: buildReport(reportInput(record, { totalSeconds: 0, peakMemoryBytes: null })!) };
}

describe('the residual column', () => {
  const cases = [
    { kind: 'duct', json: { mesh: { order: 3 }, duct: { sections: [{ name: 'run', length: 0.6, width: 0.2, height: 0.15 }] } }, f: 300 },
    { kind: 'room', json: { mesh: { order: 3 }, room: { size: [1, 0.8, 0.6], walls: { 'x+': 'open' }, sources: [{ name: 's', position: [0.3, 0.4, 0.3], volumeVelocity: 1e-3 }], receivers: [{ name: 'ear', position: [0.7, 0.4, 0.3] }] } }, f: 150 },
  ];
  for (const c of cases) {
    it(`${c.kind}: spectrum.csv carries the solve's ‖Ax − b‖/‖b‖, and the app's table shows it under its label`, () => {
      const { point, report: r } = report(c.json, c.f);
      const [header, row] = parseCsv(tableCsv(r.spectrum)), i = header.indexOf('residual');
      expect(i).toBeGreaterThan(0);
      expect(Number(row[i])).toBe(Number(point.stats.residual.toPrecision(8)));
      // common practice: a direct solve with refinement ends near round-off; the engine refuses anything above ACCEPTED_RESIDUAL
      expect(point.stats.residual).toBeLessThanOrEqual(ACCEPTED_RESIDUAL);
      const html = renderToStaticMarkup(createElement(DataTable, { table: r.spectrum, receiverColumns: r.summary.receiverColumns, caption: 'spectrum' }));
      expect(html).toContain(`<th scope="col">${columnOf('residual').label}</th>`);
      expect(html).toContain(`<td>${point.stats.residual.toExponential(1)}</td>`);
    });
  }

  it('is declared once, for both kinds, as a diagnostic (runs may differ in it)', () => {
    expect(DUCT_SPECTRUM.filter((x) => x.name === 'residual')).toHaveLength(1);
    expect(ROOM_SPECTRUM_TAIL.filter((x) => x.name === 'residual')).toHaveLength(1);
    expect(columnOf('residual')).toMatchObject({ format: 'exponent', diagnostic: true });
  });
});

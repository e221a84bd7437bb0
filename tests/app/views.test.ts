// What the screens show, from plain data: the to-scale drawings, the plots' figures, the report tables
// the app exports, field-slice quantities, and components rendered from props.
import { createElement } from 'react';
import { renderToStaticMarkup } from 'react-dom/server';
import { describe, expect, it } from 'vitest';
import { buildGeometry, validateScenario, type Issue, type NormalisedScenario } from '../../engine/scenario/index.ts';
import { parseCsv } from '../../engine/report/csv.ts';
import { bandsBetween } from '../../engine/acoustics/index.ts';
import type { AssessedPoint } from '../../engine/solve/points.ts';
import { ACCURACY_LEGEND } from '../../engine/solve/assess.ts';
import { reportScenario } from '../../engine/sweep/record.ts';
import type { SweepEvent } from '../../engine/sweep/scheduler.ts';
import { alignViews, ductViews, roomViews } from '../../app/renderer/model/drawing.ts';
import { demoById } from '../../app/renderer/model/demos.ts';
import { getAt, setAt, type Draft } from '../../app/renderer/model/draft.ts';
import { bandFigure, spectrumFigure, sliceFigure } from '../../app/renderer/model/charts.ts';
import { bandTable, runReport, tableCsv } from '../../app/renderer/model/report.ts';
import { runEvent, startedRun, type RunState } from '../../app/renderer/model/run.ts';
import { bandTicks } from '../../app/renderer/model/ticks.ts';
import { instantaneous, sliceCsv, sliceRows, splDb } from '../../app/renderer/model/field.ts';
import { pointFlags } from '../../app/renderer/model/flags.ts';
import { indexIssues } from '../../app/renderer/model/issues.ts';
import { NumberField, type Form } from '../../app/renderer/components/form.tsx';
import { RunBar } from '../../app/renderer/components/RunBar.tsx';
import { SketchView } from '../../app/renderer/components/SketchView.tsx';
import { derive, runBlocker } from '../../app/renderer/model/scenario.ts';
import type { Slice } from '../../engine/sweep/protocol.ts';

function normalised(d: Draft): NormalisedScenario {
  const v = validateScenario(d);
  if (!v.ok) throw new Error(v.errors.map((e) => e.message).join('\n'));
  return v.scenario;
}
const demo = (id: string) => structuredClone(demoById(id)!.draft);

describe('drawings', () => {
  it('draw every section to scale and dimension its length', () => {
    const g = buildGeometry(normalised(demo('plant-room-supply-silencer')));
    const [plan, elevation] = alignViews(ductViews(g, 'mm'));
    const sections = plan.shapes.filter((s) => s.kind === 'section');
    expect(sections.map((s) => [s.name, s.rect.a1 - s.rect.a0, s.rect.b1 - s.rect.b0])).toEqual([['fan side', 0.4, 0.2], ['chamber', 0.6, 0.45], ['room side', 0.4, 0.2]].map(([n, a, b]) => [n, expect.closeTo(a as number, 12), expect.closeTo(b as number, 12)]));
    expect(elevation.shapes.filter((s) => s.kind === 'section').map((s) => s.label)).toEqual(['H 150 mm', 'H 350 mm', 'H 150 mm']);
    expect(plan.dimensions.filter((d) => d.along === 'a').map((d) => d.text)).toEqual(['400 mm', '600 mm', '400 mm', '1400 mm']);
    expect(plan.extent.a0).toBe(elevation.extent.a0);
    expect(plan.extent.a1).toBe(elevation.extent.a1);
  });
  it('mark the ports and put absorbing layers only where air continues', () => {
    const d = setAt(demo('plant-room-supply-silencer'), 'duct.outlet', 'rigid');
    const [plan] = ductViews(buildGeometry(normalised(d)), 'm');
    expect(plan.shapes.filter((s) => s.kind === 'absorber').map((s) => s.name)).toEqual(['inlet']);
    expect(plan.markers.map((m) => m.label)).toEqual(['inlet', 'closed end']);
    const [, open] = ductViews(buildGeometry(normalised(demo('plant-room-supply-silencer'))), 'm');
    expect(open.shapes.filter((s) => s.kind === 'absorber').map((s) => s.name)).toEqual(['inlet', 'outlet']);
  });
  it('show a branch on top in the elevation and as hidden in the plan', () => {
    const g = buildGeometry(normalised(demo('kitchen-extract-stub-resonator')));
    const [plan, elevation] = ductViews(g, 'mm');
    expect(plan.shapes.find((s) => s.name === 'tuned stub')?.kind).toBe('hidden-branch');
    const stub = elevation.shapes.find((s) => s.name === 'tuned stub')!;
    expect(stub.kind).toBe('branch');
    expect(stub.rect.b1 - stub.rect.b0).toBeCloseTo(0.23, 12);
    expect(elevation.dimensions.some((x) => x.along === 'b' && x.text === '230 mm')).toBe(true);
  });
  it('place a room\'s sources and receivers and mark its open wall', () => {
    const g = buildGeometry(normalised(demo('generator-room-small')));
    const [plan, elevation] = roomViews(g, 'm');
    expect(plan.markers.map((m) => [m.kind, m.label, m.a, m.b])).toEqual([['source', 'engine', 0.7, 0.8], ['receiver', 'operator', 1.2, 0.4], ['receiver', 'by the louvre', 1.8, 1.0]]);
    expect(elevation.markers[0].b).toBe(0.4);
    expect(plan.walls.filter((w) => w.open).map((w) => w.key)).toEqual(['x+']);
    expect(plan.shapes.filter((s) => s.kind === 'absorber').map((s) => s.name)).toEqual(['wall x+']);
  });
});

describe('band ticks', () => {
  it('are the nominal band centres of IEC 61260-1', () => {
    // Source: IEC 61260-1:2014, nominal midband frequencies (octaves 63, 125, 250, 500 Hz, 1 kHz).
    expect(bandTicks(50, 1200).labels).toEqual(['63', '125', '250', '500', '1k']);
    expect(bandTicks(100, 400).labels).toEqual(['100', '125', '160', '200', '250', '315', '400']);
    expect(bandTicks(100, 400).values).toEqual(bandsBetween(100 / 1.12, 400 * 1.12, 3).map((b) => b.exactHz));
  });
});

function ductPoint(f: number, tl: number, over: Partial<Extract<AssessedPoint, { kind: 'duct' }>> = {}, flags: string[] = []): AssessedPoint {
  return {
    kind: 'duct', frequencyHz: f, tlDb: tl, tlIntensityDb: tl, tlDecompositionDb: tl, method: 'intensity', inletReflection: 0.5, inletAbsorption: 0.75,
    incidentPower: 1, transmittedPower: 10 ** (-tl / 10), reflectedPower: 0.25, energyBalance: 1e-5,
    stats: { factorSeconds: 0, solveSeconds: 0, perturbedPivots: 0, residual: 0, assembleSeconds: 0 },
    accuracy: { frequencyHz: f, reflectionEstimate: 1e-5, energyBalance: 1e-5, orderCheckDb: null, tlPlaneDb: tl - 0.5, planeWaveValid: f < 381, flags },
    ...over,
  } as AssessedPoint;
}

/** A run that solved these points, folded from the events the scheduler would have sent. */
function solvedRun(points: AssessedPoint[], d: Draft): RunState {
  const s = normalised(d), info = {
    order: 4, pointsPerWavelength: 6, topFrequencyHz: 500, absorberKind: 'discrete', layers: 3, elements: 1, dofs: 1, nnz: 1, factorNonzeros: 1, factorFlops: 1, memoryEstimateBytes: 1, workerMemoryBytes: 2,
  };
  const cutOns = [{ section: 'chamber', modes: [{ m: 1, n: 0, frequencyHz: 381 }, { m: 5, n: 5, frequencyHz: 9000 }] }];
  const events: SweepEvent[] = [
    { type: 'queued', frequenciesHz: [...s.sweep.frequenciesHz], checkHz: [], at: 0 },
    { type: 'ready', description: { problem: { kind: 'duct', info, cutOns, planeWaveValidBelowHz: 381, planeWaveUnavailable: null, accuracy: ACCURACY_LEGEND }, scenario: reportScenario(s), warnings: [] }, prepareSeconds: 0, at: 0 },
    ...points.flatMap((p): SweepEvent[] => [{ type: 'started', job: { kind: 'solve', frequencyHz: p.frequencyHz }, worker: 0, at: 0 }, { type: 'result', point: p, at: 1000 }]),
    { type: 'done', cancelled: false, unsolved: [], at: 2000 },
  ];
  return events.reduce(runEvent, startedRun(1, s, d, [], 2, 0));
}

describe('results', () => {
  const d = setAt(demo('plant-room-supply-silencer'), 'sweep', { frequenciesHz: [125, 250, 500] });
  const run = solvedRun([ductPoint(250, 20), ductPoint(125, 10), ductPoint(500, 5, { energyBalance: 0.02 }, ['energy', 'plane_wave_invalid'])], d);
  it('export the spectrum exactly as the report builds it, rows ascending', () => {
    const report = runReport(run, 0)!;
    const rows = parseCsv(tableCsv(report.spectrum));
    expect(rows[0]).toEqual(report.spectrum.header);
    expect(rows.slice(1).map((r) => Number(r[0]))).toEqual([125, 250, 500]);
    expect(rows.slice(1).map((r) => Number(r[1]))).toEqual([10, 20, 5]);
  });
  it('give octave or third-octave band rows, with the outlet power in octaves', () => {
    const oct = bandTable(run, 1, 0)!, third = bandTable(run, 3, 0)!;
    expect(oct.rows.every((r) => r[oct.header.indexOf('bandwidth')] === 'octave')).toBe(true);
    expect(third.rows.every((r) => r[third.header.indexOf('bandwidth')] === 'third-octave')).toBe(true);
    const b250 = oct.rows.find((r) => r[0] === 250)!;
    // outlet Lw = source Lw − band TL (83 dB − 20 dB in the 250 Hz octave of the demo's fan)
    expect(b250[oct.header.indexOf('outlet_lw_db')]).toBeCloseTo(63, 9);
  });
  it('plot TL on a log axis, mark cut-ons inside the range and flag the doubtful point', () => {
    const fig = spectrumFigure(run);
    expect(fig.data[0]).toMatchObject({ type: 'scatter', x: [125, 250, 500], y: [10, 20, 5] });
    // the plane-wave estimate only where it holds (below the first cut-on)
    expect(fig.data.find((t) => String(t.name).startsWith('TL, plane-wave theory'))).toMatchObject({ x: [125, 250], y: [9.5, 19.5] });
    expect(fig.layout.xaxis).toMatchObject({ type: 'log', ticktext: ['125', '160', '200', '250', '315', '400', '500'] });
    const shapes = fig.layout.shapes as { x0: number }[];
    expect(shapes.map((s) => s.x0)).toEqual([381]);
    const flagged = fig.data.find((t) => t.name === 'check these points')!;
    expect(flagged.x).toEqual([500]);
    expect(fig.data.every((t) => !String(t.type).endsWith('gl'))).toBe(true);
  });
  it('flag the engine\'s accuracy flags with their meanings, and nothing of their own', () => {
    expect(pointFlags(ductPoint(100, 3))).toEqual([]);
    expect(pointFlags(ductPoint(100, 3, {}, ['energy']), { energy: 'power is lost' })).toEqual(['energy: power is lost']);
    expect(pointFlags(ductPoint(100, 3, {}, ['plane_wave_invalid']))).toEqual([]);
    expect(pointFlags(ductPoint(100, 3, {}, ['not_passive', 'near_singular']))).toEqual(['not_passive', 'near_singular']);
    // a reflection above 1 that the engine did not flag is not flagged here either: one rule, the engine's
    expect(pointFlags(ductPoint(100, 3, { inletReflection: 1.05 }))).toEqual([]);
  });
  it('chart band values as bars with band-centre labels', () => {
    const fig = bandFigure(bandTable(run, 1, 0)!, 'duct');
    expect(fig.data[0]).toMatchObject({ type: 'bar', x: ['63', '125', '250', '500'] });
  });
});

describe('field quantities', () => {
  it('use the RMS pressure re 20 µPa for levels', () => {
    // Source: ISO 1683:2015, reference sound pressure 20 µPa; a 1 Pa peak sine is 1/√2 Pa RMS → 90.97 dB.
    expect(splDb(1, 0)).toBeCloseTo(20 * Math.log10(1 / Math.SQRT2 / 20e-6), 12);
    expect(splDb(0, 1)).toBeCloseTo(90.969, 3);
  });
  it('animate Re{p e^{jωt}} with the e^{+jωt} convention', () => {
    // p = j: Re{j e^{jωt}} = −sin ωt, a quarter period after the real part's peak.
    expect(instantaneous(0, 1, Math.PI / 2)).toBeCloseTo(-1, 15);
    expect(instantaneous(2, 0, Math.PI)).toBeCloseTo(-2, 15);
  });
  const s: Slice = { frequencyHz: 100, axis: 1, position: 0.1, u: Float64Array.of(0.5, 1.5), v: Float64Array.of(0.25), re: Float64Array.of(1, NaN), im: Float64Array.of(0, NaN) };
  it('leave solid points blank in the heatmap and the CSV', () => {
    expect(sliceRows(s, 'real')).toEqual([[1, null]]);
    const rows = parseCsv(sliceCsv(s));
    expect(rows[0]).toEqual(['x_m', 'y_m', 'z_m', 'p_re_pa', 'p_im_pa', 'spl_db']);
    expect(rows[1].slice(0, 4).map(Number)).toEqual([0.5, 0.1, 0.25, 1]);
    expect(rows[2].slice(3)).toEqual(['', '', '']);
  });
  it('draw the slice as an SVG heatmap with a perceptually uniform scale and its unit', () => {
    const fig = sliceFigure(s, 'spl', 'mm');
    expect(fig.data[0]).toMatchObject({ type: 'heatmap', colorscale: 'Viridis', x: [500, 1500], y: [250] });
    expect((fig.data[0].colorbar as { title: { text: string } }).title.text).toBe('SPL, dB re 20 µPa');
    expect(sliceFigure(s, 'real', 'm').data[0]).toMatchObject({ colorscale: 'Cividis', zmin: -1, zmax: 1 });
  });
});

describe('components from props', () => {
  const plant = demo('plant-room-supply-silencer');
  const formFor = (d: Draft): Form => {
    const v = validateScenario(d);
    return { draft: d, errors: indexIssues(v.ok ? [] : v.errors), warnings: indexIssues(v.warnings), units: 'mm', onSet: () => undefined };
  };
  it('a number field shows its value in the chosen unit, and its problem in words under it', () => {
    const ok = renderToStaticMarkup(createElement(NumberField, { form: formFor(plant), path: 'duct.sections[1].width', label: 'Width (y)', unit: 'length' }));
    expect(ok).toContain('value="450"');
    expect(ok).not.toContain('aria-invalid');
    const bad = renderToStaticMarkup(createElement(NumberField, { form: formFor(setAt(plant, 'duct.sections[1].width', -5)), path: 'duct.sections[1].width', label: 'Width (y)', unit: 'length' }));
    expect(bad).toContain('aria-invalid="true"');
    expect(bad).toMatch(/<p class="issue" role="alert">The section width \(along y\) must be between 0.001 and 10000 m; fix: [^<]+<\/p>/);
    expect(bad).toContain('value="-5000"');
  });
  it('the run button is disabled and says why', () => {
    const blocker = runBlocker(derive(setAt(plant, 'duct.sections[1].width', -5)), false);
    const html = renderToStaticMarkup(createElement(RunBar, {
      status: 'idle', blocker, frequencies: [], progress: { done: 0, failed: 0, solving: 0, total: 0, elapsedSeconds: 0, remainingSeconds: null }, workers: 0, onRun: () => undefined, onCancel: () => undefined,
    }));
    expect(html).toMatch(/<button type="button" class="run" disabled="" aria-describedby="qg-run-blocker">/);
    expect(html).toContain('Cannot run: one problem in the scenario. First: duct.sections[1].width = -5');
  });
  it('the sketch lists the problems, marks the field and keeps drawing the last valid duct', () => {
    const d = setAt(plant, 'duct.sections[2].length', 'long');
    const g = buildGeometry(normalised(plant));
    const html = renderToStaticMarkup(createElement(SketchView, {
      form: formFor(d), errors: (validateScenario(d) as { errors: Issue[] }).errors, geometry: g, stale: true, geometryError: null,
      apply: () => undefined, onUnits: () => undefined, onJump: () => undefined,
    }));
    expect(html).toContain('One problem to fix before running');
    expect(html).toMatch(/data-path="duct\.sections\[2\]\.length"><label[^>]*>Length \(x\)<\/label><div class="with-unit"><input[^>]*aria-invalid="true"[^>]*value="long"/);
    expect(html).toContain('Showing the last valid sketch');
    expect((html.match(/class="shape section"/g) ?? []).length).toBe(6);
    expect(getAt(d, 'duct.sections[2].length')).toBe('long');
  });
});

import { describe, expect, it } from 'vitest';
import { buildReport, sanitiseName, tableCsv, type ReportInput, type ReportPoint, type ReportScenario } from '../../engine/report/results.ts';
import { bandOfNominal } from '../../engine/acoustics/index.ts';
import { parseCsv } from '../../engine/report/index.ts';

const STATS = { assembleSeconds: 0.5, factorSeconds: 2, solveSeconds: 0.25, perturbedPivots: 0 };
const INFO = {
  order: 4, pointsPerWavelength: 6, topFrequencyHz: 1000, absorberKind: 'discrete', layers: 3, elements: 10, dofs: 1234, nnz: 5678,
  factorNonzeros: 9000, factorFlops: 1e6, memoryEstimateBytes: 1e6, workerMemoryBytes: 2e6,
};

function duct(f: number, tlDb: number | null): ReportPoint {
  return { kind: 'duct', frequencyHz: f, tlDb, tlDecompositionDb: tlDb, inletReflection: 0.5, inletAbsorption: 0.75, energyBalance: 1e-6, method: tlDb === null ? 'none' : 'intensity', stats: STATS };
}

function ductScenario(spacing: string, sourcePower?: ReportScenario['sourcePower']): ReportScenario {
  return { title: 'test duct', kind: 'duct', defaultsUsed: [{ path: 'mesh.order', value: 4, why: 'not given' }], sweep: { spacing, frequenciesHz: [] }, sourcePower };
}

function input(scenario: ReportScenario, points: ReportPoint[], extra: Partial<ReportInput> = {}): ReportInput {
  return { scenario, info: INFO, cutOns: [], points, frequenciesHz: points.map((p) => p.frequencyHz), totalSeconds: 3, ...extra };
}

/** The exact midband of a nominal octave band, where a one-point-per-band sweep solves. */
const octave = (nominal: number) => bandOfNominal(nominal, 1)!.exactHz;

describe('spectrum table', () => {
  it('sorts the points by frequency and leaves TL blank for a closed outlet', () => {
    const r = buildReport(input(ductScenario('third-octave'), [duct(250, 3), duct(125, null)]));
    expect(r.spectrum.header).toEqual(['frequency_hz', 'tl_db', 'tl_decomposition_db', 'inlet_reflection', 'inlet_absorption', 'energy_balance', 'method', 'reflection_estimate', 'order_check_db', 'tl_plane_db', 'residual', 'flags']);
    expect(r.spectrum.rows.map((row) => row[0])).toEqual([125, 250]);
    expect(r.spectrum.rows[0][1]).toBeNull();
    expect(r.spectrum.rows[0][6]).toBe('none');
    expect(parseCsv(tableCsv(r.spectrum))[1][1]).toBe('');
  });

  it('names a column per receiver, sanitised and never twice the same', () => {
    expect(sanitiseName('By the Louvre (east)')).toBe('by_the_louvre_east');
    expect(sanitiseName('Éolienne')).toBe('eolienne');
    expect(sanitiseName('!!!')).toBe('unnamed');
    const scenario: ReportScenario = { title: 'room', kind: 'room', defaultsUsed: [], sweep: { spacing: 'list', frequenciesHz: [] }, room: { receivers: [{ name: 'a b' }, { name: 'a-b' }] } };
    const point: ReportPoint = { kind: 'room', frequencyHz: 100, receivers: [{ name: 'a b', splDb: 70 }, { name: 'a-b', splDb: 80 }], stats: STATS };
    const r = buildReport(input(scenario, [point]));
    expect(r.spectrum.header).toEqual(['frequency_hz', 'spl_db_a_b', 'spl_db_a_b_2', 'reflection_estimate', 'order_check_db', 'residual', 'flags']);
    expect(r.spectrum.rows).toEqual([[100, 70, 80, null, null, null, null]]);
    expect(r.summary.receiverColumns).toEqual({ spl_db_a_b: 'a b', spl_db_a_b_2: 'a-b' });
  });
});

describe('bands table', () => {
  it('band TL is that of the mean transmitted power ratio, not the mean of dB', () => {
    // two points in the 125 Hz octave: τ = 0.1 and 0.01, mean 0.055, TL = 10·log10(1/0.055) = 12.596 dB (a dB mean would say 15)
    const r = buildReport(input(ductScenario('octave'), [duct(110, 10), duct(140, 20)]));
    expect(r.bands.header).toEqual(['band_hz', 'band_low_hz', 'band_high_hz', 'bandwidth', 'points', 'tl_db']);
    expect(r.bands.rows).toHaveLength(1);
    const [nominal, low, high, width, points, tl] = r.bands.rows[0];
    expect([nominal, width, points]).toEqual([125, 'octave', 2]);
    // Source: IEC 61260-1:2014, base-10 octave band edges f_m·10^(∓3/20) around f_m = 1000·10^(−9/10) Hz
    expect(low as number).toBeCloseTo(1000 * 10 ** (-9 / 10) * 10 ** (-3 / 20), 8);
    expect(high as number).toBeCloseTo(1000 * 10 ** (-9 / 10) * 10 ** (3 / 20), 8);
    // common practice: band transmission loss from the band-averaged transmission coefficient (power ratio)
    expect(tl as number).toBeCloseTo(10 * Math.log10(1 / 0.055), 10);
  });

  it('room band levels are energy means of the point levels', () => {
    const scenario: ReportScenario = { title: 'room', kind: 'room', defaultsUsed: [], sweep: { spacing: 'third-octave', frequenciesHz: [] }, room: { receivers: [{ name: 'ear' }] } };
    const at = (f: number, splDb: number): ReportPoint => ({ kind: 'room', frequencyHz: f, receivers: [{ name: 'ear', splDb }], stats: STATS });
    const r = buildReport(input(scenario, [at(98, 60), at(102, 70), at(125, 50)]));
    expect(r.bands.header).toEqual(['band_hz', 'band_low_hz', 'band_high_hz', 'bandwidth', 'points', 'spl_db_ear']);
    expect(r.bands.rows.map((row) => [row[0], row[3], row[4]])).toEqual([[100, 'third-octave', 2], [125, 'third-octave', 1]]);
    // common practice: levels average as energies, 10·log10((10^6 + 10^7)/2)
    expect(r.bands.rows[0][5] as number).toBeCloseTo(10 * Math.log10((1e6 + 1e7) / 2), 10);
  });

  it('with a source power: outlet Lw = Lw − TL per octave, its A-weighted level, and the A-weighted total', () => {
    const power = { octaveBands: [125, 250, 500, 1000].map((nominalHz) => ({ nominalHz, levelDb: 90 })) };
    const r = buildReport(input(ductScenario('octave', power), [125, 250, 500, 1000].map((f) => duct(octave(f), 10))));
    expect(r.bands.header.slice(-3)).toEqual(['source_lw_db', 'outlet_lw_db', 'outlet_lwa_db']);
    expect(r.bands.rows).toHaveLength(4);
    expect(r.bands.rows.map((row) => row[7])).toEqual([80, 80, 80, 80]);
    // Source: IEC 61672-1:2013, table of frequency weightings (table number from memory): A = −16.1, −8.6, −3.2, 0.0 dB at 125, 250, 500, 1000 Hz
    const aTable = [-16.1, -8.6, -3.2, 0];
    r.bands.rows.forEach((row, i) => expect(Math.abs((row[8] as number) - (80 + aTable[i]))).toBeLessThan(0.05));
    const hand = 10 * Math.log10(aTable.reduce((sum, a) => sum + 10 ** ((80 + a) / 10), 0));
    // Source: IEC 61672-1:2013 weightings as above; the tabulated values are rounded to 0.1 dB, so the total agrees to 0.05 dB
    expect(Math.abs(r.summary.outletLwaTotalDb! - hand)).toBeLessThan(0.05);
  });

  it('a third-octave sweep with a source power gets octave rows after its own, the power columns only there', () => {
    const power = { octaveBands: [{ nominalHz: 125, levelDb: 90 }, { nominalHz: 250, levelDb: 85 }] };
    const r = buildReport(input(ductScenario('third-octave', power), [duct(100, 5), duct(125, 10), duct(160, 15)]));
    expect(r.bands.rows.map((row) => [row[0], row[3]])).toEqual([[100, 'third-octave'], [125, 'third-octave'], [160, 'third-octave'], [125, 'octave'], [250, 'octave']]);
    expect(r.bands.rows[0].slice(-3)).toEqual([null, null, null]);
    expect(r.bands.rows[3][4]).toBe(3);
    // the 250 Hz octave has a source power but no solved point: no outlet level, and so no A-weighted total
    expect(r.bands.rows[4].slice(4)).toEqual([0, null, 85, null, null]);
    expect(r.summary.outletLwaTotalDb).toBeNull();
    expect(r.summary.notes.join(' ')).toMatch(/A-weighted outlet total is unknown/);
  });
});

describe('summary', () => {
  it('carries the mesh, timings summed over the points, failures sorted, cautions and conventions', () => {
    const cutOns = [{ section: 'chamber', modes: [{ m: 1, n: 0, frequencyHz: 381.3 }] }];
    const failures = [{ frequencyHz: 500, message: 'singular' }, { frequencyHz: 200, message: 'crash' }];
    const r = buildReport(input(ductScenario('third-octave'), [duct(250, 3), duct(125, 4)], {
      cutOns, failures, frequenciesHz: [500, 125, 250, 200], peakMemoryBytes: 42, warnings: [{ message: 'careful' }],
    }));
    const s = r.summary;
    expect([s.title, s.kind, s.dofs, s.nnz, s.order, s.layers, s.absorberKind, s.elements, s.factorNonzeros, s.memoryEstimateBytes, s.workerMemoryBytes, s.peakMemoryBytes])
      .toEqual(['test duct', 'duct', 1234, 5678, 4, 3, 'discrete', 10, 9000, 1e6, 2e6, 42]);
    expect(s.cutOnHz).toEqual([{ section: 'chamber', modes: [{ m: 1, n: 0, hz: 381.3 }] }]);
    expect(s.timing).toEqual({ assemble_s: 1, factor_s: 4, solve_s: 0.5, total_s: 3 });
    expect(s.frequenciesHz).toEqual([125, 200, 250, 500]);
    expect(s.solvedFrequenciesHz).toEqual([125, 250]);
    expect(s.failures.map((f) => f.frequencyHz)).toEqual([200, 500]);
    expect(s.warnings).toEqual(['careful']);
    expect(s.defaultsUsed).toEqual([{ path: 'mesh.order', value: 4, why: 'not given' }]);
    expect(s.conventions).toMatch(/peak/);
    expect(s.conventions).toMatch(/ISO 1683/);
    expect(s.conventions).toMatch(/e\^\{\+jωt\}/);
    const lines = s.cautions.flatMap((c) => c.lines);
    expect(lines.some((l) => /85 dBA/.test(l))).toBe(true);
    expect(lines.some((l) => /No mean flow/.test(l))).toBe(true);
    expect(new Set(lines).size).toBe(lines.length);
    expect(JSON.parse(JSON.stringify(s))).toEqual(s);
  });
});

describe('accuracy columns', () => {
  const accurate = (f: number, accuracy: ReportPoint['accuracy']): ReportPoint => ({ ...(duct(f, 5) as ReportPoint & { kind: 'duct' }), accuracy });

  it('writes the estimate, the order check (blank where not run), tl_plane_db and the flags joined by ";"', () => {
    const r = buildReport(input(ductScenario('third-octave'), [
      accurate(500, { reflectionEstimate: 2e-2, orderCheckDb: null, tlPlaneDb: 6.5, flags: ['layer_reflection', 'plane_wave_invalid'] }),
      accurate(250, { reflectionEstimate: 1e-6, orderCheckDb: 0.01, tlPlaneDb: 4.5, flags: [] }),
    ], { accuracy: { reading: 'how to read', flagMeanings: { order: 'refine' }, thresholds: { orderCheckDb: 0.5 }, planeWaveValidBelowHz: 381, orderCheckedHz: [250] } }));
    const h = r.spectrum.header, col = (name: string) => r.spectrum.rows.map((row) => row[h.indexOf(name)]);
    expect(col('reflection_estimate')).toEqual([1e-6, 2e-2]);
    expect(col('order_check_db')).toEqual([0.01, null]);
    expect(col('tl_plane_db')).toEqual([4.5, 6.5]);
    expect(col('flags')).toEqual([null, 'layer_reflection;plane_wave_invalid']);
    const csv = parseCsv(tableCsv(r.spectrum));
    expect(csv[1][h.indexOf('flags')]).toBe('');
    expect(csv[2][h.indexOf('flags')]).toBe('layer_reflection;plane_wave_invalid');
    expect(csv[1][h.indexOf('energy_balance')]).toBe('0.000001');
    const a = r.summary.accuracy;
    expect(a.flagsByFrequency).toEqual([{ frequencyHz: 250, flags: [] }, { frequencyHz: 500, flags: ['layer_reflection', 'plane_wave_invalid'] }]);
    expect([a.reading, a.planeWaveValidBelowHz, a.orderCheckedHz, a.flagMeanings, a.orderCheckFailures]).toEqual(['how to read', 381, [250], { order: 'refine' }, []]);
  });

  it('without accuracy data (and a point read back without its residual) the columns are blank and the summary still says how to read them', () => {
    const r = buildReport(input(ductScenario('third-octave'), [duct(250, 3)]));
    expect(r.spectrum.rows[0].slice(7)).toEqual([null, null, null, null, null]);
    expect(r.summary.accuracy.reading).toMatch(/flags/);
    expect(r.summary.accuracy.flagsByFrequency).toEqual([{ frequencyHz: 250, flags: [] }]);
  });
});

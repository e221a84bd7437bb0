/**
 * The report of one run: per-frequency spectrum table, per-band table and a summary object, built
 * from plain data (the scenario, the mesh the solver picked, and the points solved, in any order).
 *
 * The input types below are structural on purpose: the report layer depends only on core and
 * acoustics, so it states the shapes it reads and the solver's and scenario's own types fit them.
 */
import {
  aWeightingDb,
  aWeightedTotal,
  bandFromIndex,
  bandIndexOf,
  bandLevel,
  bandTransmissionLoss,
  outletPowerLevels,
  type Band,
  type BandFraction,
  type BandValue,
} from '../acoustics/index.ts';
import { exposureCautions, modelAssumptions, type Caution } from './cautions.ts';
import { toCsv, type CsvCell } from './csv.ts';
import { cell, DUCT_SPECTRUM, ROOM_SPECTRUM_HEAD, ROOM_SPECTRUM_TAIL } from './columns.ts';

export interface ReportScenario {
  title: string;
  kind: 'duct' | 'room';
  defaultsUsed: readonly { path: string; value: unknown; why: string }[];
  sweep: { spacing: string; frequenciesHz: readonly number[] };
  sourcePower?: { octaveBands: readonly { nominalHz: number; levelDb: number }[] };
  room?: { receivers: readonly { name: string }[] };
}

export interface ReportMeshInfo {
  order: number;
  pointsPerWavelength: number;
  topFrequencyHz: number;
  absorberKind: string;
  layers: number;
  elements: number;
  dofs: number;
  nnz: number;
  factorNonzeros: number;
  factorFlops: number;
  memoryEstimateBytes: number; // the factorisation alone (symbolic estimate)
  workerMemoryBytes: number; // what one worker holds while it solves: prepared problem, matrix, factor, vectors
}

/** residual: the solve's ‖Ax − b‖/‖b‖ (absent where unknown, e.g. a point read back from a CSV without it). */
interface PointStats { assembleSeconds: number; factorSeconds: number; solveSeconds: number; perturbedPivots: number; residual?: number }

/** A point's own accuracy (engine/solve/assess.ts): null where a figure was not computed. */
export interface ReportAccuracy {
  reflectionEstimate: number | null;
  orderCheckDb: number | null;
  tlPlaneDb: number | null;
  flags: readonly string[];
}

/** How the run checked itself: the legend of the accuracy columns and flags, from the caller. */
export interface ReportAccuracyInfo {
  reading: string;
  flagMeanings: Readonly<Record<string, string>>;
  thresholds: Readonly<Record<string, number>>;
  /** Below this frequency tl_plane_db holds (the lowest first cut-on); null without a plane-wave estimate. */
  planeWaveValidBelowHz: number | null;
  /** The frequencies re-solved at order p + 1. */
  orderCheckedHz: readonly number[];
  /** Order-check solves that failed (the frequency's own result stands). */
  orderCheckFailures?: readonly ReportFailure[];
}

export interface ReportDuctPoint {
  kind: 'duct';
  frequencyHz: number;
  tlDb: number | null;
  tlDecompositionDb: number | null;
  inletReflection: number;
  inletAbsorption: number;
  energyBalance: number;
  method: string;
  stats: PointStats;
  accuracy?: ReportAccuracy;
}

export interface ReportRoomPoint {
  kind: 'room';
  frequencyHz: number;
  receivers: readonly { name: string; splDb: number }[];
  stats: PointStats;
  accuracy?: ReportAccuracy;
}

export type ReportPoint = ReportDuctPoint | ReportRoomPoint;

export interface ReportFailure { frequencyHz: number; message: string }

export interface ReportInput {
  scenario: ReportScenario;
  info: ReportMeshInfo;
  cutOns: readonly { section: string; modes: readonly { m: number; n: number; frequencyHz: number }[] }[];
  points: readonly ReportPoint[];
  /** The frequencies asked for (the sweep, or the --frequencies subset). */
  frequenciesHz: readonly number[];
  failures?: readonly ReportFailure[];
  warnings?: readonly { message: string }[];
  /** Wall-clock seconds of the whole run. */
  totalSeconds: number;
  /** Peak resident memory of the process, measured by the caller (null when unknown). */
  peakMemoryBytes?: number | null;
  /** Extra lines the caller wants in the summary (e.g. where an imported solution came from). */
  notes?: readonly string[];
  accuracy?: ReportAccuracyInfo;
}

export interface Table { header: string[]; rows: CsvCell[][] }

export interface Summary {
  title: string;
  kind: 'duct' | 'room';
  dofs: number;
  nnz: number;
  order: number;
  pointsPerWavelength: number;
  topFrequencyHz: number;
  layers: number;
  absorberKind: string;
  elements: number;
  factorNonzeros: number;
  factorFlops: number;
  memoryEstimateBytes: number;
  workerMemoryBytes: number;
  peakMemoryBytes: number | null;
  cutOnHz: { section: string; modes: { m: number; n: number; hz: number }[] }[];
  timing: { assemble_s: number; factor_s: number; solve_s: number; total_s: number };
  perturbedPivots: number;
  defaultsUsed: { path: string; value: unknown; why: string }[];
  warnings: string[];
  notes: string[];
  frequenciesHz: number[];
  solvedFrequenciesHz: number[];
  failures: ReportFailure[];
  /** Spectrum/bands column → receiver name, for room scenarios. */
  receiverColumns?: Record<string, string>;
  /** With sourcePower on a duct: A-weighted total of the outlet octave-band sound power. */
  outletLwaTotalDb?: number | null;
  accuracy: SummaryAccuracy;
  cautions: Caution[];
  conventions: string;
}

export interface SummaryAccuracy {
  /** How to read the accuracy columns and flags. */
  reading: string;
  flagMeanings: Record<string, string>;
  thresholds: Record<string, number>;
  planeWaveValidBelowHz: number | null;
  orderCheckedHz: number[];
  orderCheckFailures: ReportFailure[];
  /** Every solved frequency with the flags that fired there (empty: none). */
  flagsByFrequency: { frequencyHz: number; flags: string[] }[];
}

export interface Report { spectrum: Table; bands: Table; summary: Summary }

export const CONVENTIONS =
  'Complex amplitudes are peak values with time dependence e^{+jωt}; sound pressure levels use the RMS value |p|/√2 re 20 µPa and sound power levels re 1 pW (ISO 1683); TL = 10·log10(W_incident / W_transmitted).';

export const DEFAULT_ACCURACY_READING = 'Accuracy columns: reflection_estimate, energy_balance, order_check_db, tl_plane_db and flags (semicolon-separated names, empty when none fired); blank where not computed.';
const BAND_COLUMNS = ['band_hz', 'band_low_hz', 'band_high_hz', 'bandwidth', 'points'];
const POWER_COLUMNS = ['source_lw_db', 'outlet_lw_db', 'outlet_lwa_db'];

export function buildReport(input: ReportInput): Report {
  const points = [...input.points].sort((a, b) => a.frequencyHz - b.frequencyHz);
  const columns = receiverColumns(input.scenario);
  const spectrum = input.scenario.kind === 'duct' ? ductSpectrum(points as ReportDuctPoint[]) : roomSpectrum(points as ReportRoomPoint[], columns);
  const bandRows = input.scenario.kind === 'duct' ? ductBands(input.scenario, points as ReportDuctPoint[]) : roomBands(input.scenario, points as ReportRoomPoint[], columns);
  return { spectrum, bands: bandRows.table, summary: summary(input, points, columns, bandRows.outletLwaTotalDb) };
}

/** A table as RFC 4180 text. */
export function tableCsv(t: Table): string {
  return toCsv(t.header, t.rows);
}

// ---- spectrum ----

function ductSpectrum(points: readonly ReportDuctPoint[]): Table {
  return { header: DUCT_SPECTRUM.map((c) => c.name), rows: points.map((p) => DUCT_SPECTRUM.map((c) => c.value(p))) };
}

function roomSpectrum(points: readonly ReportRoomPoint[], columns: ReceiverColumn[]): Table {
  const rows = points.map((p) => [
    ...ROOM_SPECTRUM_HEAD.map((c) => c.value(p)), ...columns.map((c) => cell(p.receivers.find((r) => r.name === c.name)?.splDb ?? null)), ...ROOM_SPECTRUM_TAIL.map((c) => c.value(p)),
  ]);
  return { header: [...ROOM_SPECTRUM_HEAD.map((c) => c.name), ...columns.map((c) => c.header), ...ROOM_SPECTRUM_TAIL.map((c) => c.name)], rows };
}

interface ReceiverColumn { name: string; header: string }

function receiverColumns(s: ReportScenario): ReceiverColumn[] {
  const used = new Set<string>();
  return (s.room?.receivers ?? []).map(({ name }) => {
    const base = `spl_db_${sanitiseName(name)}`;
    let header = base;
    // Different names can sanitise alike ("by the louvre", "by-the-louvre"): number the later ones.
    for (let k = 2; used.has(header); k++) header = `${base}_${k}`;
    used.add(header);
    return { name, header };
  });
}

/** A name as a header fragment: lower case ASCII letters, digits and single underscores. */
export function sanitiseName(name: string): string {
  // NFKD splits accented letters into letter + combining mark; dropping the marks keeps "é" as "e".
  const s = name.normalize('NFKD').replace(/[\u0300-\u036f]/g, '').toLowerCase().replace(/[^a-z0-9]+/g, '_').replace(/^_+|_+$/g, '');
  return s === '' ? 'unnamed' : s;
}

// ---- bands ----

function sweepFraction(s: ReportScenario): BandFraction {
  // Linear, log and list sweeps have no bands of their own; third octaves are the finer common choice.
  return s.sweep.spacing === 'octave' ? 1 : 3;
}

/** Bands holding at least one of the frequencies, ascending. */
function bandsHolding(freqs: readonly number[], fraction: BandFraction): Band[] {
  const indices = [...new Set(freqs.map((f) => bandIndexOf(f, fraction)))].sort((a, b) => a - b);
  return indices.map((x) => bandFromIndex(x, fraction));
}

function bandCells(b: Band, points: number): CsvCell[] {
  return [b.nominalHz, b.lowHz, b.highHz, b.fraction === 1 ? 'octave' : 'third-octave', points];
}

function ductBands(s: ReportScenario, points: readonly ReportDuctPoint[]): { table: Table; outletLwaTotalDb?: number | null } {
  const freqs = points.map((p) => p.frequencyHz), tl = points.map((p) => p.tlDb ?? NaN);
  const fraction = sweepFraction(s), power = s.sourcePower?.octaveBands;
  const header = [...BAND_COLUMNS, 'tl_db', ...(power ? POWER_COLUMNS : [])];
  const tlRow = (v: BandValue) => [...bandCells(v.band, v.pointCount), cell(v.valueDb)];
  if (!power) return { table: { header, rows: bandTransmissionLoss(freqs, tl, fraction, bandsHolding(freqs, fraction)).map(tlRow) } };
  const rows: CsvCell[][] = [];
  if (fraction === 3) rows.push(...bandTransmissionLoss(freqs, tl, 3, bandsHolding(freqs, 3)).map((v) => [...tlRow(v), null, null, null]));
  const octaves = octavesFor(freqs, power.map((b) => b.nominalHz));
  const octaveTl = bandTransmissionLoss(freqs, tl, 1, octaves);
  const outlet = outletPowerLevels(power.map((b) => ({ bandHz: b.nominalHz, lwDb: b.levelDb })), octaveTl);
  for (const v of octaveTl) {
    const o = outlet.find((x) => x.bandHz === v.bandHz);
    const lwa = o ? o.outletLwDb + aWeightingDb(v.band.exactHz) : NaN;
    rows.push([...tlRow(v), cell(o?.sourceLwDb ?? null), cell(o?.outletLwDb ?? null), cell(lwa)]);
  }
  const total = aWeightedTotal(outlet.map((o) => ({ bandHz: o.bandHz, levelDb: o.outletLwDb })));
  return { table: { header, rows }, outletLwaTotalDb: Number.isFinite(total) ? total : null };
}

/** Octave bands holding a solved point or carrying a source power, ascending. */
function octavesFor(freqs: readonly number[], powerBandsHz: readonly number[]): Band[] {
  return bandsHolding([...freqs, ...powerBandsHz], 1);
}

function roomBands(s: ReportScenario, points: readonly ReportRoomPoint[], columns: ReceiverColumn[]): { table: Table; outletLwaTotalDb?: undefined } {
  const freqs = points.map((p) => p.frequencyHz), fraction = sweepFraction(s), bands = bandsHolding(freqs, fraction);
  const perReceiver = columns.map((c) => bandLevel(freqs, points.map((p) => p.receivers.find((r) => r.name === c.name)?.splDb ?? NaN), fraction, bands));
  const rows = bands.map((b, i) => [...bandCells(b, perReceiver[0]?.[i].pointCount ?? pointsIn(freqs, b)), ...perReceiver.map((v) => cell(v[i].valueDb))]);
  return { table: { header: [...BAND_COLUMNS, ...columns.map((c) => c.header)], rows } };
}

function pointsIn(freqs: readonly number[], b: Band): number {
  return freqs.filter((f) => bandIndexOf(f, b.fraction) === b.index).length;
}

// ---- summary ----

function summary(input: ReportInput, points: readonly ReportPoint[], columns: ReceiverColumn[], outletLwaTotalDb: number | null | undefined): Summary {
  const { scenario: s, info } = input;
  const notes = [...(input.notes ?? [])];
  if (s.kind === 'room' && s.sourcePower) notes.push('sourcePower is not applied to room levels yet: the receiver levels are those of the sources\' volume velocities as given.');
  if (outletLwaTotalDb === null) notes.push('The A-weighted outlet total is unknown: at least one octave band of the source power has no transmission loss (no solved frequency in it, or a rigid outlet).');
  const out: Summary = {
    title: s.title, kind: s.kind, dofs: info.dofs, nnz: info.nnz, order: info.order, pointsPerWavelength: info.pointsPerWavelength, topFrequencyHz: info.topFrequencyHz,
    layers: info.layers, absorberKind: info.absorberKind, elements: info.elements, factorNonzeros: info.factorNonzeros, factorFlops: info.factorFlops,
    memoryEstimateBytes: info.memoryEstimateBytes, workerMemoryBytes: info.workerMemoryBytes, peakMemoryBytes: input.peakMemoryBytes ?? null,
    cutOnHz: input.cutOns.map((c) => ({ section: c.section, modes: c.modes.map((m) => ({ m: m.m, n: m.n, hz: m.frequencyHz })) })),
    timing: timing(points, input.totalSeconds),
    perturbedPivots: points.reduce((sum, p) => sum + p.stats.perturbedPivots, 0),
    defaultsUsed: s.defaultsUsed.map((d) => ({ ...d })), warnings: (input.warnings ?? []).map((w) => w.message), notes,
    frequenciesHz: [...input.frequenciesHz].sort((a, b) => a - b), solvedFrequenciesHz: points.map((p) => p.frequencyHz),
    failures: [...(input.failures ?? [])].sort((a, b) => a.frequencyHz - b.frequencyHz).map((f) => ({ ...f })),
    accuracy: summaryAccuracy(input, points), cautions: cautions(), conventions: CONVENTIONS,
  };
  if (s.kind === 'room') out.receiverColumns = Object.fromEntries(columns.map((c) => [c.header, c.name]));
  if (outletLwaTotalDb !== undefined) out.outletLwaTotalDb = outletLwaTotalDb;
  return out;
}

function summaryAccuracy(input: ReportInput, points: readonly ReportPoint[]): SummaryAccuracy {
  const a = input.accuracy;
  return {
    reading: a?.reading ?? DEFAULT_ACCURACY_READING, flagMeanings: { ...(a?.flagMeanings ?? {}) }, thresholds: { ...(a?.thresholds ?? {}) },
    planeWaveValidBelowHz: a?.planeWaveValidBelowHz ?? null, orderCheckedHz: [...(a?.orderCheckedHz ?? [])].sort((x, y) => x - y),
    orderCheckFailures: [...(a?.orderCheckFailures ?? [])].map((f) => ({ ...f })),
    flagsByFrequency: points.map((p) => ({ frequencyHz: p.frequencyHz, flags: [...(p.accuracy?.flags ?? [])] })),
  };
}

function timing(points: readonly ReportPoint[], totalSeconds: number): Summary['timing'] {
  const sum = (key: 'assembleSeconds' | 'factorSeconds' | 'solveSeconds') => points.reduce((acc, p) => acc + p.stats[key], 0);
  return { assemble_s: sum('assembleSeconds'), factor_s: sum('factorSeconds'), solve_s: sum('solveSeconds'), total_s: totalSeconds };
}

/** The model's assumptions, then the exposure notes without repeating them. */
function cautions(): Caution[] {
  const model = modelAssumptions(), exposure = exposureCautions();
  return [model, { ...exposure, lines: exposure.lines.filter((l) => !model.lines.includes(l)) }];
}


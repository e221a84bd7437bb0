/**
 * The columns of the report's tables, each declared once: the machine name (the CSV header), a label in
 * words, how its numbers are shown, and, for the spectrum, how the value is read from a solved point.
 *
 * A new per-point output is one entry in DUCT_SPECTRUM or ROOM_SPECTRUM_TAIL: spectrum.csv (written by
 * `quietgrid solve` and exported by the app) and the app's spectrum table both follow these lists, and
 * `quietgrid merge` carries the column through (it must agree between runs unless it is `diagnostic`).
 */
import type { CsvCell } from './csv.ts';

/** How a column's numbers read on screen (the CSV always keeps 8 significant digits). */
export type ColumnFormat = 'hz' | 'count' | 'db' | 'db-fine' | 'ratio' | 'exponent' | 'text';

export interface Column {
  name: string;
  label: string;
  format: ColumnFormat;
  /** A figure about the computation, not a result: two runs of one problem may differ in it (merge allows it). */
  diagnostic?: boolean;
}

/** A spectrum column and how to read it from a point of kind P. */
export interface SpectrumColumn<P> extends Column {
  value: (p: P) => CsvCell;
}

/** What the spectrum reads of a point: its frequency, its solve's figures and its accuracy. */
export interface SpectrumPoint {
  frequencyHz: number;
  stats: { residual?: number };
  accuracy?: { reflectionEstimate: number | null; orderCheckDb: number | null; tlPlaneDb: number | null; flags: readonly string[] };
}

export interface SpectrumDuctPoint extends SpectrumPoint {
  tlDb: number | null;
  tlDecompositionDb: number | null;
  inletReflection: number;
  inletAbsorption: number;
  energyBalance: number;
  method: string;
}

/** A number for a table: blank when missing or not finite (CSV and JSON readers then agree it is absent). */
export function cell(v: number | null | undefined): CsvCell {
  return v === null || v === undefined || !Number.isFinite(v) ? null : v;
}

/** Flag names joined by ';' (no CSV quoting needed), empty when none fired or none were computed. */
function flagsCell(p: SpectrumPoint): CsvCell {
  return p.accuracy && p.accuracy.flags.length > 0 ? p.accuracy.flags.join(';') : null;
}

const FREQUENCY: SpectrumColumn<SpectrumPoint> = { name: 'frequency_hz', label: 'Frequency, Hz', format: 'hz', value: (p) => p.frequencyHz };
const REFLECTION_ESTIMATE: SpectrumColumn<SpectrumPoint> = { name: 'reflection_estimate', label: 'Layer |R| (predicted)', format: 'ratio', diagnostic: true, value: (p) => cell(p.accuracy?.reflectionEstimate) };
const ORDER_CHECK: SpectrumColumn<SpectrumPoint> = { name: 'order_check_db', label: 'Order check, dB', format: 'db-fine', diagnostic: true, value: (p) => cell(p.accuracy?.orderCheckDb) };
const RESIDUAL: SpectrumColumn<SpectrumPoint> = { name: 'residual', label: 'Residual ‖Ax − b‖/‖b‖', format: 'exponent', diagnostic: true, value: (p) => cell(p.stats.residual) };
const FLAGS: SpectrumColumn<SpectrumPoint> = { name: 'flags', label: 'Flags', format: 'text', diagnostic: true, value: flagsCell };

export const DUCT_SPECTRUM: readonly SpectrumColumn<SpectrumDuctPoint>[] = [
  FREQUENCY,
  { name: 'tl_db', label: 'TL, dB', format: 'db', value: (p) => cell(p.tlDb) },
  { name: 'tl_decomposition_db', label: 'TL (plane waves), dB', format: 'db', value: (p) => cell(p.tlDecompositionDb) },
  { name: 'inlet_reflection', label: '|R| at inlet', format: 'ratio', value: (p) => cell(p.inletReflection) },
  { name: 'inlet_absorption', label: 'Inlet absorption', format: 'ratio', value: (p) => cell(p.inletAbsorption) },
  { name: 'energy_balance', label: 'Energy balance', format: 'ratio', value: (p) => cell(p.energyBalance) },
  { name: 'method', label: 'Method', format: 'text', value: (p) => p.method },
  REFLECTION_ESTIMATE,
  ORDER_CHECK,
  { name: 'tl_plane_db', label: 'TL plane-wave theory, dB', format: 'db', diagnostic: true, value: (p) => cell(p.accuracy?.tlPlaneDb) },
  RESIDUAL,
  FLAGS,
];

/** A room's spectrum: the frequency, one level per receiver (receiverColumn), then these. */
export const ROOM_SPECTRUM_TAIL: readonly SpectrumColumn<SpectrumPoint>[] = [REFLECTION_ESTIMATE, ORDER_CHECK, RESIDUAL, FLAGS];
export const ROOM_SPECTRUM_HEAD: readonly SpectrumColumn<SpectrumPoint>[] = [FREQUENCY];

const BAND_TABLE: readonly Column[] = [
  { name: 'band_hz', label: 'Band, Hz', format: 'hz' },
  { name: 'band_low_hz', label: 'From, Hz', format: 'hz' },
  { name: 'band_high_hz', label: 'To, Hz', format: 'hz' },
  { name: 'bandwidth', label: 'Bandwidth', format: 'text' },
  { name: 'points', label: 'Points', format: 'count' },
  { name: 'tl_db', label: 'TL, dB', format: 'db' },
  { name: 'source_lw_db', label: 'Source Lw, dB', format: 'db' },
  { name: 'outlet_lw_db', label: 'Outlet Lw, dB', format: 'db' },
  { name: 'outlet_lwa_db', label: 'Outlet LwA, dB(A)', format: 'db' },
];

const KNOWN = new Map<string, Column>([...BAND_TABLE, ...DUCT_SPECTRUM, ...ROOM_SPECTRUM_TAIL].map((c) => [c.name, c]));

/** The receiver level column of a room's tables. */
export function receiverColumn(header: string, receiver: string): Column {
  return { name: header, label: `SPL ${receiver}, dB`, format: 'db' };
}

/** A column of the spectrum or band table by its header (receiverColumns: a room summary's header → receiver name). */
export function columnOf(header: string, receiverColumns?: Readonly<Record<string, string>>): Column {
  const receiver = receiverColumns?.[header];
  if (receiver !== undefined) return receiverColumn(header, receiver);
  return KNOWN.get(header) ?? { name: header, label: header, format: 'text' };
}

/**
 * The run's tables as the command line writes them (engine/report/results.ts), so the app's CSV files
 * and the CLI's are the same; plus the band table for the fraction the user picks to look at.
 */
import { buildReport, tableCsv, type Report, type ReportInput, type Table } from '../../../engine/report/results.ts';
import { reportInput } from '../../../engine/sweep/record.ts';
import type { CsvCell } from '../../../engine/report/csv.ts';
import type { RunState } from './run.ts';

/** The report's input for what the run has solved so far (engine/sweep/record.ts, as the command line builds it); null before anything was solved. */
export function runReportInput(run: RunState, now: number): ReportInput | null {
  if (run.record.points.length === 0) return null;
  return reportInput(run.record, { totalSeconds: ((run.finishedAt ?? now) - run.startedAt) / 1000, peakMemoryBytes: null });
}

/** The report of what the run has solved so far; null before anything was solved. */
export function runReport(run: RunState, now: number): Report | null {
  const input = runReportInput(run, now);
  return input && buildReport(input);
}

/**
 * Bands at the fraction asked for: the report built as if the sweep had that spacing, keeping only
 * the rows of that bandwidth (a third-octave report with a source power also carries octave rows).
 */
export function bandTable(run: RunState, fraction: 1 | 3, now: number): Table | null {
  const input = runReportInput(run, now);
  if (!input) return null;
  const spacing = fraction === 1 ? 'octave' : 'third-octave';
  const report = buildReport({ ...input, scenario: { ...input.scenario, sweep: { ...input.scenario.sweep, spacing } } });
  const col = report.bands.header.indexOf('bandwidth');
  return { header: report.bands.header, rows: report.bands.rows.filter((r) => r[col] === spacing) };
}

export function column(t: Table, name: string): CsvCell[] {
  const i = t.header.indexOf(name);
  return i < 0 ? [] : t.rows.map((r) => r[i]);
}

export function numbers(cells: readonly CsvCell[]): (number | null)[] {
  return cells.map((c) => (typeof c === 'number' && Number.isFinite(c) ? c : null));
}

export { tableCsv };

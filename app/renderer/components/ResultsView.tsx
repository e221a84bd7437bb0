/** Results: the spectrum, the band table and chart, and the cautions that go with levels people hear. */
import { useMemo } from 'react';
import type { Caution } from '../../../engine/report/cautions.ts';
import type { Report, Table } from '../../../engine/report/results.ts';
import { columnOf, type ColumnFormat } from '../../../engine/report/columns.ts';
import { bandFigure, powerFigure, powerTotals, spectrumFigure } from '../model/charts.ts';
import { pointFlags } from '../model/flags.ts';
import type { RunState } from '../model/run.ts';
import { formatHz, formatNumber, formatSeconds } from '../model/units.ts';
import type { PlotName } from '../services/plots.ts';
import { PlotlyChart } from './PlotlyChart.tsx';

export interface ResultsProps {
  run: RunState;
  report: Report | null;
  bands: Table | null;
  bandFraction: 1 | 3;
  cautions: readonly Caution[];
  onBandFraction(f: 1 | 3): void;
  onExportSpectrum(): void;
  onExportBands(): void;
  onExportSummary(): void;
  onExportPlot(name: PlotName): void;
}

export function Cautions({ cautions }: { cautions: readonly Caution[] }) {
  return (
    <aside className="cautions" aria-label="Cautions">
      {cautions.map((c) => (
        <section key={c.title}>
          <h3>{c.title}</h3>
          <ul>{c.lines.map((l, i) => <li key={i}>{l}</li>)}</ul>
          {c.sources.length > 0 && <>
            <h4>Sources</h4>
            <ol className="sources">{c.sources.map((s) => <li key={s}>{s}</li>)}</ol>
          </>}
        </section>
      ))}
      <p className="defer">These results support, and do not replace, local codes and regulations and the judgement of a licensed professional.</p>
    </aside>
  );
}

/** A cell as the table shows it, by its column's format (engine/report/columns.ts). */
export function cellText(v: unknown, format: ColumnFormat): string {
  if (v === null || v === undefined || v === '') return '–';
  if (typeof v !== 'number') return String(v);
  switch (format) {
    case 'ratio': return formatNumber(v, 3);
    case 'db-fine': return v.toFixed(2);
    case 'hz': case 'count': return formatNumber(v, 5);
    case 'exponent': return v.toExponential(1);
    case 'db': return v.toFixed(1);
    case 'text': return String(v);
  }
}

export function DataTable({ table, receiverColumns, hide = [], caption }: { table: Table; receiverColumns?: Record<string, string>; hide?: string[]; caption: string }) {
  // Columns with nothing in them (the power columns of third-octave rows) are left out.
  const cols = table.header.map((h, i) => ({ h, i, column: columnOf(h, receiverColumns) })).filter((c) => !hide.includes(c.h) && table.rows.some((r) => r[c.i] !== null && r[c.i] !== ''));
  return (
    <table className="data">
      <caption>{caption}</caption>
      <thead><tr>{cols.map((c) => <th key={c.h} scope="col">{c.column.label}</th>)}</tr></thead>
      <tbody>{table.rows.map((r, k) => <tr key={k}>{cols.map((c) => <td key={c.h}>{cellText(r[c.i], c.column.format)}</td>)}</tr>)}</tbody>
    </table>
  );
}

export function ResultsView(p: ResultsProps) {
  const { run, report, bands } = p;
  const spectrum = useMemo(() => spectrumFigure(run), [run]);
  const kind = run.scenario?.kind ?? 'duct';
  const receiverColumns = report?.summary.receiverColumns;
  const bandsFig = useMemo(() => (bands ? bandFigure(bands, kind, receiverColumns) : null), [bands, kind, receiverColumns]);
  const hasPower = !!bands && bands.header.includes('source_lw_db') && p.bandFraction === 1;
  const powerFig = useMemo(() => (hasPower && bands ? powerFigure(bands) : null), [hasPower, bands]);
  const totals = hasPower && bands ? powerTotals(bands) : null;
  if (run.status === 'idle' || !run.scenario) {
    return <div className="results empty-state"><p>No results yet. Sketch the duct or room, choose the sweep, then press <strong>Run sweep</strong>.</p><Cautions cautions={p.cautions} /></div>;
  }
  const { points, checks, frequencies, description } = run.record;
  const flagged = points.map((pt) => ({ f: pt.frequencyHz, reasons: pointFlags(pt, description?.problem.accuracy.flagMeanings) })).filter((x) => x.reasons.length > 0);
  const checked = checks.filter((c) => c.status === 'done');
  const failed = frequencies.filter((s) => s.status === 'failed');
  const info = description?.problem.info;
  return (
    <div className="results">
      <div className="results-main">
        <div className="results-head">
          <p className="summary-line" data-testid="results-summary">
            {points.length} of {frequencies.length} frequencies solved
            {info && <> · order {info.order}, {info.dofs.toLocaleString('en')} unknowns</>}
            {run.finishedAt !== null && <> · {formatSeconds((run.finishedAt - run.startedAt) / 1000)}</>}
            {checked.length > 0 && <> · order checked at {checked.map((c) => formatHz(c.frequencyHz)).join(', ')}</>}
            {run.status === 'cancelled' && <> · cancelled</>}
          </p>
          <div className="buttons">
            <button type="button" onClick={p.onExportSpectrum} disabled={!report}>Spectrum CSV</button>
            <button type="button" onClick={() => p.onExportPlot('spectrum')} disabled={!report}>Plot PNG</button>
            <button type="button" onClick={p.onExportSummary} disabled={!report}>Summary JSON</button>
          </div>
        </div>
        <PlotlyChart name="spectrum" data={spectrum.data} layout={spectrum.layout} height={380} label={kind === 'duct' ? 'Transmission loss against frequency' : 'Receiver levels against frequency'} />
        {(flagged.length > 0 || failed.length > 0) && (
          <ul className="flags" aria-label="Points to check">
            {flagged.map((x) => <li key={x.f}><strong>{formatHz(x.f)}</strong>: {x.reasons.join('; ')}</li>)}
            {failed.map((s) => <li key={s.frequencyHz} className="failed"><strong>{formatHz(s.frequencyHz)}</strong> failed: {s.message}</li>)}
          </ul>
        )}
        <div className="bands-head">
          <h2>Bands</h2>
          <div className="segmented" role="radiogroup" aria-label="Band width">
            {([1, 3] as const).map((f) => (
              <button key={f} type="button" role="radio" aria-checked={p.bandFraction === f} className={p.bandFraction === f ? 'on' : ''} onClick={() => p.onBandFraction(f)}>
                {f === 1 ? 'Octave' : 'Third-octave'}
              </button>
            ))}
          </div>
          <div className="buttons">
            <button type="button" onClick={p.onExportBands} disabled={!bands}>Bands CSV</button>
            <button type="button" onClick={() => p.onExportPlot('bands')} disabled={!bands}>Chart PNG</button>
          </div>
        </div>
        {bands && bandsFig ? <>
          <PlotlyChart name="bands" data={bandsFig.data} layout={bandsFig.layout} height={280} label="Band values" />
          <DataTable table={bands} receiverColumns={receiverColumns} hide={['bandwidth', 'band_low_hz', 'band_high_hz']}
            caption={`${p.bandFraction === 1 ? 'Octave' : 'Third-octave'} bands (IEC 61260-1); ${kind === 'duct' ? 'TL from the mean transmitted power in each band' : 'levels as energy means of the points in each band'}`} />
        </> : <p className="muted">No band values yet.</p>}
        {bands && bands.header.includes('source_lw_db') && p.bandFraction === 3 && (
          <p className="muted">The source sound power is given per octave band: choose <em>Octave</em> to see the outlet sound power and its A-weighted total.</p>
        )}
        {powerFig && totals && (
          <section className="power">
            <h2>Outlet sound power</h2>
            <p className="totals">
              Outlet, A-weighted total: <strong data-testid="outlet-lwa">{totals.outletDbA === null ? 'unknown (a band has no TL)' : `${totals.outletDbA.toFixed(1)} dB(A)`}</strong>
              {totals.sourceDbA !== null && <> · source {totals.sourceDbA.toFixed(1)} dB(A)</>}
            </p>
            <PlotlyChart name="power" data={powerFig.data} layout={powerFig.layout} height={280} label="Source and outlet sound power per octave band" />
          </section>
        )}
        {report && (
          <details className="spectrum-table">
            <summary>Spectrum table ({report.spectrum.rows.length} rows)</summary>
            <DataTable table={report.spectrum} receiverColumns={receiverColumns} caption="One row per solved frequency" />
          </details>
        )}
      </div>
      <Cautions cautions={p.cautions} />
    </div>
  );
}

/**
 * The plots as plotly figures (data and layout), built from the run and its report tables: plain
 * functions of plain data, so the screens stay thin and the figures can be checked in tests.
 * Only SVG trace types (scatter, bar, heatmap): nothing needs WebGL.
 */
import type { Table } from '../../../engine/report/results.ts';
import { aWeightedTotal } from '../../../engine/acoustics/index.ts';
import type { Slice } from '../../../engine/sweep/protocol.ts';
import { planeAxes } from '../../../engine/core/space.ts';
import { AXIS_NAMES, peakAmplitude, sliceRows, valueRange, type Quantity } from './field.ts';
import { pointFlags } from './flags.ts';
import { column, numbers } from './report.ts';
import type { RunState } from './run.ts';
import { bandLabel, bandTicks, logRange } from './ticks.ts';
import { formatHz, formatNumber, LENGTH_SCALE, type LengthUnit } from './units.ts';

export interface Figure { data: Record<string, unknown>[]; layout: Record<string, unknown> }

export const PALETTE = ['#1b6f6a', '#7b3fa0', '#b5561c', '#2f5fb3', '#8a7a12', '#b23a5b', '#3b7d2a', '#5b5b5b'];
const FLAG_COLOUR = '#c0392b';

function freqAxis(fromHz: number, toHz: number): Record<string, unknown> {
  const t = bandTicks(fromHz, toHz);
  return {
    type: 'log', title: { text: 'Frequency, Hz (band centres)' }, range: logRange(fromHz, toHz),
    tickvals: t.values, ticktext: t.labels, showgrid: true, gridcolor: '#e5e8eb', zeroline: false, linecolor: '#9aa5b1', ticks: 'outside',
  };
}

const VALUE_AXIS = { showgrid: true, gridcolor: '#e5e8eb', zeroline: false, linecolor: '#9aa5b1', ticks: 'outside' };

/** Transmission loss (duct) or receiver levels (room) against frequency, cut-on frequencies marked, doubtful points flagged. */
export function spectrumFigure(run: RunState): Figure {
  const { frequencies, points: pts, description } = run.record;
  const all = frequencies.map((s) => s.frequencyHz), lo = Math.min(...all), hi = Math.max(...all);
  const data: Record<string, unknown>[] = [];
  const shapes: Record<string, unknown>[] = [], annotations: Record<string, unknown>[] = [];
  let yTitle = 'Transmission loss, dB';
  if (run.scenario?.kind === 'room') {
    yTitle = 'Sound pressure level, dB re 20 µPa';
    const names = run.scenario.room.receivers.map((r) => r.name);
    names.forEach((name, i) => data.push({
      type: 'scatter', mode: 'lines+markers', name, x: pts.map((p) => p.frequencyHz),
      y: pts.map((p) => (p.kind === 'room' ? p.receivers.find((r) => r.name === name)?.splDb ?? null : null)),
      line: { color: PALETTE[i % PALETTE.length], width: 2 }, marker: { size: 6 },
      hovertemplate: `${name}: %{y:.1f} dB at %{x:.4g} Hz<extra></extra>`,
    }));
  } else {
    const duct = pts.filter((p) => p.kind === 'duct');
    data.push({
      type: 'scatter', mode: 'lines+markers', name: 'TL (transmitted power)', x: duct.map((p) => p.frequencyHz), y: duct.map((p) => p.tlDb),
      line: { color: PALETTE[0], width: 2.2 }, marker: { size: 6 }, hovertemplate: 'TL %{y:.2f} dB at %{x:.4g} Hz<extra></extra>',
    });
    const plane = duct.filter((p) => p.accuracy?.planeWaveValid && p.accuracy.tlPlaneDb !== null);
    if (plane.length > 0) data.push({
      type: 'scatter', mode: 'lines', name: 'TL, plane-wave theory (below cut-on)', x: plane.map((p) => p.frequencyHz), y: plane.map((p) => p.accuracy.tlPlaneDb),
      line: { color: PALETTE[3], width: 1.4, dash: 'dash' }, hovertemplate: 'plane-wave theory %{y:.2f} dB at %{x:.4g} Hz<extra></extra>',
    });
    const dec = duct.filter((p) => p.tlDecompositionDb !== null);
    if (dec.length > 0) data.push({
      type: 'scatter', mode: 'markers', name: 'TL (plane-wave decomposition, a cross-check)', x: dec.map((p) => p.frequencyHz), y: dec.map((p) => p.tlDecompositionDb),
      marker: { color: PALETTE[2], size: 9, symbol: 'x-thin-open', line: { width: 1.5, color: PALETTE[2] } }, hovertemplate: 'plane waves %{y:.2f} dB at %{x:.4g} Hz<extra></extra>',
    });
  }
  const flagged = pts.map((p) => ({ p, reasons: pointFlags(p, description?.problem.accuracy.flagMeanings) })).filter((x) => x.reasons.length > 0);
  if (flagged.length > 0) data.push({
    type: 'scatter', mode: 'markers', name: 'check these points', x: flagged.map((x) => x.p.frequencyHz),
    y: flagged.map((x) => (x.p.kind === 'duct' ? x.p.tlDb : x.p.receivers[0]?.splDb ?? null)),
    marker: { symbol: 'circle-open', size: 15, color: FLAG_COLOUR, line: { width: 2 } },
    text: flagged.map((x) => x.reasons.join('<br>')), hovertemplate: '%{x:.4g} Hz<br>%{text}<extra></extra>',
  });
  for (const c of description?.problem.cutOns ?? []) for (const m of c.modes) {
    if (m.frequencyHz < lo / 1.12 || m.frequencyHz > hi * 1.12) continue;
    shapes.push({ type: 'line', xref: 'x', yref: 'paper', x0: m.frequencyHz, x1: m.frequencyHz, y0: 0, y1: 1, line: { color: '#7b8794', width: 1, dash: 'dash' } });
    annotations.push({
      x: Math.log10(m.frequencyHz), xref: 'x', yref: 'paper', y: 1, yanchor: 'top', xanchor: 'right', textangle: -90, showarrow: false,
      text: `cut-on (${m.m},${m.n}) ${c.section}`, font: { size: 10, color: '#52606d' },
    });
  }
  return {
    data,
    layout: {
      xaxis: freqAxis(lo, hi), yaxis: { ...VALUE_AXIS, title: { text: yTitle } }, shapes, annotations,
      legend: { orientation: 'h', x: 0, y: -0.2 }, margin: { l: 64, r: 20, t: 16, b: 84 },
    },
  };
}

/** Band values as bars: TL per band (duct) or receiver levels per band (room). */
export function bandFigure(t: Table, kind: 'duct' | 'room', receiverColumns: Record<string, string> = {}): Figure {
  const labels = column(t, 'band_hz').map((b) => bandLabel(Number(b)));
  const series = kind === 'duct' ? [{ key: 'tl_db', name: 'Band TL' }] : Object.entries(receiverColumns).map(([key, name]) => ({ key, name }));
  const data = series.map((s, i) => ({
    type: 'bar', name: s.name, x: labels, y: numbers(column(t, s.key)), marker: { color: PALETTE[i % PALETTE.length] },
    hovertemplate: `${s.name}: %{y:.1f} dB in the %{x} Hz band<extra></extra>`,
  }));
  return {
    data,
    layout: {
      barmode: 'group', xaxis: { type: 'category', title: { text: 'Band centre, Hz' }, linecolor: '#9aa5b1' },
      yaxis: { ...VALUE_AXIS, title: { text: kind === 'duct' ? 'Band transmission loss, dB' : 'Band SPL, dB re 20 µPa' } },
      showlegend: kind === 'room', legend: { orientation: 'h', x: 0, y: -0.25 },
    },
  };
}

/** The A-weighted totals of the source and outlet octave-band powers (null when a band has no TL). */
export function powerTotals(t: Table): { sourceDbA: number | null; outletDbA: number | null } {
  const bands = numbers(column(t, 'band_hz')), src = numbers(column(t, 'source_lw_db')), out = numbers(column(t, 'outlet_lw_db'));
  const total = (levels: (number | null)[]) => {
    const given = bands.flatMap((b, i) => (b !== null && src[i] !== null ? [{ bandHz: b, levelDb: levels[i] ?? NaN }] : []));
    const v = given.length > 0 ? aWeightedTotal(given) : NaN;
    return Number.isFinite(v) ? v : null;
  };
  return { sourceDbA: total(src), outletDbA: total(out) };
}

/** Source and outlet sound power per octave band, dB re 1 pW. */
export function powerFigure(t: Table): Figure {
  const rows = numbers(column(t, 'source_lw_db')).map((v, i) => ({ i, v })).filter((r) => r.v !== null).map((r) => r.i);
  const pick = (name: string) => { const c = numbers(column(t, name)); return rows.map((i) => c[i]); };
  const labels = rows.map((i) => bandLabel(Number(column(t, 'band_hz')[i])));
  return {
    data: [
      { type: 'bar', name: 'Source Lw', x: labels, y: pick('source_lw_db'), marker: { color: '#9aa5b1' }, hovertemplate: 'source %{y:.1f} dB<extra></extra>' },
      { type: 'bar', name: 'Outlet Lw', x: labels, y: pick('outlet_lw_db'), marker: { color: PALETTE[0] }, hovertemplate: 'outlet %{y:.1f} dB<extra></extra>' },
      { type: 'bar', name: 'Outlet LwA', x: labels, y: pick('outlet_lwa_db'), marker: { color: PALETTE[1] }, hovertemplate: 'outlet A-weighted %{y:.1f} dB(A)<extra></extra>' },
    ],
    layout: {
      barmode: 'group', xaxis: { type: 'category', title: { text: 'Octave band, Hz' }, linecolor: '#9aa5b1' },
      yaxis: { ...VALUE_AXIS, title: { text: 'Sound power level, dB re 1 pW' } }, legend: { orientation: 'h', x: 0, y: -0.25 },
    },
  };
}

export const COLOUR_SCALES: Record<Quantity, string> = { spl: 'Viridis', real: 'Cividis' };

/** A slice as a heatmap over the actual geometry (solid points are gaps), equal scales on both axes. */
export function sliceFigure(s: Slice, quantity: Quantity, unit: LengthUnit, phase = 0): Figure {
  const [ua, va] = planeAxes(s.axis), k = LENGTH_SCALE[unit];
  const rows = sliceRows(s, quantity, phase);
  const peak = peakAmplitude(s), [lo, hi] = quantity === 'spl' ? valueRange(rows) : [-peak, peak];
  const title = quantity === 'spl' ? 'SPL, dB re 20 µPa' : 'Re p(t), Pa';
  return {
    data: [{
      type: 'heatmap', x: Array.from(s.u, (v) => v * k), y: Array.from(s.v, (v) => v * k), z: rows, zmin: lo, zmax: hi === lo ? lo + 1 : hi,
      colorscale: COLOUR_SCALES[quantity], zsmooth: false, hoverongaps: false,
      colorbar: { title: { text: title, side: 'right' }, thickness: 14 },
      hovertemplate: `${AXIS_NAMES[ua]} %{x:.4g} ${unit}, ${AXIS_NAMES[va]} %{y:.4g} ${unit}<br>%{z:.4g} ${quantity === 'spl' ? 'dB' : 'Pa'}<extra></extra>`,
    }],
    layout: {
      xaxis: { title: { text: `${AXIS_NAMES[ua]}, ${unit}` }, constrain: 'domain', linecolor: '#9aa5b1', ticks: 'outside', zeroline: false, showgrid: false },
      yaxis: { title: { text: `${AXIS_NAMES[va]}, ${unit}` }, scaleanchor: 'x', scaleratio: 1, constrain: 'domain', linecolor: '#9aa5b1', ticks: 'outside', zeroline: false, showgrid: false },
      margin: { l: 64, r: 20, t: 30, b: 52 },
      title: { text: `${formatHz(s.frequencyHz)}, plane ${AXIS_NAMES[s.axis]} = ${formatNumber(s.position * k, 4)} ${unit}`, font: { size: 13 }, x: 0, xanchor: 'left' },
    },
  };
}

/**
 * Field slices: a plane normal to x, y or z at a chosen position and frequency, shown as SPL or as the
 * instantaneous pressure, which can be animated over one period of the wave.
 */
import { useCallback, useEffect, useMemo, useRef } from 'react';
import { sliceFigure } from '../model/charts.ts';
import { AXIS_NAMES, sliceRows, type Quantity } from '../model/field.ts';
import { formatHz, formatNumber, LENGTH_SCALE, type LengthUnit } from '../model/units.ts';
import type { AxisIndex } from '../../../engine/core/space.ts';
import type { Slice } from '../../../engine/sweep/protocol.ts';
import { loadPlotly } from '../services/plots.ts';
import { PlotlyChart } from './PlotlyChart.tsx';
import type { FieldViewState } from '../controller.ts';

/** The controller's field-view state, plus what the view needs to draw it. */
export interface FieldProps extends FieldViewState {
  frequenciesHz: readonly number[];
  units: LengthUnit;
  onChange(change: { frequencyHz?: number; axis?: AxisIndex; position?: number; quantity?: Quantity; animate?: boolean }): void;
  onExportSlice(): void;
  onExportPlot(): void;
}

const FRAMES = 24;
const FRAME_MS = 1000 / 12;

/** Restyles the heatmap frame by frame through one period of Re{p e^{jωt}}. */
function useAnimation(slice: Slice | null, on: boolean) {
  const el = useRef<HTMLElement | null>(null), timer = useRef<number | null>(null);
  const frames = useMemo(() => (slice && on ? Array.from({ length: FRAMES }, (_, k) => sliceRows(slice, 'real', (2 * Math.PI * k) / FRAMES)) : null), [slice, on]);
  const stop = () => { if (timer.current !== null) { window.clearInterval(timer.current); timer.current = null; } };
  useEffect(() => stop, []);
  const onDrawn = useCallback((node: HTMLElement) => {
    el.current = node;
    stop();
    if (!frames) return;
    let k = 0;
    void loadPlotly().then((Plotly) => {
      stop();
      timer.current = window.setInterval(() => {
        k = (k + 1) % FRAMES;
        if (el.current) {
          el.current.dataset.frame = String(k);
          void Plotly.restyle(el.current, { z: [frames[k]] }, 0);
        }
      }, FRAME_MS);
    });
  }, [frames]);
  useEffect(() => { if (!frames) stop(); }, [frames]);
  return onDrawn;
}

export function FieldView(p: FieldProps) {
  const quantity: Quantity = p.animate ? 'real' : p.quantity;
  const figure = useMemo(() => (p.slice ? sliceFigure(p.slice, quantity, p.units) : null), [p.slice, quantity, p.units]);
  const onDrawn = useAnimation(p.slice, p.animate);
  if (p.frequenciesHz.length === 0 || !p.geometry) {
    return <div className="field-view empty-state"><p>No fields yet. Run a sweep: each solved frequency’s pressure field can then be sliced here.</p></div>;
  }
  const b = p.geometry.bounds, lo = [b.x0, b.y0, b.z0][p.axis], hi = [b.x1, b.y1, b.z1][p.axis];
  const position = p.position ?? (lo + hi) / 2, k = LENGTH_SCALE[p.units];
  return (
    <div className="field-view">
      <div className="slice-controls">
        <div className="field">
          <label htmlFor="qg-slice-f">Frequency</label>
          <select id="qg-slice-f" value={p.frequencyHz ?? ''} onChange={(e) => p.onChange({ frequencyHz: Number(e.target.value) })}>
            {p.frequenciesHz.map((f) => <option key={f} value={f}>{formatHz(f)}</option>)}
          </select>
        </div>
        <div className="field">
          <span className="label">Plane normal to</span>
          <div className="segmented" role="radiogroup" aria-label="Plane normal">
            {([0, 1, 2] as const).map((a) => (
              <button key={a} type="button" role="radio" aria-checked={p.axis === a} className={p.axis === a ? 'on' : ''} onClick={() => p.onChange({ axis: a })}>{AXIS_NAMES[a]}</button>
            ))}
          </div>
        </div>
        <div className="field slider">
          <label htmlFor="qg-slice-pos">Position {AXIS_NAMES[p.axis]} = <output>{formatNumber(position * k, 4)} {p.units}</output></label>
          <input id="qg-slice-pos" type="range" min={lo} max={hi} step="any" value={position} onChange={(e) => p.onChange({ position: Number(e.target.value) })} />
        </div>
        <div className="field">
          <span className="label">Show</span>
          <div className="segmented" role="radiogroup" aria-label="Quantity">
            <button type="button" role="radio" aria-checked={!p.animate && p.quantity === 'spl'} className={!p.animate && p.quantity === 'spl' ? 'on' : ''} onClick={() => p.onChange({ quantity: 'spl', animate: false })}>SPL</button>
            <button type="button" role="radio" aria-checked={!p.animate && p.quantity === 'real'} className={!p.animate && p.quantity === 'real' ? 'on' : ''} onClick={() => p.onChange({ quantity: 'real', animate: false })}>Re p</button>
            <button type="button" role="radio" aria-checked={p.animate} className={p.animate ? 'on' : ''} onClick={() => p.onChange({ animate: !p.animate })}>{p.animate ? '❚❚ Stop' : '▶ Animate'}</button>
          </div>
        </div>
        <div className="buttons">
          <button type="button" onClick={p.onExportSlice} disabled={!p.slice}>Slice CSV</button>
          <button type="button" onClick={p.onExportPlot} disabled={!p.slice}>Slice PNG</button>
        </div>
      </div>
      <p className="status-line" role="status">
        {p.status === 'loading' && 'Sampling the field…'}
        {p.status === 'error' && <span className="issue">{p.message}</span>}
        {p.status === 'ready' && p.slice && (p.animate
          ? `Re{p·e^(jωt)} over one period at ${formatHz(p.slice.frequencyHz)} (colour range fixed at ± the peak amplitude).`
          : quantity === 'spl' ? 'Sound pressure level from the RMS pressure |p|/√2 re 20 µPa; blank where solid.' : 'Real part of the complex peak pressure at t = 0; blank where solid.')}
      </p>
      {figure && <PlotlyChart name="slice" data={figure.data} layout={figure.layout} height={460} onDrawn={onDrawn} label="Field slice" />}
    </div>
  );
}

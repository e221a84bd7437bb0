/**
 * A plotly.js chart driven by props: each render hands the data and layout to Plotly.react. SVG traces
 * only (no WebGL), so it draws without a GPU. The chart registers under its name for PNG export.
 */
import { useEffect, useRef, useState } from 'react';
import type { Data, Layout } from 'plotly.js-dist-min';
import { loadPlotly, registerPlot, type PlotName } from '../services/plots.ts';

export interface PlotlyChartProps {
  name: PlotName;
  data: Data[];
  layout: Layout;
  height: number;
  /** Called with the plot element after each draw (animations restyle it directly). */
  onDrawn?: (el: HTMLElement) => void;
  label: string;
}

const CONFIG = { displaylogo: false, responsive: true, modeBarButtonsToRemove: ['sendDataToCloud', 'select2d', 'lasso2d'], toImageButtonOptions: { format: 'png', scale: 2 } };

export const BASE_LAYOUT: Layout = {
  font: { family: 'system-ui, -apple-system, "Segoe UI", Roboto, sans-serif', size: 12, color: '#1f2933' },
  paper_bgcolor: '#ffffff', plot_bgcolor: '#ffffff',
  margin: { l: 64, r: 20, t: 16, b: 52 },
  hoverlabel: { bgcolor: '#ffffff' },
};

export function PlotlyChart({ name, data, layout, height, onDrawn, label }: PlotlyChartProps) {
  const ref = useRef<HTMLDivElement>(null);
  const [error, setError] = useState<string | null>(null);
  useEffect(() => {
    const el = ref.current;
    if (!el) return;
    let live = true;
    loadPlotly().then((Plotly) => {
      if (!live) return undefined;
      return Plotly.react(el, data, { ...BASE_LAYOUT, ...layout, height }, CONFIG).then(() => {
        if (!live) return;
        el.dataset.drawn = String(Number(el.dataset.drawn ?? 0) + 1);
        onDrawn?.(el);
      });
    }).catch((e: unknown) => setError(e instanceof Error ? e.message : String(e)));
    return () => { live = false; };
  }, [data, layout, height, onDrawn]);
  useEffect(() => {
    const el = ref.current;
    registerPlot(name, el);
    return () => {
      registerPlot(name, null);
      if (el) void loadPlotly().then((Plotly) => Plotly.purge(el));
    };
  }, [name]);
  return (
    <div className="chart" role="figure" aria-label={label}>
      <div ref={ref} className="plot" data-plot={name} style={{ height }} />
      {error && <p className="issue">The plot could not be drawn: {error}</p>}
    </div>
  );
}

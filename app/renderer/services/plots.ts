/**
 * plotly.js, loaded on first use (it is large and the sketch does not need it), and the plots on
 * screen by name so that exports can find them.
 */
import type { PlotlyStatic } from 'plotly.js-dist-min';

let loading: Promise<PlotlyStatic> | null = null;

export function loadPlotly(): Promise<PlotlyStatic> {
  loading ??= import('plotly.js-dist-min').then((m) => (m as unknown as { default: PlotlyStatic }).default ?? (m as unknown as PlotlyStatic));
  return loading;
}

export type PlotName = 'spectrum' | 'bands' | 'power' | 'slice';

const plots = new Map<PlotName, HTMLElement>();

export function registerPlot(name: PlotName, el: HTMLElement | null): void {
  if (el) plots.set(name, el);
  else plots.delete(name);
}

export function plotElement(name: PlotName): HTMLElement | undefined {
  return plots.get(name);
}

/** The plot as PNG bytes, drawn by plotly at twice its size on screen. */
export async function plotPng(name: PlotName): Promise<Uint8Array | null> {
  const el = plots.get(name);
  if (!el) return null;
  const Plotly = await loadPlotly();
  const url = await Plotly.toImage(el, { format: 'png', width: Math.max(640, el.clientWidth), height: Math.max(400, el.clientHeight), scale: 2 });
  const b64 = url.slice(url.indexOf(',') + 1), bin = atob(b64), bytes = new Uint8Array(bin.length);
  for (let i = 0; i < bin.length; i++) bytes[i] = bin.charCodeAt(i);
  return bytes;
}

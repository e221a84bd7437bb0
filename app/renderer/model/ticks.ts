/** Log-frequency axes labelled at nominal band centres (IEC 61260-1): octaves, or third octaves over a narrow range. */
import { bandsBetween } from '../../../engine/acoustics/index.ts';
import { formatNumber } from './units.ts';

export interface Ticks { values: number[]; labels: string[] }

export function bandLabel(nominalHz: number): string {
  return nominalHz >= 1000 ? `${formatNumber(nominalHz / 1000, 3)}k` : formatNumber(nominalHz, 4);
}

/** Band-centre ticks for [fromHz, toHz]: third octaves when the range is under a decade, octaves otherwise. */
export function bandTicks(fromHz: number, toHz: number): Ticks {
  const lo = Math.max(1, Math.min(fromHz, toHz) / 1.12), hi = Math.max(fromHz, toHz) * 1.12;
  const fraction = hi / lo < 10 ? 3 : 1;
  const bands = bandsBetween(lo, hi, fraction);
  const values = bands.map((b) => b.exactHz);
  return { values, labels: bands.map((b) => bandLabel(b.nominalHz)) };
}

/** A log axis range (plotly's log10 units) a little wider than the data. */
export function logRange(fromHz: number, toHz: number): [number, number] {
  const lo = Math.min(fromHz, toHz), hi = Math.max(fromHz, toHz);
  return [Math.log10(lo / 1.12), Math.log10(hi * 1.12)];
}

/**
 * What the field view shows of a slice: sound pressure level from the RMS value |p|/√2 re 20 µPa, or the
 * instantaneous pressure Re{p e^{jωt}} (time dependence e^{+jωt}, p a peak amplitude); solid points blank.
 */
import { toCsv } from '../../../engine/report/csv.ts';
import { AXES, planeAxes, splDb as splOfPeak } from '../../../engine/core/index.ts';
import type { Slice } from '../../../engine/sweep/protocol.ts';

export type Quantity = 'spl' | 'real';

export const AXIS_NAMES = AXES;

/** Level of a complex peak pressure, dB re 20 µPa (engine/core/levels.ts). */
export function splDb(re: number, im: number): number {
  return splOfPeak(Math.hypot(re, im));
}

/** Re{p e^{jωt}} at phase ωt. */
export function instantaneous(re: number, im: number, phase: number): number {
  return re * Math.cos(phase) - im * Math.sin(phase);
}

/** The slice as rows (one per v sample) for a heatmap; null where solid. */
export function sliceRows(s: Slice, quantity: Quantity, phase = 0): (number | null)[][] {
  const nu = s.u.length, rows: (number | null)[][] = [];
  for (let j = 0; j < s.v.length; j++) {
    const row: (number | null)[] = [];
    for (let i = 0; i < nu; i++) {
      const k = i + nu * j, re = s.re[k], im = s.im[k];
      if (Number.isNaN(re)) { row.push(null); continue; }
      const v = quantity === 'spl' ? splDb(re, im) : instantaneous(re, im, phase);
      row.push(Number.isFinite(v) ? v : null);
    }
    rows.push(row);
  }
  return rows;
}

/** Largest |p| of the slice, Pa: the fixed colour range ±max of an animation. */
export function peakAmplitude(s: Slice): number {
  let m = 0;
  for (let k = 0; k < s.re.length; k++) if (!Number.isNaN(s.re[k])) m = Math.max(m, Math.hypot(s.re[k], s.im[k]));
  return m;
}

/** Finite range of the values, for the colour scale. */
export function valueRange(rows: (number | null)[][]): [number, number] {
  let lo = Infinity, hi = -Infinity;
  for (const r of rows) for (const v of r) if (v !== null) { lo = Math.min(lo, v); hi = Math.max(hi, v); }
  return lo <= hi ? [lo, hi] : [0, 1];
}

/** The slice as CSV: one row per sample point with x, y, z in m, the complex peak pressure and the level; solid points blank. */
export function sliceCsv(s: Slice): string {
  const [ua, va] = planeAxes(s.axis), rows: (number | null)[][] = [];
  for (let j = 0; j < s.v.length; j++) for (let i = 0; i < s.u.length; i++) {
    const xyz = [0, 0, 0];
    xyz[s.axis] = s.position; xyz[ua] = s.u[i]; xyz[va] = s.v[j];
    const k = i + s.u.length * j, re = s.re[k], im = s.im[k], solid = Number.isNaN(re);
    rows.push([...xyz, solid ? null : re, solid ? null : im, solid ? null : splDb(re, im)]);
  }
  return toCsv(['x_m', 'y_m', 'z_m', 'p_re_pa', 'p_im_pa', 'spl_db'], rows);
}

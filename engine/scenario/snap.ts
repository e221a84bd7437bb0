/**
 * Coordinates that should coincide but differ by rounding (0.3 − 0.03 against 0.27, a sum of
 * section lengths) are made exactly equal, so that faces meant to meet do meet in the mesh.
 */
import { SNAP_TOLERANCE } from '../core/space.ts';

// Sums of decimal lengths carry noise near 1e-16 m; rounding to 1e-12 m removes it for any duct
// under a kilometre (v·1e12 stays below 2^53), long before the snap tolerance matters.
const TIDY_STEP = 1e12;
const TIDY_LIMIT = 1e3;

export function tidy(v: number): number {
  const t = Math.abs(v) < TIDY_LIMIT ? Math.round(v * TIDY_STEP) / TIDY_STEP : v;
  return t === 0 ? 0 : t; // no −0 in the output
}

/** A map sending each of `values`, and anything within the tolerance of one, to its cluster's smallest member. */
export function snapper(values: readonly number[], tolerance = SNAP_TOLERANCE): (v: number) => number {
  const sorted = [...new Set(values.map(tidy))].sort((a, b) => a - b);
  const representatives: number[] = [];
  const uppers: number[] = [];
  for (const v of sorted) {
    if (uppers.length > 0 && v - uppers[uppers.length - 1] < tolerance) uppers[uppers.length - 1] = v;
    else {
      representatives.push(v);
      uppers.push(v);
    }
  }
  return (v: number) => {
    const t = tidy(v);
    let lo = 0, hi = uppers.length - 1;
    while (lo < hi) {
      const mid = (lo + hi) >> 1;
      if (uppers[mid] + tolerance <= t) lo = mid + 1;
      else hi = mid;
    }
    return uppers.length > 0 && t > representatives[lo] - tolerance && t < uppers[lo] + tolerance ? representatives[lo] : t;
  };
}

/** Sorted, exactly unique values. */
export function uniqueSorted(values: readonly number[]): number[] {
  return [...new Set(values)].sort((a, b) => a - b);
}

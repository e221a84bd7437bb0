/**
 * The fitted spectrum between solved points, with an error estimate at every frequency.
 *
 * The curve is one AAA fit of all output channels over all samples (aaa.ts). Its error is estimated
 * by cross-validation: K more fits, fit j leaving out every K-th interior sample starting at the j-th,
 * and the estimate at f is the largest disagreement |r_j(f) − r(f)| (per channel). Comparing two
 * rational models built from different data and sampling where they differ most is the adaptive
 * scheme of Lehmensiek & Meyer, Creating accurate multivariate rational interpolation models of
 * microwave circuits by using efficient adaptive sampling to minimize the number of computational
 * electromagnetic analyses, IEEE Trans. Microwave Theory Tech. 49 (2001) 1419–1430.
 *
 * Why this bounds the error most of the time: each leave-out fit has three quarters of the data,
 * and a rational fit's error falls fast with the data (geometrically for functions analytic near the
 * band), so the leave-out fits are further from the truth than the full fit and their spread around
 * it exceeds its own error. Where the samples miss a feature (a resonance between two samples), the
 * fit that lost the nearest sample disagrees most, which is also where the next solve helps most.
 * What no estimate built from the samples can see is a feature that leaves no trace in any sample
 * (a resonance much narrower than the spacing, far from every sample): the policy's coarse start and
 * its minimum number of points per band bound the spacing for that reason (policy.ts). The ends of
 * the sampled range are never left out, so the estimate there leans on the next samples inward.
 *
 * Below the estimate sits a floor: the data's own accuracy (`noise`, relative to each channel's
 * largest magnitude) and the full fit's mismatch at its own samples.
 */
import { aaa, evaluateFit, polesOf, type AaaOptions, type Pole, type RationalFit } from './aaa.ts';
import type { SampleTable } from './samples.ts';

export interface SpectrumFitOptions extends AaaOptions {
  /** Leave-out fits for the error estimate. Default 4 (each leaves out a quarter of the interior samples). */
  folds?: number;
  /** Relative accuracy of the solved values themselves. Default 1e-9. */
  noise?: number;
}

/** Values and error estimates of every channel at one frequency (arrays of length `channels`). */
export interface FitPoint {
  re: Float64Array;
  im: Float64Array;
  /** Estimated |fit − truth| per channel, in the channel's units; +∞ where nothing can be said. */
  error: Float64Array;
  /** True at a solved frequency (the value is the sample itself). */
  solved: boolean;
}

export interface SpectrumFit {
  readonly channels: number;
  /** The solved frequencies, ascending. */
  readonly solvedHz: Float64Array;
  readonly fromHz: number;
  readonly toHz: number;
  /** The fit of all samples: the curve. */
  readonly main: RationalFit;
  /** The leave-out fits: the error estimate. */
  readonly folds: readonly RationalFit[];
  /** Error floor per channel (noise and the main fit's own mismatch), in channel units. */
  readonly floor: Float64Array;
  /** Value and error of each channel at f (out from `fitPoint`). */
  at(frequencyHz: number, out: FitPoint): void;
  /** Poles of the curve in Hz (complex frequency) with each channel's residue, ascending in real part. */
  poles(): Pole[];
}

export const DEFAULT_FOLDS = 4;
export const DEFAULT_NOISE = 1e-9;

export function fitPoint(channels: number): FitPoint {
  return { re: new Float64Array(channels), im: new Float64Array(channels), error: new Float64Array(channels), solved: false };
}

export function fitSpectrum(table: SampleTable, options: SpectrumFitOptions = {}): SpectrumFit {
  const n = table.frequencyHz.length, C = table.channels;
  if (n === 0) throw new RangeError('a spectrum fit needs at least one solved point');
  const folds = options.folds ?? DEFAULT_FOLDS, noise = options.noise ?? DEFAULT_NOISE;
  const aaaOptions: AaaOptions = { tolerance: Math.max(options.tolerance ?? 0, noise * 1e-1, 1e-13), maxSupport: options.maxSupport, cleanup: options.cleanup, cleanupTolerance: Math.max(options.cleanupTolerance ?? 0, noise * 1e-1, 1e-13) };
  const main = aaa(table.frequencyHz, table.re, table.im, C, aaaOptions);
  const foldFits: RationalFit[] = [];
  for (let j = 0; j < folds; j++) {
    const keep: number[] = [];
    for (let i = 0; i < n; i++) if (i === 0 || i === n - 1 || (i - 1) % folds !== j) keep.push(i);
    if (keep.length === n) continue;
    foldFits.push(aaa(pick(table.frequencyHz, keep, 1), pick(table.re, keep, C), pick(table.im, keep, C), C, aaaOptions));
  }
  const floor = Float64Array.from(main.scale, (s) => s * Math.max(noise, main.sampleError));
  const solvedHz = table.frequencyHz;
  const tmpRe = new Float64Array(C), tmpIm = new Float64Array(C);
  let poles: Pole[] | null = null;
  return {
    channels: C, solvedHz, fromHz: solvedHz[0], toHz: solvedHz[n - 1], main, folds: foldFits, floor,
    at(frequencyHz, out) {
      evaluateFit(main, frequencyHz, out.re, out.im);
      out.solved = isSolved(solvedHz, frequencyHz);
      if (out.solved) {
        out.error.set(floor);
        return;
      }
      if (foldFits.length === 0) {
        out.error.fill(Infinity);
        return;
      }
      out.error.fill(0);
      for (const fold of foldFits) {
        evaluateFit(fold, frequencyHz, tmpRe, tmpIm);
        for (let c = 0; c < C; c++) {
          const d = Math.hypot(tmpRe[c] - out.re[c], tmpIm[c] - out.im[c]);
          out.error[c] = Math.max(out.error[c], Number.isNaN(d) ? Infinity : d);
        }
      }
      for (let c = 0; c < C; c++) out.error[c] = Math.max(out.error[c], floor[c]);
    },
    poles() {
      poles ??= polesOf(main);
      return poles;
    },
  };
}

function pick(a: Float64Array, rows: readonly number[], width: number): Float64Array {
  const out = new Float64Array(rows.length * width);
  rows.forEach((i, k) => out.set(a.subarray(i * width, (i + 1) * width), k * width));
  return out;
}

function isSolved(sorted: Float64Array, f: number): boolean {
  let lo = 0, hi = sorted.length - 1;
  while (lo <= hi) {
    const mid = (lo + hi) >> 1;
    if (sorted[mid] === f) return true;
    if (sorted[mid] < f) lo = mid + 1;
    else hi = mid - 1;
  }
  return false;
}

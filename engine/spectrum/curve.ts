/**
 * The fitted spectrum over the whole sampled range, in pieces: one fit (fit.ts) per one-third-octave
 * band of IEC 61260-1, made from the samples of that band and of one band on either side. Octave
 * bands are unions of three thirds (the base-10 edges nest exactly), so every band value is built from
 * these pieces. Each piece's fit sees its band and a little beyond (half a band width, and at least two
 * samples, on either side) so that the band's edges are interior to the fit. Local fits keep the degree low (a few poles per piece instead of every resonance of
 * the range), keep a feature's influence local, and let a new sample refit only the pieces near it.
 */
import { bandIndexOf, bandFromIndex, OCTAVE_RATIO } from '../acoustics/bands.ts';
import { fitSpectrum, type FitPoint, type SpectrumFit, type SpectrumFitOptions } from './fit.ts';
import type { Pole } from './aaa.ts';
import type { SampleTable } from './samples.ts';

export interface CurveOptions extends SpectrumFitOptions {
  /** Samples within this ratio beyond a piece's edges join its fit (and at least two on each side). Default half a third-octave, 10^(1/20). */
  windowRatio?: number;
}

export interface SpectrumCurve {
  readonly table: SampleTable;
  readonly channels: number;
  /** Lowest and highest solved frequency. */
  readonly fromHz: number;
  readonly toHz: number;
  /** The fit that serves the one-third-octave band `index` (bands.ts numbering); null without samples near it. */
  piece(index: number): SpectrumFit | null;
  /** Value and error of every channel at f, from the piece that holds f (error +∞ outside the sampled range). */
  at(frequencyHz: number, out: FitPoint): void;
  /** Poles of the pieces over [fromHz, toHz], each from the piece whose band holds its real part. */
  poles(fromHz: number, toHz: number): Pole[];
}

/** Fits kept between calls, keyed by the samples they were made from. */
export type FitCache = Map<string, SpectrumFit>;

export const THIRD_OCTAVE_RATIO = OCTAVE_RATIO ** (1 / 3);
const MARGIN = 2;

export function spectrumCurve(table: SampleTable, options: CurveOptions = {}, cache: FitCache = new Map()): SpectrumCurve {
  const n = table.frequencyHz.length, C = table.channels;
  const ratio = options.windowRatio ?? Math.sqrt(THIRD_OCTAVE_RATIO);
  const pieces = new Map<number, SpectrumFit | null>();
  const piece = (index: number): SpectrumFit | null => {
    const known = pieces.get(index);
    if (known !== undefined) return known;
    const band = bandFromIndex(index, 3);
    // the band, the samples within `ratio` beyond its edges, and at least MARGIN samples beyond each edge
    const first = lowerBound(table.frequencyHz, band.lowHz * (1 - 1e-12)), after = upperBound(table.frequencyHz, band.highHz * (1 + 1e-12));
    const from = Math.min(lowerBound(table.frequencyHz, (band.lowHz / ratio) * (1 - 1e-12)), Math.max(0, first - MARGIN));
    const to = Math.max(upperBound(table.frequencyHz, band.highHz * ratio * (1 + 1e-12)), Math.min(n, after + MARGIN));
    let fit: SpectrumFit | null = null;
    if (to > from) {
      const key = windowKey(table, from, to);
      fit = cache.get(key) ?? null;
      if (fit === null) {
        fit = fitSpectrum({ channels: C, frequencyHz: table.frequencyHz.slice(from, to), re: table.re.slice(from * C, to * C), im: table.im.slice(from * C, to * C) }, options);
        cache.set(key, fit);
      }
    }
    pieces.set(index, fit);
    return fit;
  };
  const fromHz = n > 0 ? table.frequencyHz[0] : NaN, toHz = n > 0 ? table.frequencyHz[n - 1] : NaN;
  return {
    table, channels: C, fromHz, toHz, piece,
    at(frequencyHz, out) {
      const fit = n > 0 && frequencyHz >= fromHz && frequencyHz <= toHz ? piece(bandIndexOf(frequencyHz, 3)) : null;
      if (fit === null) {
        out.re.fill(NaN);
        out.im.fill(NaN);
        out.error.fill(Infinity);
        out.solved = false;
        return;
      }
      fit.at(frequencyHz, out);
    },
    poles(lowHz, highHz) {
      if (n === 0) return [];
      const out: Pole[] = [];
      for (let x = bandIndexOf(lowHz, 3); x <= bandIndexOf(highHz, 3); x++) {
        const fit = piece(x);
        if (fit === null) continue;
        const b = bandFromIndex(x, 3);
        for (const p of fit.poles()) if (p.re >= Math.max(b.lowHz, lowHz) && p.re < Math.min(b.highHz, highHz)) out.push(p);
      }
      return out;
    },
  };
}

function windowKey(table: SampleTable, from: number, to: number): string {
  // frequencies and a checksum of the values: the same window of the same samples gives the same fit
  let sum = 0;
  for (let i = from * table.channels; i < to * table.channels; i++) sum += table.re[i] * 1.000001 ** (i % 97) + table.im[i] * 0.999999 ** (i % 89);
  return `${Array.from(table.frequencyHz.subarray(from, to)).join(',')}|${sum}`;
}

/** First index with a[i] ≥ x. */
function lowerBound(a: Float64Array, x: number): number {
  let lo = 0, hi = a.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (a[mid] < x) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

/** First index with a[i] > x. */
function upperBound(a: Float64Array, x: number): number {
  let lo = 0, hi = a.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (a[mid] <= x) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

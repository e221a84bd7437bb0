// Octave and one-third-octave bands, base-10 system of IEC 61260-1:2014
// (reference frequency 1000 Hz, octave ratio G = 10^(3/10)).
import { requirePositive } from './checks.ts';

export type BandFraction = 1 | 3;

export interface Band {
  /** Nominal midband frequency, the label used in tables and reports. */
  nominalHz: number;
  /** Exact midband frequency f_m = 1000·G^(x/b). */
  exactHz: number;
  lowHz: number;
  highHz: number;
  fraction: BandFraction;
  /** Band number x relative to the 1000 Hz band (x = 0). */
  index: number;
}

/** Octave frequency ratio of the base-10 system. */
export const OCTAVE_RATIO = 10 ** (3 / 10);
export const REFERENCE_HZ = 1000;

// The nominal midband frequencies repeat per decade as the R10 preferred
// numbers (×100 so they stay exact integers until the decade is applied).
const R10_HUNDREDTHS = [100, 125, 160, 200, 250, 315, 400, 500, 630, 800];
// Relative tolerance for "this frequency is that nominal centre".
const NOMINAL_TOLERANCE = 1e-6;

/** Exact midband frequency of band x: 1000·10^(x/10) (b = 3) or 1000·10^(3x/10) (b = 1). */
export function exactMidbandHz(index: number, fraction: BandFraction): number {
  return REFERENCE_HZ * 10 ** ((3 * index) / (10 * fraction));
}

/** Nominal midband frequency of band x, e.g. 31.5 for the exact 31.62 Hz. */
export function nominalMidbandHz(index: number, fraction: BandFraction): number {
  const third = fraction === 3 ? index : 3 * index;
  const decade = Math.floor(third / 10);
  const mantissa = R10_HUNDREDTHS[third - 10 * decade];
  // Dividing by an exact power of ten keeps 31.5 exactly 31.5 (3.15·10 would not).
  const exponent = decade + 1;
  return exponent >= 0 ? mantissa * 10 ** exponent : mantissa / 10 ** -exponent;
}

export function bandFromIndex(index: number, fraction: BandFraction): Band {
  if (!Number.isInteger(index)) throw new RangeError(`band index must be an integer (got ${index})`);
  const exactHz = exactMidbandHz(index, fraction);
  const halfWidth = OCTAVE_RATIO ** (1 / (2 * fraction));
  return {
    nominalHz: nominalMidbandHz(index, fraction),
    exactHz,
    lowHz: exactHz / halfWidth,
    highHz: exactHz * halfWidth,
    fraction,
    index,
  };
}

/** Band number whose exact midband is nearest to f in log frequency. */
export function bandIndexOf(frequencyHz: number, fraction: BandFraction): number {
  requirePositive('frequencyHz', frequencyHz);
  // log10 G = 0.3 exactly, so x = b·log10(f/1000)/0.3.
  // "+ 0" turns Math.round(-0.4) = -0 into 0.
  return Math.round((fraction * Math.log10(frequencyHz / REFERENCE_HZ)) / 0.3) + 0;
}

/** The band that contains f (an edge frequency belongs to the upper band). */
export function bandOf(frequencyHz: number, fraction: BandFraction): Band {
  return bandFromIndex(bandIndexOf(frequencyHz, fraction), fraction);
}

/** Bands whose nominal centre lies in [fromHz, toHz], ascending. */
export function bandsBetween(fromHz: number, toHz: number, fraction: BandFraction): Band[] {
  requirePositive('fromHz', fromHz);
  requirePositive('toHz', toHz);
  if (toHz < fromHz) throw new RangeError(`toHz (${toHz}) must not be below fromHz (${fromHz})`);
  const lo = fromHz * (1 - NOMINAL_TOLERANCE);
  const hi = toHz * (1 + NOMINAL_TOLERANCE);
  // Nominal and exact centres differ by under 3 %, so one band of margin suffices.
  const first = bandIndexOf(fromHz, fraction) - 1;
  const last = bandIndexOf(toHz, fraction) + 1;
  const bands: Band[] = [];
  for (let x = first; x <= last; x++) {
    const nominal = nominalMidbandHz(x, fraction);
    if (nominal >= lo && nominal <= hi) bands.push(bandFromIndex(x, fraction));
  }
  return bands;
}

/** The band whose nominal centre is f (within a relative 1e-6), or undefined. */
export function bandOfNominal(nominalHz: number, fraction: BandFraction): Band | undefined {
  if (!(Number.isFinite(nominalHz) && nominalHz > 0)) return undefined;
  const band = bandOf(nominalHz, fraction);
  return Math.abs(band.nominalHz - nominalHz) <= NOMINAL_TOLERANCE * nominalHz ? band : undefined;
}

// From results at single frequencies to results per band, and from band
// transmission loss to outlet sound power and an A-weighted total.
import { bandFromIndex, bandIndexOf, bandOfNominal, type Band, type BandFraction } from './bands.ts';
import { energyMeanDb, energySumDb } from './decibels.ts';
import { aWeightingDb } from './weighting.ts';

export interface BandValue {
  /** Nominal midband frequency. */
  bandHz: number;
  band: Band;
  /** NaN when the band has no usable point; `note` then says why. */
  valueDb: number;
  /** Points that went into the value. */
  pointCount: number;
  note?: string;
}

export interface BandLevelIn {
  bandHz: number;
  levelDb: number;
}

export interface OutletPowerBand {
  bandHz: number;
  sourceLwDb: number;
  tlDb: number;
  /** Lw − TL; NaN when the band has no transmission loss (see `note`). */
  outletLwDb: number;
  note?: string;
}

export const NOTE_NO_POINTS = 'no solved frequency in this band';
export const NOTE_NO_TL = 'no transmission loss for this band';

/**
 * Band transmission loss −10·log10(mean τ) with τ = 10^(−TL/10) over the
 * points in the band. What passes a silencer in a band is power, so the band
 * value is the mean transmitted power ratio: a narrow deep notch (τ ≈ 0) at one
 * point lowers the transmitted power only a little, whereas a mean of dB
 * values would let that one point dominate and overstate the band TL.
 * NaN points (failed solves) are left out. With `bands`, every band listed is
 * returned, NaN where no point falls in it; without, only bands with points.
 */
export function bandTransmissionLoss(
  freqs: ArrayLike<number>,
  tlDb: ArrayLike<number>,
  fraction: BandFraction,
  bands?: readonly Band[],
): BandValue[] {
  const negated = Float64Array.from(tlDb, (tl) => -tl);
  return bandEnergyMeans(freqs, negated, fraction, bands).map((b) => ({ ...b, valueDb: -b.valueDb }));
}

/** Band level as the energy mean of the point levels in each band (see bandTransmissionLoss for `bands`). */
export function bandLevel(
  freqs: ArrayLike<number>,
  levelDb: ArrayLike<number>,
  fraction: BandFraction,
  bands?: readonly Band[],
): BandValue[] {
  return bandEnergyMeans(freqs, levelDb, fraction, bands);
}

/**
 * Outlet sound power per band: Lw_out = Lw_source − TL_band. The source
 * spectrum and the TL are matched by nominal band frequency.
 */
export function outletPowerLevels(
  sourcePower: readonly { bandHz: number; lwDb: number }[],
  bandTl: readonly { bandHz: number; valueDb: number }[],
): OutletPowerBand[] {
  return sourcePower.map(({ bandHz, lwDb }) => {
    const tl = bandTl.find((t) => sameFrequency(t.bandHz, bandHz));
    if (tl === undefined || Number.isNaN(tl.valueDb)) {
      return { bandHz, sourceLwDb: lwDb, tlDb: NaN, outletLwDb: NaN, note: NOTE_NO_TL };
    }
    return { bandHz, sourceLwDb: lwDb, tlDb: tl.valueDb, outletLwDb: lwDb - tl.valueDb };
  });
}

/**
 * A-weighted total 10·log10 Σ 10^((L + A(f))/10). A nominal band frequency is
 * weighted at its exact midband, as IEC 61672-1 tabulates it; any other
 * frequency is weighted as given. A NaN band makes the total NaN: a missing
 * band means the total is unknown, not smaller.
 */
export function aWeightedTotal(bands: readonly BandLevelIn[]): number {
  const weighted = bands.map(({ bandHz, levelDb }) => levelDb + aWeightingDb(weightingFrequency(bandHz)));
  return energySumDb(weighted);
}

function weightingFrequency(bandHz: number): number {
  // Octave nominal centres are a subset of the third-octave ones.
  return bandOfNominal(bandHz, 3)?.exactHz ?? bandHz;
}

function sameFrequency(a: number, b: number): boolean {
  return Math.abs(a - b) <= 1e-6 * Math.max(Math.abs(a), Math.abs(b));
}

function bandEnergyMeans(
  freqs: ArrayLike<number>,
  valuesDb: ArrayLike<number>,
  fraction: BandFraction,
  bands?: readonly Band[],
): BandValue[] {
  if (freqs.length !== valuesDb.length) {
    throw new RangeError(`${freqs.length} frequencies but ${valuesDb.length} values`);
  }
  const groups = groupByBand(freqs, valuesDb, fraction);
  const wanted = bands ?? [...groups.keys()].sort((a, b) => a - b).map((x) => bandFromIndex(x, fraction));
  return wanted.map((band) => {
    if (band.fraction !== fraction) throw new RangeError(`band ${band.nominalHz} Hz is not a 1/${fraction}-octave band`);
    const values = groups.get(band.index) ?? [];
    const base = { bandHz: band.nominalHz, band, pointCount: values.length };
    return values.length === 0
      ? { ...base, valueDb: NaN, note: NOTE_NO_POINTS }
      : { ...base, valueDb: energyMeanDb(values) };
  });
}

function groupByBand(freqs: ArrayLike<number>, valuesDb: ArrayLike<number>, fraction: BandFraction): Map<number, number[]> {
  const groups = new Map<number, number[]>();
  for (let i = 0; i < freqs.length; i++) {
    if (Number.isNaN(valuesDb[i])) continue;
    const x = bandIndexOf(freqs[i], fraction);
    const group = groups.get(x);
    if (group) group.push(valuesDb[i]);
    else groups.set(x, [valuesDb[i]]);
  }
  return groups;
}

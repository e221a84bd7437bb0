// Frequency weightings A and C from the analytic expressions of
// IEC 61672-1:2013 (Annex E, annex number from memory): products of real
// poles, normalised so that the weighting is 0 dB at 1 kHz.

/** Pole frequencies of IEC 61672-1:2013, Hz. */
export const WEIGHTING_POLES_HZ = {
  f1: 20.598997,
  f2: 107.65265,
  f3: 737.86223,
  f4: 12194.217,
} as const;
/** Normalisation constants: the raw expressions' values at 1 kHz, dB. */
export const A1000_DB = -2.0;
export const C1000_DB = -0.062;

const { f1, f2, f3, f4 } = WEIGHTING_POLES_HZ;

/** A-weighting in dB at frequency f (−∞ at 0 Hz). */
export function aWeightingDb(frequencyHz: number): number {
  const ff = frequencyHz * frequencyHz;
  const gain =
    (f4 * f4 * ff * ff) /
    ((ff + f1 * f1) * Math.sqrt(ff + f2 * f2) * Math.sqrt(ff + f3 * f3) * (ff + f4 * f4));
  return 20 * Math.log10(gain) - A1000_DB;
}

/** C-weighting in dB at frequency f (−∞ at 0 Hz). */
export function cWeightingDb(frequencyHz: number): number {
  const ff = frequencyHz * frequencyHz;
  const gain = (f4 * f4 * ff) / ((ff + f1 * f1) * (ff + f4 * f4));
  return 20 * Math.log10(gain) - C1000_DB;
}

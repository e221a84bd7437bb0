// Decibel arithmetic on power-like quantities: levels add and average as
// energies (10^(L/10)), never as dB values.

/** 10·log10 Σ 10^(L/10); −∞ for an empty list; NaN if any level is NaN. */
export function energySumDb(levelsDb: ArrayLike<number>): number {
  let sum = 0;
  for (let i = 0; i < levelsDb.length; i++) sum += 10 ** (levelsDb[i] / 10);
  return 10 * Math.log10(sum);
}

/** 10·log10 of the mean of 10^(L/10); NaN for an empty list. */
export function energyMeanDb(levelsDb: ArrayLike<number>): number {
  if (levelsDb.length === 0) return NaN;
  return energySumDb(levelsDb) - 10 * Math.log10(levelsDb.length);
}

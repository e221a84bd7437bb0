/**
 * The power quantities a band value is formed from, written over the fitted output channels:
 *
 *     q(f) = Σ_t weight_t(f)·|z_t(f)|²      ('squared' terms: power from complex amplitudes)
 *          + Σ_t weight_t(f)·Re z_t(f)       ('linear' terms: a channel that already is a power)
 *
 * For a duct the transmitted power ratio W_t/W_i is a sum over the outlet's propagating modes of
 * |amplitude|² times that mode's power per unit amplitude² over the incident power (a weight that
 * depends on f through the modal wavenumber); below the first cut-on it is |p_t/p_i|²·S_o/S_i. For a
 * room the mean-square pressure at a receiver is |p|²/2 (peak amplitudes). Band values in dB are
 * sign·10·log10(mean/reference): sign −1, reference 1 for a transmission loss; sign +1, reference
 * (20 µPa)² for a sound pressure level.
 */

export interface PowerTerm {
  channel: number;
  /** Non-negative weight, a constant or a function of frequency (Hz). Default 1. */
  weight?: number | ((frequencyHz: number) => number);
  /** Default 'squared'. */
  form?: 'squared' | 'linear';
}

export interface BandQuantity {
  /** Column or label, e.g. 'tl' or a receiver's name. */
  name: string;
  terms: readonly PowerTerm[];
  db: { sign: 1 | -1; reference: number };
  /**
   * Relative power spectral density of the source per hertz across a band. Absent: flat within
   * every band (white), the assumption for a source given in band levels only.
   */
  sourceDensity?: (frequencyHz: number) => number;
}

/** Reference pressure of sound pressure levels, 20 µPa (ISO 1683). */
export const REFERENCE_PRESSURE = 20e-6;

/** Transmission loss from the transmitted power ratio τ(f) = Σ weight·|z|² (e.g. |p_t/p_i|²·S_o/S_i below cut-on). */
export function transmissionLossQuantity(terms: readonly PowerTerm[], name = 'tl'): BandQuantity {
  return { name, terms, db: { sign: -1, reference: 1 } };
}

/** Sound pressure level from a complex peak pressure channel: mean square |p|²/2 re (20 µPa)². */
export function pressureLevelQuantity(channel: number, name: string): BandQuantity {
  return { name, terms: [{ channel, weight: 0.5 }], db: { sign: 1, reference: REFERENCE_PRESSURE ** 2 } };
}

export function weightAt(term: PowerTerm, frequencyHz: number): number {
  const w = term.weight ?? 1;
  return typeof w === 'number' ? w : w(frequencyHz);
}

/** q(f) from channel values. */
export function quantityValue(q: BandQuantity, frequencyHz: number, re: ArrayLike<number>, im: ArrayLike<number>): number {
  let sum = 0;
  for (const t of q.terms) {
    const w = weightAt(t, frequencyHz), c = t.channel;
    sum += t.form === 'linear' ? w * re[c] : w * (re[c] * re[c] + im[c] * im[c]);
  }
  return sum;
}

/** A bound on |q(f) − q_true(f)| from channel errors e: |z|² moves by at most 2|z|e + e². */
export function quantityError(q: BandQuantity, frequencyHz: number, re: ArrayLike<number>, im: ArrayLike<number>, error: ArrayLike<number>): number {
  let sum = 0;
  for (const t of q.terms) {
    const w = weightAt(t, frequencyHz), c = t.channel, e = error[t.channel];
    sum += t.form === 'linear' ? w * e : w * (2 * Math.hypot(re[c], im[c]) * e + e * e);
  }
  return sum;
}

/** The band value in dB of a band mean. */
export function quantityDb(q: BandQuantity, mean: number): number {
  return q.db.sign * 10 * Math.log10(mean / q.db.reference);
}

/**
 * The half-width in dB of the interval [mean − error, mean + error] around a band mean: the larger
 * of the two sides, +∞ when the error reaches the mean (the value could be anything below).
 */
export function errorDb(mean: number, error: number): number {
  if (!(mean > 0) || !(error < mean)) return Infinity;
  return -10 * Math.log10(1 - error / mean);
}

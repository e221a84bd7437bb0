/**
 * Levels in decibels, with the references of ISO 1683: sound pressure re 20 µPa using the RMS value
 * |p̂|/√2 of a peak amplitude p̂ (DEVELOPERS.md: amplitudes are peak values), sound power re 1 pW.
 */

/** Reference sound pressure, Pa (ISO 1683). */
export const P_REF = 20e-6;
/** Reference sound power, W (ISO 1683). */
export const W_REF = 1e-12;

/** Sound pressure level of a peak amplitude |p̂| (Pa), dB re 20 µPa: 20·log10((|p̂|/√2)/p_ref). */
export function splDb(peakPa: number): number {
  return 20 * Math.log10(peakPa / Math.SQRT2 / P_REF);
}

/** Sound power level of a power W (watts), dB re 1 pW. */
export function lwDb(watts: number): number {
  return 10 * Math.log10(watts / W_REF);
}

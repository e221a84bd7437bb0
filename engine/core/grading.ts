/**
 * The grading rule of every mesh: an element of order p spans p node intervals, so an element no longer
 * than p·λ/ppw carries at least ppw nodes per wavelength λ. The mesher applies it to the air at the top of
 * the sweep, the size estimate before any grid exists, and the lining slicer to a porous material's own
 * (shorter) wavelength: one rule, here.
 */

/** The longest element edge that keeps `pointsPerWavelength` nodes per `wavelength` at element order `order`, m. */
export function maxElementSize(order: number, wavelength: number, pointsPerWavelength: number): number {
  return (order * wavelength) / pointsPerWavelength;
}

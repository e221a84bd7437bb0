/**
 * A band value: the mean of a power quantity over the band from its lower to its upper edge,
 *
 *     q̄ = ∫ s(f) q(f) df / ∫ s(f) df      (s the source's spectral density; s = 1: flat in the band),
 *
 * integrated on the fitted curve (never a mean of points: a point stands for the stretch of frequency
 * the fit gives it, whatever the count). Its error is the fit's, the pointwise error estimate of the
 * curve (fit.ts: leave-out fits' disagreement, never below the data's noise) carried through q and
 * integrated like q, plus the quadrature's own estimate.
 */
import { evaluateFit } from './aaa.ts';
import { fitPoint, type SpectrumFit } from './fit.ts';
import { integrate } from './quadrature.ts';
import { quantityError, quantityValue, type BandQuantity } from './quantity.ts';

export interface BandIntegral {
  /** q̄ from the curve. */
  mean: number;
  /** ∫ s·|δq| df / ∫ s df, δq the pointwise bound on q's error from the fit's channel errors. */
  fitError: number;
  /** Quadrature error estimate (of the curve's integral and of the weights'). */
  quadratureError: number;
  /** fitError + quadratureError. */
  error: number;
  /** ∫ s(f) df over the band (its width when the source is flat): what the mean is per. */
  weight: number;
  /** Evaluations of a rational fit spent (all fits together). */
  evaluations: number;
}

/** Relative accuracy asked of the band integral: far below any tolerance in dB that matters (0.01 dB ≈ 2.3e-3). */
const QUADRATURE_TOLERANCE = 1e-8;
/** Relative accuracy of the error bound's own integral: an estimate needs two digits at most. */
const ERROR_TOLERANCE = 1e-3;

export function bandMean(fit: SpectrumFit, q: BandQuantity, lowHz: number, highHz: number): BandIntegral {
  if (!(highHz > lowHz)) throw new RangeError(`band edges must ascend (got ${lowHz} to ${highHz} Hz)`);
  const breakpoints = poleBreakpoints(fit, lowHz, highHz);
  const density = q.sourceDensity;
  let evaluations = 0;
  let norm = highHz - lowHz, normError = 0;
  if (density) {
    const r = integrate(density, lowHz, highHz, { relativeTolerance: QUADRATURE_TOLERANCE, breakpoints });
    norm = r.value;
    normError = r.error;
    evaluations += r.evaluations;
    if (!(norm > 0)) throw new RangeError(`the source density integrates to ${norm} over ${lowHz}–${highHz} Hz: it must be positive in every band`);
  }
  const C = fit.channels, re = new Float64Array(C), im = new Float64Array(C), point = fitPoint(C);
  const main = integrate((f) => {
    evaluateFit(fit.main, f, re, im);
    const v = quantityValue(q, f, re, im);
    return density ? density(f) * v : v;
  }, lowHz, highHz, { relativeTolerance: QUADRATURE_TOLERANCE, breakpoints });
  evaluations += main.evaluations;
  // ∫ s·|δq| df with δq bounded pointwise from the channels' error estimates: no cancellation is
  // assumed between frequencies (the spread of the leave-out fits' integrals alone, which allows it,
  // fell short of the true error on peaky test functions).
  const bound = integrate((f) => {
    fit.at(f, point);
    const e = quantityError(q, f, point.re, point.im, point.error);
    return density ? density(f) * e : e;
  }, lowHz, highHz, { relativeTolerance: ERROR_TOLERANCE, breakpoints });
  evaluations += bound.evaluations * (1 + fit.folds.length);
  const mean = main.value / norm;
  const fitError = bound.value / norm;
  const quadratureError = main.error / norm + Math.abs(mean) * (normError / norm);
  return { mean, fitError, quadratureError, error: fitError + quadratureError, weight: norm, evaluations };
}

/** Where the curve has a sharp peak or dip in the band: real parts of poles within a band width of the real axis, and their half-power points. */
export function poleBreakpoints(fit: SpectrumFit, lowHz: number, highHz: number): number[] {
  const width = highHz - lowHz, out: number[] = [];
  for (const p of fit.poles()) {
    const d = Math.abs(p.im);
    if (d >= width || p.re + d < lowHz || p.re - d > highHz) continue;
    out.push(p.re - d, p.re, p.re + d);
  }
  return out.filter((f) => f > lowHz && f < highHz);
}

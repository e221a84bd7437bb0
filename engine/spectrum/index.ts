// Public API of the spectrum layer: solved points → a fitted curve with an error estimate →
// band values integrated edge to edge, and the adaptive choice of frequencies to solve.
export type { Sample, SampleTable } from './samples.ts';
export { sampleTable, mergeSamples, samplesOf, DEFAULT_AGREEMENT } from './samples.ts';
export type { RationalFit, Pole, AaaOptions } from './aaa.ts';
export { aaa, evaluateFit, polesOf } from './aaa.ts';
export type { SpectrumFit, SpectrumFitOptions, FitPoint } from './fit.ts';
export { fitSpectrum, fitPoint, DEFAULT_FOLDS, DEFAULT_NOISE } from './fit.ts';
export type { SpectrumCurve, CurveOptions, FitCache } from './curve.ts';
export { spectrumCurve, THIRD_OCTAVE_RATIO } from './curve.ts';
export type { BandQuantity, PowerTerm } from './quantity.ts';
export { transmissionLossQuantity, pressureLevelQuantity, quantityValue, quantityError, quantityDb, errorDb, REFERENCE_PRESSURE } from './quantity.ts';
export type { BandIntegral } from './bandIntegral.ts';
export { bandMean } from './bandIntegral.ts';
export type { QuadratureResult, QuadratureOptions } from './quadrature.ts';
export { integrate } from './quadrature.ts';
export type { SamplingPolicy, SamplingPolicyOptions, BandResult, BandStatus } from './policy.ts';
export { samplingPolicy, DEFAULT_TOLERANCE_DB, DEFAULT_MAX_SOLVES } from './policy.ts';

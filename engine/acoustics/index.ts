// Public API of the acoustics layer: pure functions of air, bands, weightings,
// band aggregation, duct modes and plane-wave theory.
export * from './air.ts';
export * from './bands.ts';
export * from './sweep.ts';
export * from './weighting.ts';
export * from './decibels.ts';
export * from './aggregate.ts';
export * from './cuton.ts';
export type { Complex } from './complex.ts';
export * from './fourpole.ts';
export * from './planewave.ts';
export * from './planewaveClosedForms.ts';

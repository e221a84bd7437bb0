// Public API of the acoustics layer: pure functions of air, bands, weightings,
// band aggregation, duct modes, plane-wave theory, porous linings and their materials.
export * from './air.ts';
export * from './bands.ts';
export * from './sweep.ts';
export * from './weighting.ts';
export * from './decibels.ts';
export * from './aggregate.ts';
export * from './cuton.ts';
export * from './fourpole.ts';
export * from './planewave.ts';
export * from './planewaveClosedForms.ts';
export * from './porous.ts';
export * from './materials.ts';

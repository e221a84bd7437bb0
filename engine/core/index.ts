// The small shapes every layer of the engine shares, declared once: complex scalars and vectors,
// boxes, sides, wall keys, face rectangles and cross-sections, levels and their references, the grading rule.
export * from './complex.ts';
export * from './space.ts';
export * from './levels.ts';
export * from './grading.ts';
export * from './absorber.ts';
export * from './medium.ts';

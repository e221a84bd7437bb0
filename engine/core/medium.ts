/**
 * An equivalent fluid as the Helmholtz form reads it: 1/ρ and 1/κ, complex for a lossy (porous) medium
 * (e^{+jωt}). The porous models (engine/acoustics) produce it, the assembly, the problems and the
 * waveguide sections consume it.
 */
import type { Complex } from './complex.ts';

export interface Medium { rhoInv: Complex; kappaInv: Complex }

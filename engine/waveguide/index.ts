/**
 * Uniform duct sections by their cross-section modes, and ducts made of them by mode matching:
 * grid (2D or z-separated 1D) → modes at one frequency (shift-invert Arnoldi on our LDLᵀ) → interface
 * coupling and scattering cascade → TL from modal powers.
 */
export { buildSectionGrid, interpolation, type Fill, type Rect, type SectionGrid, type SectionGridSpec } from './grid.ts';
export { sectionModes, pencil, axialBranch, type ModeSet, type ModeRequest, type SlotMedium } from './modes.ts';
export { shiftInvertEigs, type EigsOptions, type EigsResult } from './arnoldi.ts';
export { coupling, interfaceScattering, propagation, star, powerGram, axialPower, valuesAt, type Coupling, type Scattering } from './matching.ts';
export {
  prepareWaveguide, solveWaveguideAt, transverseCutoff,
  type WaveguideDuct, type WaveguideSection, type SectionFill, type PorousFill, type WaveguideIncidence, type WaveguideLayout,
  type PreparedWaveguide, type WaveguidePoint, type SectionReport,
} from './duct.ts';
export { linedChannelWavenumber, type LinedChannel } from './lined-dispersion.ts';

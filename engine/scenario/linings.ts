/**
 * What the linings mean to the solver and to the reader of the results: the medium of every box at
 * one frequency, and per lining the model, σ, where the sweep stands against the model's fitted
 * range, and the mesh it was given.
 */
import { liningMaterial, porousFittedFrequencies, porousMedium, porousValidity, type PorousAir, type PorousMedium, type PorousValidity } from '../acoustics/index.ts';
import type { Geometry } from './geometry.ts';
import type { LiningModel, NormalisedScenario, Side } from './types.ts';

/** Per frequency, the medium of each of the geometry's boxes (null: the air); undefined when nothing is lined. */
export function liningMedia(geometry: Geometry, air: PorousAir): ((frequencyHz: number) => (PorousMedium | null)[]) | undefined {
  if (geometry.linings.length === 0) return undefined;
  return (frequencyHz) => {
    const media: (PorousMedium | null)[] = geometry.boxes.map(() => null);
    for (const l of geometry.linings) {
      const medium = porousMedium(l.model, frequencyHz, l.flowResistivity, air);
      for (const b of l.boxes) media[b] = medium;
    }
    return media;
  };
}

export interface LiningReport {
  /** Index into the scenario's `linings`. */
  lining: number;
  section: string;
  faces: Side[];
  thickness: number;
  model: LiningModel;
  /** Pa·s/m². */
  flowResistivity: number;
  /** The library entry and its label, when σ came from the library (typical round figures, not products). */
  library: string | null;
  label: string | null;
  /** f/σ at the sweep's lowest and highest frequency, Hz per Pa·s/m². */
  fOverSigma: [number, number];
  /** The model's own variable (ρ₀f/σ or f/σ) over the sweep against its fitted range, and a warning when it leaves it. */
  validity: PorousValidity;
  /** The frequencies where the model is within its fitted range for this σ, Hz. */
  fittedFrequenciesHz: [number, number];
  /** Largest element edge inside the lining, m; null where the air's grading was fine enough. */
  elementSize: number | null;
  /** How many boxes of the geometry hold this lining. */
  boxes: number;
}

/** One entry per lining of the scenario, for summaries; empty for a room or an unlined duct. */
export function liningReport(scenario: NormalisedScenario, geometry: Geometry): LiningReport[] {
  if (scenario.kind !== 'duct') return [];
  const f = scenario.sweep.frequenciesHz, fLo = f[0], fHi = f[f.length - 1], rho = scenario.air.density;
  return scenario.linings.map((l, i) => {
    const { model, flowResistivity, library } = l.material, parts = geometry.linings.filter((g) => g.lining === i);
    const sizes = parts.map((p) => p.elementSize).filter((s): s is number => s !== null);
    return {
      lining: i, section: l.section, faces: [...l.faces], thickness: l.thickness, model, flowResistivity,
      library, label: library === null ? null : liningMaterial(library)?.label ?? null,
      fOverSigma: [fLo / flowResistivity, fHi / flowResistivity],
      validity: porousValidity(model, fLo, fHi, flowResistivity, rho),
      fittedFrequenciesHz: porousFittedFrequencies(model, flowResistivity, rho),
      elementSize: sizes.length > 0 ? Math.min(...sizes) : null,
      boxes: parts.reduce((n, p) => n + p.boxes.length, 0),
    };
  });
}

/** What follows from the draft at every edit: the validator's verdict and, when valid, the geometry to draw. */
import { buildGeometry, validateScenario, type Geometry, type ValidationResult } from '../../../engine/scenario/index.ts';
import type { Draft } from './draft.ts';

export interface Derived {
  validation: ValidationResult;
  geometry: Geometry | null;
  /** Why there is no geometry although the scenario is valid (a rule the validator does not yet know). */
  geometryError: string | null;
}

export function derive(draft: Draft): Derived {
  const validation = validateScenario(draft);
  if (!validation.ok) return { validation, geometry: null, geometryError: null };
  try {
    return { validation, geometry: buildGeometry(validation.scenario), geometryError: null };
  } catch (e) {
    return { validation, geometry: null, geometryError: e instanceof Error ? e.message : String(e) };
  }
}

/** Why the run button is disabled, in words; null when it may run. */
export function runBlocker(derived: Derived, running: boolean, estimate: { tooLarge: boolean } | null = null, allowLarge = false): string | null {
  if (running) return 'A run is in progress.';
  const v = derived.validation;
  if (!v.ok) {
    const n = v.errors.length, first = v.errors[0];
    return `Cannot run: ${n === 1 ? 'one problem' : `${n} problems`} in the scenario. ${first ? `First: ${first.message}` : ''}`.trim();
  }
  if (derived.geometryError) return `Cannot run: ${derived.geometryError}`;
  if (estimate?.tooLarge && !allowLarge) return 'Cannot run yet: the problem is larger than runs without asking. See Sweep & mesh: make it smaller, or confirm the large run there.';
  return null;
}

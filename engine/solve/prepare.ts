/**
 * From a validated scenario to its problem: the scenario's geometry turned into the model of one problem
 * kind, checked for size first. The one place that reads a scenario for the solver: the problems
 * themselves know only their models. The mesh is graded for the top frequency of the scenario's whole
 * sweep, never of a subset, so that parts of one sweep solved apart (other machines, other workers) are
 * the same computation and their results can be merged.
 */
import { crossSectionOf, wallSide } from '../core/space.ts';
import type { NormalisedDuctScenario, NormalisedRoomScenario, NormalisedScenario, WallKey } from '../scenario/types.ts';
import { buildGeometry, type Geometry } from '../scenario/geometry.ts';
import { liningMedia } from '../scenario/linings.ts';
import { surfaceAdmittance } from '../assembly/boundary.ts';
import { DuctProblem, type DuctModel } from './duct.ts';
import { RoomProblem, type RoomModel } from './room.ts';
import { estimateSize, LARGE_PROBLEM_DOFS, ProblemTooLarge } from './size.ts';
import type { Problem } from './problem.ts';
import type { WorkspaceOptions } from '../linalg/index.ts';

export interface PrepareOptions {
  /** Refuse (ProblemTooLarge) above this many estimated dofs; Infinity when the user confirmed a large run. */
  maxDofs?: number;
  /** How the problem's kept factor memory factors (kernels, helper threads): asked once per problem prepared, its finer one included. */
  workspace?: () => WorkspaceOptions;
}

/** The same scenario one element order higher at the same points per wavelength: a finer discretisation. */
export function finerScenario(s: NormalisedScenario): NormalisedScenario {
  return { ...s, mesh: { ...s.mesh, order: s.mesh.order + 1 } };
}

/** The scenario's problem; its finer() is the scenario one order higher, under the same size limit. */
export function prepareProblem(s: NormalisedScenario, opts: PrepareOptions = {}): Problem {
  const geometry = buildGeometry(s);
  const size = estimateSize(s, geometry), limit = opts.maxDofs ?? LARGE_PROBLEM_DOFS;
  if (!(size.dofs <= limit)) throw new ProblemTooLarge(size, limit);
  const finer = () => prepareProblem(finerScenario(s), opts);
  const workspace = opts.workspace?.();
  return s.kind === 'duct' ? new DuctProblem(ductModel(s, geometry), finer, workspace) : new RoomProblem(roomModel(s, geometry), finer, workspace);
}

function common(s: NormalisedScenario) {
  return {
    soundSpeed: s.air.soundSpeed, density: s.air.density, order: s.mesh.order, pointsPerWavelength: s.mesh.pointsPerWavelength,
    maxFrequencyHz: Math.max(...s.sweep.frequenciesHz), absorber: { kind: s.absorber.kind, layers: s.absorber.layers, thickness: s.absorber.thickness ?? undefined },
  };
}

export function ductModel(s: NormalisedDuctScenario, geometry: Geometry = buildGeometry(s)): DuctModel {
  const ports = geometry.duct!, t = ports.outlet.termination, rhoC = s.air.density * s.air.soundSpeed;
  return {
    ...common(s), boxes: geometry.boxes, openings: geometry.openings, media: liningMedia(geometry, s.air),
    inlet: { x: ports.inlet.x, rect: crossSectionOf(ports.inlet.rect), clearTo: ports.inlet.clearTo },
    outlet: { x: ports.outlet.x, rect: crossSectionOf(ports.outlet.rect), clearFrom: ports.outlet.clearFrom, termination: typeof t === 'string' ? t : { admittance: surfaceAdmittance(t, rhoC) } },
    incident: { mode: s.duct.incident.mode, amplitude: s.duct.incident.amplitudePa },
    layout: { sections: ports.sections, branches: ports.branches },
  };
}

export function roomModel(s: NormalisedRoomScenario, geometry: Geometry = buildGeometry(s)): RoomModel {
  const layout = geometry.room!, rhoC = s.air.density * s.air.soundSpeed;
  const walls = Object.entries(layout.walls) as [WallKey, (typeof layout.walls)[WallKey]][];
  return {
    ...common(s), box: geometry.bounds,
    open: walls.filter(([, w]) => w === 'open').map(([k]) => wallSide(k)),
    surfaces: walls.flatMap(([k, w]) => (typeof w === 'object' ? [{ side: wallSide(k), admittance: surfaceAdmittance(w, rhoC) }] : [])),
    sources: layout.sources, receivers: layout.receivers,
  };
}

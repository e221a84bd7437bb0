// Scenarios used across the scenario tests. Plain JSON-like objects: each test clones before mutating.

/** The example from the issue that introduced the format, verbatim. */
export const ISSUE_EXAMPLE = {
  format: 'quietgrid/1',
  title: 'Plant-room supply duct, silencer option B',
  air: { temperatureC: 20 },
  sweep: { fromHz: 50, toHz: 1000, spacing: 'third-octave', pointsPerBand: 1 },
  mesh: { order: 4, pointsPerWavelength: 6 },
  absorber: { kind: 'discrete', layers: 3 },
  duct: {
    sections: [
      { name: 'inlet', length: 0.6, width: 0.15, height: 0.10 },
      { name: 'chamber', length: 0.5, width: 0.45, height: 0.30, offsetY: 0, offsetZ: 0 },
      { name: 'outlet', length: 0.6, width: 0.15, height: 0.10 },
    ],
    branches: [
      { name: 'stub', section: 'inlet', at: 0.3, side: '+y', length: 0.25, width: 0.06, height: 0.10, end: 'closed' },
    ],
  },
};

/** A duct scenario that uses every field the format has for a duct (except the other sweep forms). */
export const FULL_DUCT = {
  format: 'quietgrid/1',
  title: 'Every duct field',
  notes: 'test fixture',
  air: { temperatureC: 15, soundSpeed: 340, density: 1.22 },
  sweep: { fromHz: 63, toHz: 500, spacing: 'octave', pointsPerBand: 2 },
  mesh: { order: 3, pointsPerWavelength: 5 },
  absorber: { kind: 'smooth', layers: 4, thickness: 0.2 },
  duct: {
    sections: [
      { name: 'in', length: 0.5, width: 0.2, height: 0.15, offsetY: 0.01, offsetZ: -0.01 },
      { name: 'box', length: 0.5, width: 0.5, height: 0.4 },
      { name: 'out', length: 0.5, width: 0.2, height: 0.15 },
    ],
    branches: [
      { name: 'stub', section: 'in', at: 0.25, side: '-z', length: 0.2, width: 0.08, height: 0.1, end: 'closed' },
      { name: 'vent', section: 'box', at: 0.25, side: '+y', length: 0.1, width: 0.1, height: 0.1, end: 'open' },
    ],
    outlet: { impedance: [1.5, -0.3] },
    incident: { mode: [0, 0], amplitudePa: 2 },
  },
  sourcePower: { octaveBandsDb: { '31.5': 70, 63: 80, 125: 82, 250: 81, 500: 78, 1000: 75, 2000: 72, 4000: 70, 8000: 66 } },
  linings: [
    { section: 'box', faces: ['+z', '-z'], thickness: 0.05, material: { model: 'delany-bazley', flowResistivity: 5000 } },
    { section: 'box', faces: ['-x'], thickness: 0.1, material: { library: 'glass-wool-light' } },
  ],
};

/** A room scenario that uses every room field. */
export const FULL_ROOM = {
  format: 'quietgrid/1',
  title: 'Every room field',
  sweep: { fromHz: 40, toHz: 120, spacing: 'linear', count: 5 },
  room: {
    size: [2.0, 1.6, 1.2],
    walls: { 'x-': 'rigid', 'x+': 'open', 'y-': { absorption: 0.3 }, 'y+': { impedance: [4, 1] }, 'z-': 'rigid', 'z+': { absorption: 1 } },
    sources: [{ name: 'engine', position: [0.7, 0.8, 0.4], volumeVelocity: 0.002 }],
    receivers: [{ name: 'ear', position: [1.5, 0.5, 1.0] }],
  },
};

/** The explicit-list sweep form, on an otherwise minimal duct. */
export const LIST_SWEEP_DUCT = {
  format: 'quietgrid/1',
  sweep: { frequenciesHz: [100, 150, 200] },
  duct: {
    sections: [{ name: 'pipe', length: 1, width: 0.1, height: 0.1 }],
    outlet: { absorption: 0.5 },
  },
};

/** Every fixture that must validate, by name. */
export const VALID_FIXTURES: Record<string, unknown> = { ISSUE_EXAMPLE, FULL_DUCT, FULL_ROOM, LIST_SWEEP_DUCT };

export function clone<T>(value: T): T {
  return structuredClone(value);
}

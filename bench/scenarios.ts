/**
 * The bench's own scenarios: an elongated expansion chamber (a long chamber between two short runs
 * of narrower duct), meshed at a chosen element order and top frequency. The chamber's length sets
 * the size; its cross-section and the frequency set the width of the separators.
 */
export interface DuctCase { name: string; order: number; topHz: number; chamberLength: number }

export const FACTOR_CASES: DuctCase[] = [
  { name: 'small', order: 2, topHz: 1250, chamberLength: 3 },
  { name: 'medium', order: 3, topHz: 1400, chamberLength: 4 },
  { name: 'long', order: 3, topHz: 1400, chamberLength: 8 },
  { name: 'large', order: 4, topHz: 1600, chamberLength: 10 },
];

export function chamberScenario(c: DuctCase, frequenciesHz: number[] = [c.topHz]): string {
  return JSON.stringify({
    format: 'quietgrid/1', title: `bench: elongated expansion chamber ${c.chamberLength} m, order ${c.order}`,
    sweep: { frequenciesHz }, mesh: { order: c.order, pointsPerWavelength: 8 },
    duct: {
      sections: [
        { name: 'in', length: 0.5, width: 0.25, height: 0.2 },
        { name: 'chamber', length: c.chamberLength, width: 0.5, height: 0.4 },
        { name: 'out', length: 0.5, width: 0.25, height: 0.2 },
      ],
    },
  });
}

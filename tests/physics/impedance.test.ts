/** A duct closed by a locally reacting end: at normal incidence |R|² = 1 − α. */
import { describe, expect, it } from 'vitest';
import { DuctProblem } from '../../engine/solve/duct.ts';
import { surfaceAdmittance } from '../../engine/assembly/boundary.ts';

const c = 343, rho = 1.2, a = 0.1, rect = { y0: 0, y1: a, z0: 0, z1: a };

describe('impedance termination', () => {
  for (const alpha of [0.3, 0.6, 0.95]) {
    it(`α = ${alpha}: |R|² = 1 − α`, () => {
      const prep = new DuctProblem({
        boxes: [{ x0: 0, x1: 1, y0: 0, y1: a, z0: 0, z1: a }], openings: [{ side: '-x', rect: { a0: 0, a1: a, b0: 0, b1: a } }],
        inlet: { x: 0, rect, clearTo: 0.6 }, outlet: { x: 1, rect, clearFrom: 0.6, termination: { admittance: surfaceAdmittance({ absorption: alpha }, rho * c) } },
        soundSpeed: c, density: rho, order: 4, pointsPerWavelength: 8, maxFrequencyHz: 800, absorber: { kind: 'discrete', layers: 3 }, incident: { mode: [0, 0], amplitude: 1 },
      });
      for (const f of [125, 400, 800]) {
        const r = prep.solve(f, () => performance.now());
        // Source: Kinsler et al., Fundamentals of Acoustics, 4th ed. (2000), §6.2: R = (ζ − 1)/(ζ + 1) at normal incidence; ζ from α is common practice
        expect(Math.abs(r.inletReflection ** 2 - (1 - alpha))).toBeLessThan(0.005);
        expect(r.tlDb).toBeNull();
      }
    });
  }
});

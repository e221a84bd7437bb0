/**
 * The 3D solver as an impedance tube: a closed 50 mm square duct whose end holds a porous layer on the
 * rigid end wall (a "+x" lining with a rigid outlet). Below the first cross-mode (3.4 kHz) only the plane
 * wave propagates, and the solver's inlet reflection is the plane-wave reflection factor, the quantity
 * the two-microphone method of ISO 10534-2 measures.
 */
import { describe, expect, it } from 'vitest';
import { normalIncidenceAbsorption, porousWave, rigidBackedImpedance, type PorousModel } from '../../engine/acoustics/index.ts';
import { buildGeometry, formatIssues, validateScenario } from '../../engine/scenario/index.ts';
import { prepareProblem } from '../../engine/solve/prepare.ts';

const air = { soundSpeed: 343, density: 1.2 }, rhoC = air.density * air.soundSpeed;
const FREQUENCIES = [100, 200, 400, 800, 1250, 2000];

function tube(model: PorousModel, flowResistivity: number, thickness: number) {
  const r = validateScenario({
    format: 'quietgrid/1', air, sweep: { frequenciesHz: FREQUENCIES }, mesh: { order: 4, pointsPerWavelength: 8 },
    duct: { sections: [{ name: 'tube', length: 0.5, width: 0.05, height: 0.05 }], outlet: 'rigid' },
    linings: [{ section: 'tube', faces: ['+x'], thickness, material: { model, flowResistivity } }],
  });
  if (!r.ok) throw new Error(formatIssues(r.errors));
  return { problem: prepareProblem(r.scenario), geometry: buildGeometry(r.scenario) };
}

describe('normal-incidence absorption of a rigid-backed porous layer', () => {
  for (const model of ['delany-bazley', 'miki'] as const) {
    for (const [sigma, d] of [[10_000, 0.05], [20_000, 0.1]] as const) {
      it(`${model}, σ = ${sigma} Pa·s/m², d = ${d * 1000} mm: the solver's 1 − |R|² within 0.005 of α(Zs)`, () => {
        const { problem: p, geometry } = tube(model, sigma, d);
        expect(geometry.linings[0].region.x0).toBeCloseTo(0.5 - d, 12);
        const rows: string[] = [];
        for (const f of FREQUENCIES) {
          const r = p.solve(f, () => performance.now());
          if (r.kind !== 'duct') throw new Error('expected a duct');
          const alpha = normalIncidenceAbsorption(rigidBackedImpedance(porousWave(model, f, sigma, air), d), rhoC);
          rows.push(`${f} Hz α ${alpha.toFixed(4)} solver ${r.inletAbsorption.toFixed(4)} (${(r.inletAbsorption - alpha).toExponential(1)})`);
          // Source: Allard & Atalla, Propagation of Sound in Porous Media, 2nd ed. (2009), ch. 2: Zs = −j Zc cot(kc d) on a rigid backing,
          // α = 1 − |(Zs − ρc)/(Zs + ρc)|² at normal incidence (ISO 10534-2 measures the same reflection factor)
          expect(Math.abs(r.inletAbsorption - alpha)).toBeLessThan(0.005);
          // common practice: with a rigid end nothing is transmitted
          expect(r.tlDb).toBeNull();
        }
        console.log(`${model} σ ${sigma} d ${d}: ${rows.join('; ')}`);
      });
    }
  }
});

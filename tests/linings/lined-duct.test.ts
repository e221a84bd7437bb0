/**
 * A straight 200 × 200 mm duct with a 0.6 m section lined on its ±y walls (outer size unchanged, so
 * the lining narrows the airway), between unlined inlet and outlet runs, anechoic at both ends.
 */
import { describe, expect, it } from 'vitest';
import { formatIssues, validateScenario } from '../../engine/scenario/index.ts';
import { prepareProblem } from '../../engine/solve/prepare.ts';

const air = { soundSpeed: 343, density: 1.2 };

function tlOf(lining: { thickness: number; flowResistivity: number } | null, frequencies: number[]): { tl: number[]; passive: boolean } {
  const r = validateScenario({
    format: 'quietgrid/1', air, sweep: { frequenciesHz: [125, 250, 500, 800] }, mesh: { order: 4, pointsPerWavelength: 8 },
    duct: { sections: [{ name: 'in', length: 0.3, width: 0.2, height: 0.2 }, { name: 'lined', length: 0.6, width: 0.2, height: 0.2 }, { name: 'out', length: 0.3, width: 0.2, height: 0.2 }] },
    linings: lining === null ? [] : [{ section: 'lined', faces: ['+y', '-y'], thickness: lining.thickness, material: { model: 'miki', flowResistivity: lining.flowResistivity } }],
  });
  if (!r.ok) throw new Error(formatIssues(r.errors));
  const p = prepareProblem(r.scenario);
  let passive = true;
  const tl = frequencies.map((f) => {
    const point = p.solve(f, () => performance.now());
    if (point.kind !== 'duct') throw new Error('expected a duct');
    passive &&= point.reflectedPower + point.transmittedPower <= point.incidentPower * (1 + 1e-6);
    return point.tlDb!;
  });
  return { tl, passive };
}

const increasing = (v: number[]) => v.every((x, i) => i === 0 || x > v[i - 1]);

describe('lined straight duct', () => {
  it('with σ → 0 (0.01 Pa·s/m²: practically air) gives back the unlined TL within 0.1 dB', () => {
    const f = [125, 250, 500, 800], bare = tlOf(null, f).tl, faint = tlOf({ thickness: 0.05, flowResistivity: 0.01 }, f).tl;
    console.log(`unlined ${bare.map((v) => v.toFixed(3)).join(', ')} dB; σ = 0.01: ${faint.map((v) => v.toFixed(3)).join(', ')} dB`);
    for (let i = 0; i < f.length; i++) {
      // common practice: a uniform rigid duct with anechoic ends transmits all incident power
      expect(Math.abs(bare[i])).toBeLessThan(0.05);
      // Source: Delany & Bazley (1970), Miki (1990): Zc → ρ₀c₀ and kc → ω/c₀ as f/σ grows, so a lining of vanishing σ is the air
      expect(Math.abs(faint[i] - bare[i])).toBeLessThan(0.1);
    }
  });

  it('attenuates more with a thicker lining (σ = 10 kPa·s/m², 25 → 50 → 75 mm)', () => {
    const f = [250, 500], runs = [0.025, 0.05, 0.075].map((thickness) => tlOf({ thickness, flowResistivity: 10_000 }, f));
    console.log(`thickness 25/50/75 mm: ${runs.map((r) => r.tl.map((v) => v.toFixed(2)).join('/')).join(', ')} dB at ${f.join('/')} Hz`);
    for (const r of runs) expect(r.passive).toBe(true);
    for (let i = 0; i < f.length; i++) {
      // from memory: Piening's estimate of a lined duct's attenuation per length, ≈ 1.5·α·P/S, grows with the thickness here on both
      // counts: the airway's P/S grows as it narrows, and α of a rigid-backed layer grows with d below its quarter-wave resonance
      // (Allard & Atalla 2009, ch. 2, Zs = −j Zc cot(kc d)); the layers here are thinner than a quarter wavelength in the material
      expect(increasing(runs.map((r) => r.tl[i]))).toBe(true);
    }
  });

  it('attenuates more with more resistivity while the lining is nearly transparent (σd ≪ ρ₀c₀)', () => {
    // σd/ρ₀c₀ = 0.06, 0.12, 0.24 for d = 50 mm; f/σ stays within the fitted 0.01–1 at 250 and 500 Hz. The
    // attenuation rises with σ up to an optimum and falls beyond it (a very resistive lining is a rigid wall);
    // only the low side, where the trend is monotone, is checked.
    const f = [250, 500], runs = [500, 1000, 2000].map((flowResistivity) => tlOf({ thickness: 0.05, flowResistivity }, f));
    console.log(`σ 500/1000/2000: ${runs.map((r) => r.tl.map((v) => v.toFixed(2)).join('/')).join(', ')} dB at ${f.join('/')} Hz`);
    for (const r of runs) expect(r.passive).toBe(true);
    for (let i = 0; i < f.length; i++) {
      // from memory: a nearly transparent porous layer leaves the sound field almost as it is, and the power it dissipates,
      // σ|v|² per unit volume for a rigid frame (Morse & Ingard, Theoretical Acoustics, 1968), grows with σ
      expect(increasing(runs.map((r) => r.tl[i]))).toBe(true);
    }
  });
});

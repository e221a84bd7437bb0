/** Lining materials in the scenario file: library entries, defaults, fitted-range warnings and the lining report. */
import { describe, expect, it } from 'vitest';
import { buildGeometry, formatIssues, liningReport, validateScenario, type Issue, type NormalisedDuctScenario } from '../../engine/scenario/index.ts';
import { liningMaterial } from '../../engine/acoustics/index.ts';

/** A three-section duct with a lined middle, the lining's material and the sweep given. */
function lined(material: object, sweep: object = { fromHz: 125, toHz: 1000, spacing: 'octave' }): unknown {
  return {
    format: 'quietgrid/1', air: { soundSpeed: 343, density: 1.2 }, sweep,
    duct: { sections: [{ name: 'in', length: 0.3, width: 0.2, height: 0.2 }, { name: 'mid', length: 0.6, width: 0.3, height: 0.3 }, { name: 'out', length: 0.3, width: 0.2, height: 0.2 }] },
    linings: [{ section: 'mid', faces: ['+y', '-y'], thickness: 0.05, material }],
  };
}

function valid(value: unknown): { scenario: NormalisedDuctScenario; warnings: Issue[] } {
  const r = validateScenario(value);
  if (!r.ok) throw new Error(formatIssues(r.errors));
  if (r.scenario.kind !== 'duct') throw new Error('expected a duct');
  // the ports' cross-mode warnings are not the business of these tests
  return { scenario: r.scenario, warnings: r.warnings.filter((w) => w.rule !== 'above-cut-on') };
}

describe('lining materials', () => {
  it('take σ from the library, Miki by default, and say so', () => {
    const { scenario, warnings } = valid(lined({ library: 'mineral-wool-light' }));
    expect(scenario.linings[0].material).toEqual({ model: 'miki', flowResistivity: 10_000, library: 'mineral-wool-light' });
    expect(scenario.defaultsUsed.map((d) => d.path)).toContain('linings[0].material.model');
    expect(warnings).toEqual([]);
  });

  it('keep a model given with a library entry, and σ given by the file', () => {
    expect(valid(lined({ library: 'mineral-wool-light', model: 'delany-bazley' })).scenario.linings[0].material)
      .toEqual({ model: 'delany-bazley', flowResistivity: liningMaterial('mineral-wool-light')!.flowResistivity, library: 'mineral-wool-light' });
    expect(valid(lined({ model: 'miki', flowResistivity: 7000 })).scenario.linings[0].material).toEqual({ model: 'miki', flowResistivity: 7000, library: null });
  });

  it('suggest the library entry meant by a near miss', () => {
    const r = validateScenario(lined({ library: 'mineral-wool-lite' }));
    expect(r.ok).toBe(false);
    if (r.ok) return;
    expect(r.errors[0]).toMatchObject({ path: 'linings[0].material.library', rule: 'enum' });
    expect(r.errors[0].fix).toContain('mineral-wool-light');
  });
});

describe('fitted-range warnings', () => {
  it('warn when the sweep starts below Delany & Bazley\'s range, and point to Miki', () => {
    // σ = 20 000: ρ₀f/σ = 0.01 at 167 Hz, so an octave sweep from 125 Hz starts below it
    const { warnings } = valid(lined({ model: 'delany-bazley', flowResistivity: 20_000 }));
    expect(warnings).toHaveLength(1);
    expect(warnings[0]).toMatchObject({ path: 'linings[0].material', rule: 'lining-model-range' });
    expect(warnings[0].message).toContain('167–16700 Hz');
    expect(warnings[0].fix).toContain('"miki"');
  });

  it('warn when the sweep reaches above the range (a nearly transparent material)', () => {
    const { warnings } = valid(lined({ model: 'miki', flowResistivity: 500 }));
    expect(warnings.map((w) => w.rule)).toEqual(['lining-model-range']);
    expect(warnings[0].message).toContain('above the fitted 1');
  });

  it('stay quiet inside the range', () => {
    expect(valid(lined({ model: 'delany-bazley', flowResistivity: 10_000 }, { fromHz: 125, toHz: 4000, spacing: 'octave' })).warnings).toEqual([]);
  });
});

describe('liningReport', () => {
  it('gives per lining the model, σ, f/σ over the sweep, the validity and the mesh it got', () => {
    const { scenario } = valid(lined({ library: 'mineral-wool-dense' }, { frequenciesHz: [200, 400, 800] }));
    const g = buildGeometry(scenario), [r] = liningReport(scenario, g);
    expect(r).toMatchObject({
      lining: 0, section: 'mid', faces: ['+y', '-y'], thickness: 0.05, model: 'miki', flowResistivity: 50_000,
      library: 'mineral-wool-dense', label: 'Mineral wool, dense (typical σ ≈ 50 kPa·s/m²)', fittedFrequenciesHz: [500, 50_000],
    });
    expect(r.fOverSigma[0]).toBeCloseTo(0.004, 12);
    expect(r.fOverSigma[1]).toBeCloseTo(0.016, 12);
    expect(r.validity.status).toBe('extrapolated');
    expect(r.validity.warning).toContain('f/σ falls to 0.004');
    // a dense material has a much shorter wavelength than the air: its boxes are cut finer
    expect(r.elementSize).not.toBeNull();
    expect(r.boxes).toBeGreaterThan(2);
    expect(r.boxes).toBe(g.linings.reduce((n, l) => n + l.boxes.length, 0));
  });

  it('is empty without linings', () => {
    const s = valid({ format: 'quietgrid/1', sweep: { frequenciesHz: [100] }, duct: { sections: [{ name: 'a', length: 1, width: 0.1, height: 0.1 }] } }).scenario;
    expect(liningReport(s, buildGeometry(s))).toEqual([]);
  });
});

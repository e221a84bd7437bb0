import { describe, expect, it } from 'vitest';
import { formatIssues, validateScenario, type Issue, type NormalisedScenario } from '../../engine/scenario/index.ts';
import { BAD_CASES, badScenario } from './bad-inputs.ts';
import { clone, FULL_DUCT, FULL_ROOM, ISSUE_EXAMPLE, VALID_FIXTURES } from './fixtures.ts';

function valid(value: unknown): { scenario: NormalisedScenario; warnings: Issue[] } {
  const result = validateScenario(value);
  if (!result.ok) throw new Error(formatIssues(result.errors));
  return result;
}

function errorsOf(value: unknown): Issue[] {
  const result = validateScenario(value);
  return result.ok ? [] : result.errors;
}

describe('valid scenarios', () => {
  it.each(Object.entries(VALID_FIXTURES))('%s validates without warnings', (_, fixture) => {
    expect(valid(clone(fixture)).warnings).toEqual([]);
  });

  it('fills the defaults of the issue example and lists them', () => {
    const { scenario } = valid(clone(ISSUE_EXAMPLE));
    expect(scenario.kind).toBe('duct');
    if (scenario.kind !== 'duct') return;
    expect(scenario.duct.outlet).toBe('anechoic');
    expect(scenario.duct.incident).toEqual({ mode: [0, 0], amplitudePa: 1 });
    expect(scenario.duct.sections[0]).toEqual({ name: 'inlet', length: 0.6, width: 0.15, height: 0.1, offsetY: 0, offsetZ: 0 });
    expect(scenario.absorber).toEqual({ kind: 'discrete', layers: 3, thickness: null });
    expect(scenario.linings).toEqual([]);
    const picked = scenario.defaultsUsed.map((d) => d.path);
    expect(picked).toEqual(expect.arrayContaining(['air.soundSpeed', 'air.density', 'duct.outlet', 'duct.incident',
      'duct.sections[0].offsetY', 'duct.sections[2].offsetZ', 'absorber.thickness']));
    // Given in the file, so not defaults:
    expect(picked).not.toContain('duct.sections[1].offsetY');
    expect(picked).not.toContain('mesh.order');
  });

  it('derives the air from 20 °C', () => {
    const { scenario } = valid(clone(ISSUE_EXAMPLE));
    // from memory: dry air at 20 °C and 101.325 kPa, c ≈ 343.2 m/s and ρ ≈ 1.204 kg/m³
    expect(scenario.air.soundSpeed).toBeCloseTo(343.2, 1);
    expect(scenario.air.density).toBeCloseTo(1.204, 3);
  });

  it('keeps given air values over the ones from temperature', () => {
    expect(valid(clone(FULL_DUCT)).scenario.air).toEqual({ temperatureC: 15, soundSpeed: 340, density: 1.22 });
  });

  it('sweeps the fourteen third-octave bands from 50 Hz to 1 kHz at their exact centres', () => {
    const { sweep } = valid(clone(ISSUE_EXAMPLE)).scenario;
    expect(sweep.frequenciesHz).toHaveLength(14);
    // Source: IEC 61260-1:2014, base-10 exact midband frequencies f = 1000·10^(x/10)
    expect(sweep.frequenciesHz[0]).toBeCloseTo(1000 * 10 ** (-13 / 10), 9);
    expect(sweep.frequenciesHz[13]).toBeCloseTo(1000, 9);
  });

  it('applies defaults to a minimal scenario', () => {
    const { scenario } = valid({ format: 'quietgrid/1', sweep: { frequenciesHz: [100] }, duct: { sections: [{ name: 'a', length: 1, width: 0.1, height: 0.1 }] } });
    expect(scenario.title).toBe('Untitled scenario');
    expect(scenario.air.temperatureC).toBe(20);
    expect(scenario.mesh).toEqual({ order: 4, pointsPerWavelength: 8 });
    expect(scenario.defaultsUsed.find((d) => d.path === 'mesh.order')).toMatchObject({ value: 4 });
  });

  it('normalises a room, rigid walls by default', () => {
    const room = clone(FULL_ROOM) as { room: { walls?: unknown } };
    delete room.room.walls;
    const { scenario } = valid(room);
    expect(scenario.kind === 'room' && scenario.room.walls).toEqual({ 'x-': 'rigid', 'x+': 'rigid', 'y-': 'rigid', 'y+': 'rigid', 'z-': 'rigid', 'z+': 'rigid' });
  });
});

describe('bad scenarios name the field and the rule', () => {
  it.each(BAD_CASES.map((c) => [c.name, c] as const))('%s', (_, c) => {
    const errors = errorsOf(badScenario(c));
    expect(errors.map((e) => `${e.path} ${e.rule}`)).toContain(`${c.path} ${c.rule}`);
    for (const e of errors) {
      expect(e.message.startsWith(e.path === '' ? 'the scenario' : e.path)).toBe(true);
      expect(e.message).toContain(`; fix: ${e.fix}`);
      expect(e.fix.length).toBeGreaterThan(5);
    }
  });

  it('words the issue example of a misplaced branch exactly', () => {
    const s = clone(ISSUE_EXAMPLE);
    s.duct.branches[0].at = 0.7;
    expect(errorsOf(s)[0]).toEqual({
      path: 'duct.branches[0].at',
      value: 0.7,
      rule: 'branch-inside-section',
      fix: 'set at between 0.03 and 0.57',
      message: 'duct.branches[0].at = 0.7: the branch centre must lie inside section "inlet" (0 < at < 0.6 m, and the branch width must fit); fix: set at between 0.03 and 0.57',
    });
  });

  it('suggests the near miss of an unknown field', () => {
    const s = clone(ISSUE_EXAMPLE) as Record<string, unknown> & typeof ISSUE_EXAMPLE;
    (s.duct.sections[0] as Record<string, unknown>).lenght = 0.6;
    const e = errorsOf(s).find((i) => i.rule === 'unknown-field')!;
    expect(e.message).toContain('"lenght" is not a field of a duct section');
    expect(e.fix).toMatch(/^did you mean "length"\?/);
  });

  it('refuses older formats saying which version it reads', () => {
    const s = { ...clone(ISSUE_EXAMPLE), format: 'quietgrid/0' };
    const errors = errorsOf(s);
    expect(errors).toHaveLength(1);
    expect(errors[0].message).toContain('reads scenario format quietgrid/1 only, not quietgrid/0');
  });

  it('names the pair of sections that do not connect', () => {
    const s = clone(ISSUE_EXAMPLE);
    (s.duct.sections[1] as { offsetY: number }).offsetY = 0.5;
    expect(errorsOf(s)[0].message).toContain('sections "inlet" and "chamber" do not connect');
  });

  it('tells how long an open branch must be to be outermost', () => {
    const s = clone(ISSUE_EXAMPLE);
    Object.assign(s.duct.branches[0], { length: 0.1, end: 'open' });
    // The chamber reaches y = 0.225 m; the inlet wall is at 0.075 m: 0.15 m of branch reach that far.
    expect(errorsOf(s)[0].fix).toBe('lengthen the branch to at least 0.15 m, or set end to "closed"');
  });

  it('reports every independent error, not just the first', () => {
    const s = clone(ISSUE_EXAMPLE) as { mesh: { order: number }; absorber: { layers: number }; sweep: { fromHz: number } };
    s.mesh.order = 9;
    s.absorber.layers = 0;
    s.sweep.fromHz = -1;
    expect(errorsOf(s).map((e) => e.path)).toEqual(expect.arrayContaining(['mesh.order', 'absorber.layers', 'sweep.fromHz']));
  });

  it('caps a flood of errors with a count of the rest', () => {
    const s: Record<string, unknown> = clone(ISSUE_EXAMPLE);
    for (let i = 0; i < 500; i++) s[`junk${i}`] = i;
    const errors = errorsOf(s);
    expect(errors).toHaveLength(101);
    expect(errors[100].rule).toBe('too-many-errors');
    expect(errors[100].message).toContain('400 more errors');
  });
});

describe('warnings', () => {
  const warningsOf = (mutate: (s: typeof ISSUE_EXAMPLE & Record<string, unknown>) => void) => {
    const s = clone(ISSUE_EXAMPLE) as typeof ISSUE_EXAMPLE & Record<string, unknown>;
    mutate(s);
    return valid(s).warnings.map((w) => `${w.path} ${w.rule}`);
  };

  it('warns below 4 points per wavelength', () => {
    expect(warningsOf((s) => (s.mesh.pointsPerWavelength = 3))).toEqual(['mesh.pointsPerWavelength points-per-wavelength-low']);
  });

  it('warns when the sweep passes the inlet cut-on', () => {
    // Source: Morse & Ingard, Theoretical Acoustics (1968): first cross-mode of a rigid rectangular duct at c/(2a); 343/0.3 m ≈ 1144 Hz
    expect(warningsOf((s) => (s.sweep.toHz = 1250))).toContain('sweep above-cut-on');
    expect(warningsOf((s) => (s.sweep.toHz = 1000))).toEqual([]);
  });

  it('warns when the incident mode does not propagate', () => {
    expect(warningsOf((s) => ((s.duct as Record<string, unknown>).incident = { mode: [1, 0] }))).toEqual(['duct.incident.mode incident-mode-cut-off']);
  });

  it('warns when swept frequencies have no source power band', () => {
    expect(warningsOf((s) => (s.sourcePower = { octaveBandsDb: { 125: 80 } }))).toEqual(['sourcePower.octaveBandsDb source-power-bands']);
  });
});

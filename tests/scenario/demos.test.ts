import { readdirSync, readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { buildGeometry, liningReport, readScenario } from '../../engine/scenario/index.ts';

const dir = new URL('../../scenarios/', import.meta.url);
const demos = readdirSync(dir).filter((f) => f.endsWith('.json') && f !== 'schema.json');
const read = (file: string) => readScenario(readFileSync(new URL(file, dir), 'utf8'));

describe('demo scenarios', () => {
  it('are the five promised ones', () => {
    expect(demos.sort()).toEqual(['ahu-discharge-lined-plenum.json', 'generator-room-small.json', 'kitchen-extract-stub-resonator.json', 'office-plenum-offset-ports.json', 'plant-room-supply-silencer.json']);
  });

  it.each(demos)('%s validates without warnings, says it is invented, and stays small', (file) => {
    const { scenario, warnings } = read(file);
    expect(warnings).toEqual([]);
    expect(scenario.title).toContain('invented demo data');
    expect(scenario.sweep.frequenciesHz.length).toBeLessThanOrEqual(15);
    expect(scenario.mesh.order).toBeLessThanOrEqual(4);
    expect(buildGeometry(scenario).openings.length).toBeGreaterThan(0);
  });

  it('tunes the kitchen stub near the blade-pass tone', () => {
    const { scenario } = read('kitchen-extract-stub-resonator.json');
    if (scenario.kind !== 'duct') throw new Error('expected a duct');
    const stub = scenario.duct.branches[0];
    const bladePassHz = (10 * 1890) / 60;
    // common practice: a closed side branch resonates where its depth plus end correction is a quarter wavelength
    const tunedHz = scenario.air.soundSpeed / (4 * (stub.length + 0.04));
    expect(Math.abs(tunedHz - bladePassHz) / bladePassHz).toBeLessThan(0.05);
    expect(scenario.sweep.frequenciesHz.some((f) => Math.abs(f - bladePassHz) / bladePassHz < 0.02)).toBe(true);
  });

  it('offsets the plenum ports so that they do not face each other', () => {
    const g = buildGeometry(read('office-plenum-offset-ports.json').scenario);
    const { inlet, outlet } = g.duct!;
    expect(Math.min(inlet.rect.y1, outlet.rect.y1) - Math.max(inlet.rect.y0, outlet.rect.y0)).toBeLessThanOrEqual(0);
  });

  it('lines the whole AHU plenum and nothing else, with a library material inside its model\'s fitted range', () => {
    const { scenario } = read('ahu-discharge-lined-plenum.json');
    if (scenario.kind !== 'duct') throw new Error('expected a duct');
    const g = buildGeometry(scenario);
    expect(g.linings.map((l) => l.face).sort()).toEqual(['+x', '+y', '+z', '-x', '-y', '-z']);
    expect(new Set(g.linings.map((l) => l.section))).toEqual(new Set(['plenum']));
    expect(scenario.linings[0].material.library).toBe('mineral-wool-light');
    const report = liningReport(scenario, g);
    expect(report[0].validity.status).toBe('in-range');
  });

  it('sweeps the generator room from 31.5 to 125 Hz with one source and two receivers', () => {
    const { scenario } = read('generator-room-small.json');
    if (scenario.kind !== 'room') throw new Error('expected a room');
    expect(scenario.sweep.spacing === 'third-octave' && scenario.sweep.bands.map((b) => b.nominalHz)).toEqual([31.5, 40, 50, 63, 80, 100, 125]);
    expect(scenario.room.sources).toHaveLength(1);
    expect(scenario.room.receivers).toHaveLength(2);
    expect(Object.values(scenario.room.walls).filter((w) => w === 'open')).toHaveLength(1);
  });
});

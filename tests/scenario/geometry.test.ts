import { describe, expect, it } from 'vitest';
import { buildGeometry, validateScenario, formatIssues, type Geometry, type NormalisedScenario } from '../../engine/scenario/index.ts';
import { snapper } from '../../engine/scenario/snap.ts';
import { clone, FULL_DUCT, FULL_ROOM, ISSUE_EXAMPLE } from './fixtures.ts';

function geometryOf(value: unknown): Geometry {
  const result = validateScenario(value);
  if (!result.ok) throw new Error(formatIssues(result.errors));
  return buildGeometry(result.scenario as NormalisedScenario);
}

// The issue example worked out by hand. Sections along +x from 0: inlet 0…0.6, chamber 0.6…1.1,
// outlet 1.1…1.7, each centred on the axis. The stub stands on the inlet's +y wall (y = 0.075),
// centred 0.3 m from its start, 0.06 m wide: x 0.27…0.33, y 0.075…0.325, z −0.05…0.05.
describe('geometry of the issue example', () => {
  const g = geometryOf(clone(ISSUE_EXAMPLE));

  it('has one box per section and branch', () => {
    expect(g.kind).toBe('duct');
    expect(g.boxes).toEqual([
      { x0: 0, x1: 0.6, y0: -0.075, y1: 0.075, z0: -0.05, z1: 0.05, tag: 'inlet' },
      { x0: 0.6, x1: 1.1, y0: -0.225, y1: 0.225, z0: -0.15, z1: 0.15, tag: 'chamber' },
      { x0: 1.1, x1: 1.7, y0: -0.075, y1: 0.075, z0: -0.05, z1: 0.05, tag: 'outlet' },
      { x0: 0.27, x1: 0.33, y0: 0.075, y1: 0.325, z0: -0.05, z1: 0.05, tag: 'stub' },
    ]);
    expect(g.bounds).toEqual({ x0: 0, x1: 1.7, y0: -0.225, y1: 0.325, z0: -0.15, z1: 0.15, tag: 'bounds' });
  });

  it('lists every face coordinate once, sorted', () => {
    expect(g.breakpoints).toEqual({
      x: [0, 0.27, 0.33, 0.6, 1.1, 1.7],
      y: [-0.225, -0.075, 0.075, 0.225, 0.325],
      z: [-0.15, -0.05, 0.05, 0.15],
    });
  });

  it('opens the inlet and the anechoic outlet, not the closed stub', () => {
    const duct = { a0: -0.075, a1: 0.075, b0: -0.05, b1: 0.05 };
    expect(g.openings).toEqual([
      { side: '-x', rect: duct, name: 'inlet' },
      { side: '+x', rect: duct, name: 'outlet' },
    ]);
  });

  it('places the ports and their straight lengths', () => {
    const rect = { y0: -0.075, y1: 0.075, z0: -0.05, z1: 0.05 };
    expect(g.duct!.inlet).toEqual({ x: 0, rect, clearTo: 0.27 });
    expect(g.duct!.outlet).toEqual({ x: 1.7, rect, clearFrom: 1.1, termination: 'anechoic' });
    expect(g.duct!.sections.map((s) => [s.name, s.x0, s.x1, s.width, s.height])).toEqual([
      ['inlet', 0, 0.6, 0.15, 0.1], ['chamber', 0.6, 1.1, 0.45, 0.3], ['outlet', 1.1, 1.7, 0.15, 0.1],
    ]);
    expect(g.duct!.branches).toEqual([{ name: 'stub', section: 'inlet', side: '+y', end: 'closed', box: g.boxes[3] }]);
  });
});

describe('geometry of other layouts', () => {
  it('opens an open branch end on its side and keeps a reflecting outlet closed', () => {
    const g = geometryOf(clone(FULL_DUCT));
    // "vent": +y of "box" (x 0.5…1.0, y −0.25…0.25), centred 0.25 m in, 0.1 wide and 0.1 high: end face at y = 0.35.
    expect(g.openings).toEqual([
      { side: '-x', rect: { a0: -0.09, a1: 0.11, b0: -0.085, b1: 0.065 }, name: 'inlet' },
      { side: '+y', rect: { a0: 0.7, a1: 0.8, b0: -0.05, b1: 0.05 }, name: 'vent' },
    ]);
    expect(g.bounds.y1).toBe(0.35);
    expect(g.duct!.outlet.termination).toEqual({ impedance: [1.5, -0.3] });
    // "stub" on "in" (x 0…0.5) spans x 0.21…0.29, so the inlet is straight up to 0.21.
    expect(g.duct!.inlet.clearTo).toBe(0.21);
  });

  it('opens whole room walls', () => {
    const g = geometryOf(clone(FULL_ROOM));
    expect(g.kind).toBe('room');
    expect(g.boxes).toEqual([{ x0: 0, x1: 2, y0: 0, y1: 1.6, z0: 0, z1: 1.2, tag: 'room' }]);
    expect(g.openings).toEqual([{ side: '+x', rect: { a0: 0, a1: 1.6, b0: 0, b1: 1.2 }, name: 'wall x+' }]);
    expect(g.breakpoints).toEqual({ x: [0, 2], y: [0, 1.6], z: [0, 1.2] });
    expect(g.room!.sources[0].position).toEqual([0.7, 0.8, 0.4]);
    expect(g.room!.walls['y-']).toEqual({ absorption: 0.3 });
  });

  it('snaps coordinates that differ by less than 1e-9 m', () => {
    const s = clone(ISSUE_EXAMPLE) as typeof ISSUE_EXAMPLE & { duct: { sections: { offsetY?: number }[] } };
    s.duct.sections[2].offsetY = 4e-10;
    const g = geometryOf(s);
    expect(g.breakpoints.y).toEqual([-0.225, -0.075, 0.075, 0.225, 0.325]);
    expect(g.boxes[2].y0).toBe(-0.075);
  });

  it('keeps sums of decimal lengths exact', () => {
    const g = geometryOf({
      format: 'quietgrid/1', sweep: { frequenciesHz: [100] },
      duct: { sections: [0.1, 0.1, 0.1].map((length, i) => ({ name: `s${i}`, length, width: 0.1 + 0.01 * i, height: 0.1 })) },
    });
    // 0.1 + 0.1 + 0.1 is 0.30000000000000004 in binary floating point.
    expect(g.breakpoints.x).toEqual([0, 0.1, 0.2, 0.3]);
  });
});

describe('snapper', () => {
  it('maps near values to one representative and leaves distinct ones alone', () => {
    const snap = snapper([0, 1, 1 + 4e-10, 2, 2 + 5e-9]);
    expect([snap(1 + 4e-10), snap(1), snap(1 - 3e-10), snap(2), snap(2 + 5e-9)]).toEqual([1, 1, 1, 2, 2 + 5e-9]);
  });
});

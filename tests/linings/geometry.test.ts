/** Linings as boxes: the corner and end-wall rules, the ports' unlined runs, and the finer cut for the material's wavelength. */
import { describe, expect, it } from 'vitest';
import { buildGeometry, formatIssues, liningMedia, validateScenario, type TaggedBox, type Geometry, type NormalisedScenario } from '../../engine/scenario/index.ts';
import { porousMedium } from '../../engine/acoustics/index.ts';
import { prepareProblem } from '../../engine/solve/prepare.ts';

const air = { soundSpeed: 343, density: 1.2 };
const mat = (flowResistivity: number) => ({ model: 'miki', flowResistivity });

function scenarioOf(duct: object, linings: object[], sweep: object = { frequenciesHz: [200, 400] }, mesh: object = { order: 3, pointsPerWavelength: 6 }): NormalisedScenario {
  const r = validateScenario({ format: 'quietgrid/1', air, sweep, mesh, duct, linings });
  if (!r.ok) throw new Error(formatIssues(r.errors));
  return r.scenario;
}

const volume = (b: TaggedBox) => (b.x1 - b.x0) * (b.y1 - b.y0) * (b.z1 - b.z0);
const overlap = (a: TaggedBox, b: TaggedBox) => Math.max(0, Math.min(a.x1, b.x1) - Math.max(a.x0, b.x0)) * Math.max(0, Math.min(a.y1, b.y1) - Math.max(a.y0, b.y0)) * Math.max(0, Math.min(a.z1, b.z1) - Math.max(a.z0, b.z0));
const inside = (a: TaggedBox, b: TaggedBox) => a.x0 >= b.x0 - 1e-12 && a.x1 <= b.x1 + 1e-12 && a.y0 >= b.y0 - 1e-12 && a.y1 <= b.y1 + 1e-12 && a.z0 >= b.z0 - 1e-12 && a.z1 <= b.z1 + 1e-12;
const liningBoxes = (g: Geometry) => g.linings.flatMap((l) => l.boxes.map((i) => g.boxes[i]));

describe('a chamber lined on all six faces', () => {
  // sides 50 mm, end walls 80 mm; the outlet is offset in y but opens inside the side linings
  const s = scenarioOf({
    sections: [{ name: 'in', length: 0.4, width: 0.2, height: 0.15 }, { name: 'chamber', length: 0.6, width: 0.5, height: 0.4 }, { name: 'out', length: 0.4, width: 0.2, height: 0.15, offsetY: 0.1 }],
  }, [
    { section: 'chamber', faces: ['+y', '-y', '+z', '-z'], thickness: 0.05, material: mat(8000) },
    { section: 'chamber', faces: ['-x', '+x'], thickness: 0.08, material: { library: 'mineral-wool-light' } },
  ]);
  const g = buildGeometry(s), chamber = g.boxes.find((b) => b.tag === 'chamber')!;

  it('lists the lining boxes first, tagged by section and face, each face once', () => {
    const n = liningBoxes(g).length;
    expect(g.boxes.slice(n).map((b) => b.tag)).toEqual(['in', 'chamber', 'out']);
    expect(g.linings.map((l) => l.face).sort()).toEqual(['+x', '+y', '+z', '-x', '-y', '-z']);
    expect(g.linings.flatMap((l) => l.boxes).sort((a, b) => a - b)).toEqual([...Array(n).keys()]);
    for (const l of g.linings) {
      expect(l.tag).toBe(`lining:chamber:${l.face}`);
      for (const i of l.boxes) expect(g.boxes[i].tag).toBe(l.tag);
    }
    expect(g.linings.find((l) => l.face === '+x')).toMatchObject({ lining: 1, thickness: 0.08, model: 'miki', flowResistivity: 10_000, library: 'mineral-wool-light' });
  });

  it('fills the walls without overlap: side slabs full height, ±z between them, ends inside both and open to the ports', () => {
    const boxes = liningBoxes(g);
    for (let i = 0; i < boxes.length; i++) {
      expect(inside(boxes[i], chamber)).toBe(true);
      for (let j = i + 1; j < boxes.length; j++) expect(overlap(boxes[i], boxes[j])).toBeLessThan(1e-15);
    }
    const region = (face: string) => g.linings.find((l) => l.face === face)!.region;
    expect(region('+y')).toMatchObject({ x0: 0.4, x1: 1, y0: 0.2, y1: 0.25, z0: -0.2, z1: 0.2 });
    expect(region('-z')).toMatchObject({ x0: 0.4, x1: 1, y0: -0.2, y1: 0.2, z0: -0.2, z1: -0.15 });
    expect(region('-x')).toMatchObject({ x0: 0.4, x1: 0.48, y0: -0.2, y1: 0.2, z0: -0.15, z1: 0.15 });
    // what is left of the chamber is the airway plus the two openings through the end linings
    const airway = (0.6 - 2 * 0.08) * (0.5 - 2 * 0.05) * (0.4 - 2 * 0.05), openings = 2 * 0.08 * 0.2 * 0.15;
    expect(boxes.reduce((v, b) => v + volume(b), 0)).toBeCloseTo(volume(chamber) - airway - openings, 12);
  });

  it('gives each lining box its material\'s medium and every other box the air', () => {
    const media = liningMedia(g, air)!(500), n = liningBoxes(g).length;
    expect(media).toHaveLength(g.boxes.length);
    expect(media.slice(n).every((m) => m === null)).toBe(true);
    for (const l of g.linings) for (const i of l.boxes) expect(media[i]).toEqual(porousMedium('miki', 500, l.flowResistivity, air));
    expect(liningMedia(buildGeometry(scenarioOf({ sections: [{ name: 'a', length: 1, width: 0.1, height: 0.1 }] }, [])), air)).toBeUndefined();
  });

  it('leaves the ports straight and unlined, their faces on the grid', () => {
    expect(g.duct!.inlet.clearTo).toBe(0.4);
    expect(g.duct!.outlet.clearFrom).toBe(1);
    expect(g.openings.map((o) => o.name)).toEqual(['inlet', 'outlet']);
    for (const axis of ['x', 'y', 'z'] as const) {
      const b = g.breakpoints[axis];
      for (let i = 1; i < b.length; i++) expect(b[i] - b[i - 1]).toBeGreaterThan(1e-6); // snapped: no near-duplicate faces
    }
    expect(g.breakpoints.y).toEqual(expect.arrayContaining([-0.2, 0.2, 0, -0.1, 0.1]));
  });
});

describe('the ports\' runs', () => {
  it('end where an inlet section\'s end wall is lined, and the closed duct\'s end layer covers the whole end', () => {
    const g = buildGeometry(scenarioOf({ sections: [{ name: 'tube', length: 0.5, width: 0.05, height: 0.05 }], outlet: 'rigid' },
      [{ section: 'tube', faces: ['+x'], thickness: 0.1, material: mat(10_000) }]));
    expect(g.duct!.inlet.clearTo).toBeCloseTo(0.4, 12);
    expect(g.linings[0].region).toMatchObject({ x0: 0.4, x1: 0.5, y0: -0.025, y1: 0.025, z0: -0.025, z1: 0.025 });
    expect(g.openings.map((o) => o.name)).toEqual(['inlet']);
  });

  it('start after an end-wall lining of an anechoic outlet section', () => {
    const g = buildGeometry(scenarioOf({ sections: [{ name: 'a', length: 0.4, width: 0.1, height: 0.1 }, { name: 'b', length: 0.6, width: 0.3, height: 0.2 }] },
      [{ section: 'b', faces: ['-x'], thickness: 0.05, material: mat(10_000) }]));
    expect(g.duct!.outlet.clearFrom).toBeCloseTo(0.45, 12);
    // the end wall around the 0.1 × 0.1 opening: 0.3 × 0.2 − 0.1 × 0.1, 50 mm deep
    expect(liningBoxes(g).reduce((v, b) => v + volume(b), 0)).toBeCloseTo(0.05 * (0.06 - 0.01), 12);
  });

  it('of a closed outlet are not measured, so a lined last section leaves clearFrom at its start', () => {
    const g = buildGeometry(scenarioOf({ sections: [{ name: 'a', length: 0.4, width: 0.2, height: 0.2 }, { name: 'b', length: 0.6, width: 0.2, height: 0.2 }], outlet: { absorption: 0.5 } },
      [{ section: 'b', faces: ['+y', '-y', '+x'], thickness: 0.05, material: mat(10_000) }]));
    expect(g.duct!.outlet.clearFrom).toBe(0.4);
    expect(g.duct!.inlet.clearTo).toBe(0.4);
  });
});

describe('elements inside a lining', () => {
  it('are no longer than the material\'s own wavelength calls for, and the air elsewhere keeps its grading', () => {
    const sections = [{ name: 'in', length: 0.3, width: 0.2, height: 0.2 }, { name: 'lined', length: 0.8, width: 0.3, height: 0.3 }, { name: 'out', length: 0.3, width: 0.2, height: 0.2 }];
    const s = scenarioOf({ sections }, [{ section: 'lined', faces: ['+y', '-y', '+z'], thickness: 0.06, material: mat(40_000) }], { frequenciesHz: [250, 500, 1000] }, { order: 3, pointsPerWavelength: 6 });
    const g = buildGeometry(s), grid = prepareProblem(s).mesh.grid;
    const sizes = g.linings.map((l) => l.elementSize!);
    expect(sizes.every((h) => h > 0 && h < (3 * 343) / (1000 * 6))).toBe(true);
    const lined = new Set(g.linings.flatMap((l) => l.boxes)), [nx, ny] = grid.dims;
    let checked = 0;
    for (let c = 0; c < grid.box.length; c++) {
      if (!lined.has(grid.box[c])) continue;
      const ijk = [c % nx, Math.floor(c / nx) % ny, Math.floor(c / (nx * ny))];
      for (let a = 0; a < 3; a++) expect(grid.axes[a].nodes[ijk[a] + 1] - grid.axes[a].nodes[ijk[a]]).toBeLessThanOrEqual(Math.min(...sizes) * (1 + 1e-9));
      checked++;
    }
    expect(checked).toBeGreaterThan(0);
    // the outlet run, past the lined section, keeps the air's element length along x
    const xs = grid.axes[0].nodes, hAir = (3 * 343) / (1000 * 6), i = xs.findIndex((x) => x > 1.25), h = xs[i] - xs[i - 1];
    expect(h).toBeGreaterThan(Math.min(...sizes));
    expect(h).toBeLessThanOrEqual(hAir + 1e-12);
  });
});

// Field slices (engine/solve/slice.ts, behind the app's field view): the fast sampler against the engine's own point evaluation (evaluateAt), solid points
// blank, and the total field rebuilt upstream of the solver's total/scattered split.
import { readFileSync } from 'node:fs';
import { beforeAll, describe, expect, it } from 'vitest';
import { validateScenario, type NormalisedScenario } from '../../engine/scenario/index.ts';
import { prepareProblem } from '../../engine/solve/prepare.ts';
import type { Problem } from '../../engine/solve/problem.ts';
import { evaluateAt } from '../../engine/assembly/sources.ts';
import type { ComplexVector } from '../../engine/linalg/sparse.ts';
import { elementOfCell, sampleCounts, sampleSlice } from '../../engine/solve/slice.ts';
import { planeAxes } from '../../engine/core/space.ts';

function scenario(value: unknown): NormalisedScenario {
  const r = validateScenario(value);
  if (!r.ok) throw new Error(r.errors.map((e) => e.message).join('\n'));
  return r.scenario;
}

const demo = (name: string) => JSON.parse(readFileSync(new URL(`../../scenarios/${name}.json`, import.meta.url), 'utf8'));

describe('slice sampler', () => {
  let p: Problem, u: ComplexVector;
  beforeAll(() => {
    const s = demo('kitchen-extract-stub-resonator');
    s.sweep = { frequenciesHz: [315] };
    p = prepareProblem(scenario(s));
    u = p.solve(315, () => performance.now(), true).field!;
  });

  it('matches evaluateAt at every air sample, and is NaN exactly where there is no air', () => {
    const mesh = p.mesh, b = p.bounds;
    for (const axis of [0, 1, 2] as const) {
      // x: clear of the stub; y: the middle; z: through the stub on top
      const pos = [b.x0 + 0.2, (b.y0 + b.y1) / 2, b.z1 - 0.01][axis];
      const s = sampleSlice(mesh, elementOfCell(mesh), u, b, 315, { axis, position: pos, maxSamples: 60 });
      const [ua, va] = planeAxes(axis);
      let air = 0, solid = 0;
      for (let j = 0; j < s.v.length; j++) for (let i = 0; i < s.u.length; i++) {
        const xyz: [number, number, number] = [0, 0, 0];
        xyz[axis] = pos; xyz[ua] = s.u[i]; xyz[va] = s.v[j];
        const k = i + s.u.length * j;
        let expected: { re: number; im: number } | null = null;
        try { expected = evaluateAt(mesh, u, xyz); } catch { expected = null; }
        if (expected === null) { expect(Number.isNaN(s.re[k])).toBe(true); solid++; continue; }
        air++;
        expect(s.re[k]).toBeCloseTo(expected.re, 12);
        expect(s.im[k]).toBeCloseTo(expected.im, 12);
      }
      expect(air).toBeGreaterThan(20);
      // the bounding box of a duct with a stub holds solid corners in every one of these planes
      expect(solid).toBeGreaterThan(0);
    }
  });

  it('keeps samples square: the longer side gets maxSamples', () => {
    expect(sampleCounts(2, 1, 100)).toEqual([100, 50]);
    expect(sampleCounts(0.2, 1.2, 60)).toEqual([10, 60]);
  });
});

describe('total field', () => {
  it('is the incident plane wave alone in a straight anechoic duct, upstream of the split as well', () => {
    // Source: a rigid straight duct with an anechoic end carries the launched wave unchanged,
    // p = A·e^{−jkx} (Kinsler, Frey, Coppens & Sanders, Fundamentals of Acoustics, 4th ed. 2000, ch. 9).
    const f = 400, s = scenario({
      format: 'quietgrid/1', sweep: { frequenciesHz: [f] }, mesh: { order: 4, pointsPerWavelength: 8 },
      duct: { sections: [{ name: 'run', length: 0.8, width: 0.2, height: 0.15 }], incident: { amplitudePa: 2 } },
    });
    const p = prepareProblem(s), mesh = p.mesh, raw = p.solve(f, () => performance.now(), true).field!;
    const u = p.totalField(f, raw), k = (2 * Math.PI * f) / s.air.soundSpeed, split = 0.3 * 0.8; // 30 % into the straight inlet run
    const slice = sampleSlice(mesh, elementOfCell(mesh), u, p.bounds, f, { axis: 2, position: 0.01, maxSamples: 40 });
    let worst = 0, upstream = 0;
    for (let j = 0; j < slice.v.length; j++) for (let i = 0; i < slice.u.length; i++) {
      const x = slice.u[i], kk = i + slice.u.length * j;
      if (x < split) upstream++;
      worst = Math.max(worst, Math.hypot(slice.re[kk] - 2 * Math.cos(-k * x), slice.im[kk] - 2 * Math.sin(-k * x)));
    }
    expect(upstream).toBeGreaterThan(0);
    expect(worst / 2).toBeLessThan(5e-3);
    // Without the incident wave added back, the upstream samples hold only the (tiny) reflection.
    const bare = sampleSlice(mesh, elementOfCell(mesh), raw, p.bounds, f, { axis: 2, position: 0.01, maxSamples: 40 });
    expect(Math.hypot(bare.re[0], bare.im[0])).toBeLessThan(0.01);
  });

  it('leaves a room field as it is', () => {
    const s = demo('generator-room-small');
    s.sweep = { frequenciesHz: [50] };
    const p = prepareProblem(scenario(s)), u = p.solve(50, () => performance.now(), true).field!;
    expect(p.totalField(50, u)).toBe(u);
  });
});

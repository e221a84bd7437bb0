import { describe, expect, it } from 'vitest';
import { numberDofs } from '../../engine/grid/numbering.ts';
import { buildGrid } from '../../engine/grid/grid.ts';
import { buildMesh, dofCoordinates } from '../../engine/grid/mesh.ts';

/** The 48 symmetries of the cube: an axis permutation and a reflection per axis. */
function symmetries(): { perm: number[]; flip: boolean[] }[] {
  const perms = [[0, 1, 2], [0, 2, 1], [1, 0, 2], [1, 2, 0], [2, 0, 1], [2, 1, 0]], out: { perm: number[]; flip: boolean[] }[] = [];
  for (const perm of perms) for (let f = 0; f < 8; f++) out.push({ perm, flip: [!!(f & 1), !!(f & 2), !!(f & 4)] });
  return out;
}

function rng(seed: number) {
  let s = seed >>> 0;
  return () => ((s = (s * 1664525 + 1013904223) >>> 0) / 2 ** 32);
}

describe('dof numbering', () => {
  for (const p of [1, 2, 3, 4]) {
    it(`p = ${p}: elements in mixed orientations share every node of every shared vertex, edge and face`, () => {
      const [nx, ny, nz] = [3, 2, 2], sym = symmetries(), rand = rng(7 + p), nel = nx * ny * nz, n = p + 1;
      const vid = (i: number, j: number, k: number) => i + (nx + 1) * (j + (ny + 1) * k);
      const verts = new Int32Array(8 * nel), maps: ((r: number[]) => number[])[] = [];
      for (let k = 0, e = 0; k < nz; k++) for (let j = 0; j < ny; j++) for (let i = 0; i < nx; i++, e++) {
        const { perm, flip } = sym[Math.floor(rand() * 48)];
        // local reference coordinate r[d] (in 0..p) drives natural axis perm[d], reversed if flip[d]
        const toNatural = (r: number[]) => { const q = [0, 0, 0]; for (let d = 0; d < 3; d++) q[perm[d]] = flip[d] ? p - r[d] : r[d]; return q; };
        maps.push((r) => { const q = toNatural(r); return [i * p + q[0], j * p + q[1], k * p + q[2]]; });
        for (let v = 0; v < 8; v++) {
          const q = toNatural([(v & 1) * p, ((v >> 1) & 1) * p, ((v >> 2) & 1) * p]);
          verts[8 * e + v] = vid(i + q[0] / p, j + q[1] / p, k + q[2] / p);
        }
      }
      const num = numberDofs(verts, (nx + 1) * (ny + 1) * (nz + 1), p);
      // common practice: a conforming order-p hexahedral mesh has one dof per lattice node
      expect(num.ndofs).toBe((nx * p + 1) * (ny * p + 1) * (nz * p + 1));
      const pointOfDof = new Map<number, string>(), dofOfPoint = new Map<string, number>();
      for (let e = 0; e < nel; e++) for (let I = 0; I < n ** 3; I++) {
        const key = maps[e]([I % n, Math.floor(I / n) % n, Math.floor(I / (n * n))]).join(',');
        const d = num.elementDofs[e * n ** 3 + I];
        if (pointOfDof.has(d)) expect(pointOfDof.get(d)).toBe(key);
        else pointOfDof.set(d, key);
        if (dofOfPoint.has(key)) expect(dofOfPoint.get(key)).toBe(d);
        else dofOfPoint.set(key, d);
      }
      expect(dofOfPoint.size).toBe(num.ndofs);
    });
  }

  it('the structured mesh gives continuous coordinates and skips solid cells', () => {
    // an L-shaped duct: a main run and a side stub, order 3
    const grid = buildGrid({ order: 3, boxes: [{ x0: 0, x1: 1, y0: 0, y1: 0.2, z0: 0, z1: 0.1 }, { x0: 0.4, x1: 0.6, y0: 0.2, y1: 0.5, z0: 0, z1: 0.1 }], openings: [], maxElementSize: 0.2, layerCount: 0 });
    const mesh = buildMesh(grid), xyz = dofCoordinates(mesh);
    expect(mesh.elements.length).toBeLessThan(grid.air.length);
    const seen = new Set<string>();
    for (let d = 0; d < mesh.numbering.ndofs; d++) {
      const x = xyz[3 * d], y = xyz[3 * d + 1];
      // every node lies in the air region
      expect((y <= 0.2 + 1e-12) || (x >= 0.4 - 1e-12 && x <= 0.6 + 1e-12)).toBe(true);
      seen.add([x, y, xyz[3 * d + 2]].map((v) => v.toFixed(9)).join());
    }
    expect(seen.size).toBe(mesh.numbering.ndofs);
  });
});

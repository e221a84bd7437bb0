import { describe, expect, it } from 'vitest';
import { buildGrid } from '../../engine/grid/grid.ts';
import { buildMesh, dofCoordinates } from '../../engine/grid/mesh.ts';
import { fieldToVtu, subHexahedra, VTK_HEXAHEDRON } from '../../engine/report/vtk.ts';

// Two order-2 elements along x and one absorbing layer element beyond the open +x end.
const grid = buildGrid({
  order: 2, boxes: [{ x0: 0, x1: 1, y0: 0, y1: 0.5, z0: 0, z1: 0.5 }],
  openings: [{ side: '+x', rect: { a0: 0, a1: 0.5, b0: 0, b1: 0.5 } }], maxElementSize: 0.5, layerCount: 1,
});
const mesh = buildMesh(grid), xyz = dofCoordinates(mesh), n = mesh.numbering.ndofs;

/** Numbers of the DataArray called `name` (or the first unnamed one: the points). */
function dataArray(vtu: string, name: string | null): number[] {
  const re = name === null ? /<DataArray type="Float64" NumberOfComponents="3" format="ascii">\n([^<]*)<\/DataArray>/ : new RegExp(`Name="${name}"[^>]*>\\n([^<]*)</DataArray>`);
  return re.exec(vtu)![1].trim().split(/\s+/).map(Number);
}

describe('fieldToVtu', () => {
  const level = 20, amplitude = Math.SQRT2 * 20e-6 * 10 ** (level / 20);
  const field = { re: new Float64Array(n).fill(amplitude), im: new Float64Array(n) };
  const vtu = fieldToVtu(mesh, xyz, field, { frequencyHz: 250 });

  it('writes the p³ linear sub-hexahedra of the physical elements only, by default', () => {
    expect(mesh.elements.length).toBe(3);
    // Source: Kitware, "VTK File Formats" (VTK User's Guide): Piece attributes, cell type 12 = VTK_HEXAHEDRON, offsets end each cell's connectivity
    expect(vtu).toMatch(/<Piece NumberOfPoints="45" NumberOfCells="16">/);
    expect(dataArray(vtu, 'types')).toEqual(new Array(16).fill(VTK_HEXAHEDRON));
    expect(dataArray(vtu, 'offsets')).toEqual(Array.from({ length: 16 }, (_, i) => 8 * (i + 1)));
    expect(subHexahedra(mesh, true).length).toBe(3 * 8 * 8);
    expect(fieldToVtu(mesh, xyz, field, { includeLayers: true })).toMatch(/NumberOfCells="24"/);
  });

  it('orders each cell\'s corners as VTK_HEXAHEDRON: 0–3 counter-clockwise at the bottom, 4–7 above', () => {
    const pts = dataArray(vtu, null), conn = dataArray(vtu, 'connectivity');
    const at = (c: number, k: number) => [pts[3 * conn[8 * c + k]], pts[3 * conn[8 * c + k] + 1], pts[3 * conn[8 * c + k] + 2]];
    for (let c = 0; c < 16; c++) {
      const [p0, p1, , p3, p4, , p6] = [0, 1, 2, 3, 4, 5, 6].map((k) => at(c, k));
      // Source: Kitware, "VTK File Formats", figure of the linear cell types (VTK_HEXAHEDRON node order)
      expect([p1[0] > p0[0], p1[1] === p0[1], p1[2] === p0[2]]).toEqual([true, true, true]);
      expect([p3[0] === p0[0], p3[1] > p0[1], p3[2] === p0[2]]).toEqual([true, true, true]);
      expect([p4[0] === p0[0], p4[1] === p0[1], p4[2] > p0[2]]).toEqual([true, true, true]);
      expect([p6[0] > p0[0], p6[1] > p0[1], p6[2] > p0[2]]).toEqual([true, true, true]);
      // every physical cell lies inside the air box, none in the layer beyond x = 1
      expect(p6[0]).toBeLessThanOrEqual(1 + 1e-12);
    }
  });

  it('writes |p|, the level from the RMS value re 20 µPa, and the real and imaginary parts at every point', () => {
    expect(dataArray(vtu, 'pressure_abs_pa')).toHaveLength(45);
    for (const v of dataArray(vtu, 'spl_db')) expect(v).toBeCloseTo(level, 10);
    for (const v of dataArray(vtu, 'pressure_im_pa')) expect(v).toBe(0);
    expect(dataArray(vtu, 'frequency_hz')).toEqual([250]);
    expect(() => fieldToVtu(mesh, xyz, { re: new Float64Array(2), im: new Float64Array(2) })).toThrow(RangeError);
  });
});

/**
 * A solved pressure field as a VTK XML unstructured grid (.vtu), for ParaView and other VTK readers.
 * Source: Kitware, "VTK File Formats" (VTK User's Guide, 11th ed., 2010): the UnstructuredGrid
 * element with Points, Cells (connectivity, offsets, types) and PointData; cell type 12 is
 * VTK_HEXAHEDRON with corners 0–3 counter-clockwise on the bottom face and 4–7 above them.
 *
 * An order-p element is written as its p³ linear sub-hexahedra between neighbouring nodes, so a
 * reader that knows only linear cells still shows the field at every node the solver computed.
 */
import type { ComplexVector } from '../core/complex.ts';
import { splDb } from '../core/levels.ts';

/** What the writer needs of a mesh (engine/grid's Mesh fits it). */
export interface VtkMesh {
  order: number;
  elements: Int32Array;
  numbering: { ndofs: number; elementDofs: Int32Array };
  grid: { dims: readonly [number, number, number] | number[]; axes: readonly { layerSide: Int8Array }[] };
}

export interface VtuOptions {
  /** Also write the cells of the absorbing layers, whose field is that of stretched coordinates, not a physical one. */
  includeLayers?: boolean;
  frequencyHz?: number;
}

export const VTK_HEXAHEDRON = 12;
// An ASCII VTK reader cannot read −inf: a node of zero pressure gets this level instead.
const SPL_FLOOR_DB = -100;
// Sub-hex corners (a, b, c offsets) in VTK_HEXAHEDRON order.
const CORNERS = [[0, 0, 0], [1, 0, 0], [1, 1, 0], [0, 1, 0], [0, 0, 1], [1, 0, 1], [1, 1, 1], [0, 1, 1]];

/** The field `re + j·im` (peak Pa at each dof) on the dofs at `xyz` (triples, m) as .vtu text. */
export function fieldToVtu(mesh: VtkMesh, xyz: Float64Array, field: ComplexVector, opts: VtuOptions = {}): string {
  const ndofs = mesh.numbering.ndofs;
  if (xyz.length !== 3 * ndofs || field.re.length !== ndofs || field.im.length !== ndofs) {
    throw new RangeError(`fieldToVtu: ${ndofs} dofs, but ${xyz.length / 3} coordinates and ${field.re.length} field values`);
  }
  const cells = subHexahedra(mesh, opts.includeLayers ?? false);
  const { points, local } = usedPoints(cells, ndofs);
  for (let i = 0; i < cells.length; i++) cells[i] = local[cells[i]];
  return document(xyz, field, points, cells, opts.frequencyHz);
}

/** Global dofs of the 8 corners of every linear sub-hexahedron of the chosen elements. */
export function subHexahedra(mesh: VtkMesh, includeLayers: boolean): Int32Array {
  const p = mesh.order, n = p + 1, n3 = n * n * n, dofs = mesh.numbering.elementDofs;
  const chosen = [...mesh.elements.keys()].filter((e) => includeLayers || isPhysical(mesh, mesh.elements[e]));
  const out = new Int32Array(chosen.length * p * p * p * 8);
  let q = 0;
  for (const e of chosen) {
    for (let c = 0; c < p; c++) for (let b = 0; b < p; b++) for (let a = 0; a < p; a++) {
      for (const [da, db, dc] of CORNERS) out[q++] = dofs[e * n3 + (a + da) + n * ((b + db) + n * (c + dc))];
    }
  }
  return out;
}

function isPhysical(mesh: VtkMesh, cell: number): boolean {
  const [nx, ny] = mesh.grid.dims, [ax, ay, az] = mesh.grid.axes;
  const i = cell % nx, j = Math.floor(cell / nx) % ny, k = Math.floor(cell / (nx * ny));
  return ax.layerSide[i] === 0 && ay.layerSide[j] === 0 && az.layerSide[k] === 0;
}

/** The dofs the cells use, ascending, and each dof's index among them (−1 if unused). */
function usedPoints(cells: Int32Array, ndofs: number): { points: Int32Array; local: Int32Array } {
  const local = new Int32Array(ndofs).fill(-1);
  for (const d of cells) local[d] = 0;
  let count = 0;
  for (let d = 0; d < ndofs; d++) if (local[d] === 0) local[d] = count++;
  const points = new Int32Array(count);
  for (let d = 0; d < ndofs; d++) if (local[d] >= 0) points[local[d]] = d;
  return { points, local };
}

function document(xyz: Float64Array, field: ComplexVector, points: Int32Array, cells: Int32Array, frequencyHz?: number): string {
  const nCells = cells.length / 8;
  const pick = (f: (d: number) => number) => Array.from(points, f);
  const abs = (d: number) => Math.hypot(field.re[d], field.im[d]);
  const spl = (d: number) => (abs(d) > 0 ? Math.max(SPL_FLOOR_DB, splDb(abs(d))) : SPL_FLOOR_DB);
  const coords = new Array<string>(points.length);
  for (let i = 0; i < points.length; i++) coords[i] = `${num(xyz[3 * points[i]])} ${num(xyz[3 * points[i] + 1])} ${num(xyz[3 * points[i] + 2])}`;
  const offsets = Array.from({ length: nCells }, (_, c) => 8 * (c + 1));
  const fieldData = frequencyHz === undefined ? '' : `    <FieldData>\n${array('Float64', 'frequency_hz', [frequencyHz], ' NumberOfTuples="1"')}    </FieldData>\n`;
  return [
    '<?xml version="1.0"?>',
    '<VTKFile type="UnstructuredGrid" version="1.0" byte_order="LittleEndian" header_type="UInt64">',
    '  <UnstructuredGrid>',
    fieldData + `    <Piece NumberOfPoints="${points.length}" NumberOfCells="${nCells}">`,
    '      <PointData Scalars="spl_db">',
    array('Float64', 'pressure_abs_pa', pick(abs)) + array('Float64', 'spl_db', pick(spl)) +
      array('Float64', 'pressure_re_pa', pick((d) => field.re[d])) + array('Float64', 'pressure_im_pa', pick((d) => field.im[d])) + '      </PointData>',
    '      <Points>',
    `        <DataArray type="Float64" NumberOfComponents="3" format="ascii">\n${coords.join('\n')}\n        </DataArray>`,
    '      </Points>',
    '      <Cells>',
    array('Int64', 'connectivity', Array.from(cells)) + array('Int64', 'offsets', offsets) + array('UInt8', 'types', new Array<number>(nCells).fill(VTK_HEXAHEDRON)) + '      </Cells>',
    '    </Piece>',
    '  </UnstructuredGrid>',
    '</VTKFile>',
    '',
  ].join('\n');
}

const PER_LINE = 8;

function array(type: string, name: string, values: readonly number[], extra = ''): string {
  const lines: string[] = [];
  for (let i = 0; i < values.length; i += PER_LINE) lines.push(values.slice(i, i + PER_LINE).map(num).join(' '));
  return `        <DataArray type="${type}" Name="${name}"${extra} format="ascii">\n${lines.join('\n')}\n        </DataArray>\n`;
}

/** Shortest text that reads back to the same double; finite values only (the writer never produces others). */
function num(x: number): string {
  return Object.is(x, -0) ? '0' : String(x);
}

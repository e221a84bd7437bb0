/**
 * Global numbering of the nodes of order-p hexahedral Lagrange elements.
 *
 * Index spaces:
 *   local    I = a + n(b + n c), n = p + 1, (a, b, c) ∈ [0, p]³ along the element's reference axes ξ, η, ζ;
 *   vertex   the element's 8 corners in local order v = (a/p) + 2(b/p) + 4(c/p):
 *
 *              6 ──── 7        ζ
 *             /|     /|        |  η
 *            4 ──── 5 |        | /
 *            | 2 ───|─3        |/
 *            |/     |/         └──── ξ
 *            0 ──── 1
 *
 *   global   a dof number shared by every element that holds the node.
 *
 * A node belongs to one entity: a vertex, an edge (one local coordinate interior), a face (two) or the
 * interior (three). Shared edges and faces are numbered in a frame fixed by their global vertex ids, so
 * two neighbours that see an entity in different orientations (reversed, rotated or mirrored) agree:
 *   edge: position counted from the end with the smaller vertex id;
 *   face: origin at the corner with the smallest id, first axis towards its neighbour with the smaller id.
 */
export interface Numbering {
  ndofs: number;
  nodesPerElement: number; // (p + 1)³
  elementDofs: Int32Array; // nElements × nodesPerElement
}

type Pos = 0 | 1 | 2; // 0 at ξ = −1, 2 at ξ = +1, 1 interior

function corner(verts: Int32Array, base: number, a: number, b: number, c: number): number {
  return verts[base + a + 2 * b + 4 * c];
}

export function numberDofs(elementVertices: Int32Array, nVertices: number, p: number): Numbering {
  const n = p + 1, n3 = n * n * n, nel = elementVertices.length / 8, m = p - 1;
  const elementDofs = new Int32Array(nel * n3);
  const vertexDof = new Int32Array(nVertices).fill(-1);
  const edgeBase = new Map<number, number>();
  const faceBase = new Map<number, number>();
  let next = 0;
  const coord = [0, 0, 0], cls: Pos[] = [0, 0, 0];
  for (let e = 0; e < nel; e++) {
    const vb = 8 * e;
    for (let I = 0; I < n3; I++) {
      coord[0] = I % n;
      coord[1] = Math.floor(I / n) % n;
      coord[2] = Math.floor(I / (n * n));
      let interior = 0;
      for (let d = 0; d < 3; d++) {
        cls[d] = coord[d] === 0 ? 0 : coord[d] === p ? 2 : 1;
        if (cls[d] === 1) interior++;
      }
      let dof: number;
      if (interior === 0) {
        const v = corner(elementVertices, vb, cls[0] >> 1, cls[1] >> 1, cls[2] >> 1);
        if (vertexDof[v] < 0) vertexDof[v] = next++;
        dof = vertexDof[v];
      } else if (interior === 1) {
        dof = edgeDof(elementVertices, vb, coord, cls, p, nVertices, edgeBase, () => { const b = next; next += m; return b; });
      } else if (interior === 2) {
        dof = faceDof(elementVertices, vb, coord, cls, p, nVertices, faceBase, () => { const b = next; next += m * m; return b; });
      } else {
        dof = next++;
      }
      elementDofs[e * n3 + I] = dof;
    }
  }
  return { ndofs: next, nodesPerElement: n3, elementDofs };
}

function endpoint(verts: Int32Array, vb: number, cls: Pos[], axis: number, end: 0 | 1): number {
  const c = [cls[0] >> 1, cls[1] >> 1, cls[2] >> 1];
  c[axis] = end;
  return corner(verts, vb, c[0], c[1], c[2]);
}

function edgeDof(verts: Int32Array, vb: number, coord: number[], cls: Pos[], p: number, nV: number, bases: Map<number, number>, alloc: () => number): number {
  const axis = cls.indexOf(1);
  const g0 = endpoint(verts, vb, cls, axis, 0), g1 = endpoint(verts, vb, cls, axis, 1);
  const key = Math.min(g0, g1) * nV + Math.max(g0, g1);
  let base = bases.get(key);
  if (base === undefined) bases.set(key, (base = alloc()));
  const t = g0 < g1 ? coord[axis] : p - coord[axis];
  return base + t - 1;
}

function faceDof(verts: Int32Array, vb: number, coord: number[], cls: Pos[], p: number, nV: number, bases: Map<number, number>, alloc: () => number): number {
  const fixed = cls.findIndex((c) => c !== 1);
  const d1 = fixed === 0 ? 1 : 0, d2 = fixed === 2 ? 1 : 2;
  const cornerAt = (s: 0 | 1, t: 0 | 1): number => {
    const c = [0, 0, 0];
    c[fixed] = cls[fixed] >> 1;
    c[d1] = s;
    c[d2] = t;
    return corner(verts, vb, c[0], c[1], c[2]);
  };
  // find the corner with the smallest global id
  let s0: 0 | 1 = 0, t0: 0 | 1 = 0, best = Infinity;
  for (const s of [0, 1] as const) for (const t of [0, 1] as const) {
    const g = cornerAt(s, t);
    if (g < best) { best = g; s0 = s; t0 = t; }
  }
  const opposite = cornerAt((1 - s0) as 0 | 1, (1 - t0) as 0 | 1);
  const alongS = cornerAt((1 - s0) as 0 | 1, t0), alongT = cornerAt(s0, (1 - t0) as 0 | 1);
  const ds = s0 === 0 ? coord[d1] : p - coord[d1], dt = t0 === 0 ? coord[d2] : p - coord[d2];
  const [u, v] = alongS < alongT ? [ds, dt] : [dt, ds];
  const key = best * nV + opposite;
  let base = bases.get(key);
  if (base === undefined) bases.set(key, (base = alloc()));
  return base + (u - 1) + (p - 1) * (v - 1);
}

/**
 * Geometric nested dissection on the node lattice of a structured hexahedral mesh.
 *
 * George, "Nested dissection of a regular finite element mesh", SIAM J. Numer. Anal.
 * 10(2):345–363 (1973): ordering the two halves of a box before the plane that separates them
 * confines fill to the halves and to the (small) separator, recursively. On a lattice whose
 * elements span `step` intervals per axis, every plane at a multiple of step is an element
 * boundary, so no element couples nodes on its two sides: such planes are exact separators.
 * Elongated ducts are cut across their long axis first, giving separators of the size of the
 * cross-section; among the planes, the one of least size per balance (a ratio cut: Wei & Cheng,
 * "Ratio cut partitioning for hierarchical designs", IEEE Trans. CAD 10(7), 1991) prefers narrow
 * parts of the duct where that costs little balance.
 */
import { minimumDegree } from './ordering.ts';

export interface NodeLattice {
  dims: [number, number, number]; // lattice points per axis; node l = i + dims[0]·(j + dims[1]·k)
  step: number; // lattice intervals spanned by one element per axis (the element order p)
  dofOf: Int32Array; // dims[0]·dims[1]·dims[2]: dof of each lattice node, −1 where there is none
}

export interface DissectionOptions {
  /** Boxes with at most this many dofs are not cut further. Default 32. */
  leafSize?: number;
  /** How a leaf box is ordered: minimum degree on its element-coupling graph, or lattice order. Default minimumDegree. */
  leaf?: 'minimumDegree' | 'lattice';
  /**
   * How the separating plane is chosen: 'ratio' (default), the element-boundary plane on any axis with the least
   * separator per balance, sep / (left·right)^balance; or 'median', the plane nearest the dof median of the longest axis.
   * On the bench's ducts 'ratio' needs 5–7 % fewer flops (bench/RESULTS.md): it cuts where the duct is narrow when that costs little balance.
   */
  cut?: 'median' | 'ratio';
  /** Exponent of the balance term of the 'ratio' rule. Default 1. */
  balance?: number;
  /** Whole cross-sections cut along the long axis ordered last, from both ends inwards (default true), instead of nested. */
  chain?: boolean;
  /** Factor on the ratio rule's cost of a whole cross-section along the long axis (below 1: more of them, thinner slabs between). Default 0.4, the best of 0.25–1 on the bench's ducts. */
  chainWeight?: number;
}

/** Box of lattice indices, inclusive: lo[a] ≤ index ≤ hi[a] on axis a. */
type Box = [number, number, number, number, number, number];

interface Dissector {
  lat: NodeLattice;
  perm: Int32Array; // ndofs: the result, filled left to right
  count: number;
  hist: Int32Array; // max(dims): dofs per plane of the current box along one axis
  local: Int32Array; // ndofs: dof → index inside the current leaf, −1 otherwise
  leafSize: number;
  leaf: 'minimumDegree' | 'lattice';
  cut: 'median' | 'ratio';
  balance: number;
  hist3: [Int32Array, Int32Array, Int32Array]; // dofs per plane along each axis
  chainPlanes: number[]; // whole cross-sections cut along the long axis, ordered last (emitChain)
  chainWeight: number;
}

/** perm[newIndex] = dof: halves first, then their separator, recursively. */
export function latticeDissection(lat: NodeLattice, ndofs: number, opts: DissectionOptions = {}): Int32Array {
  validateLattice(lat, ndofs);
  const [nx, ny, nz] = lat.dims;
  const d: Dissector = {
    lat, perm: new Int32Array(ndofs), count: 0, hist: new Int32Array(Math.max(nx, ny, nz)),
    local: new Int32Array(ndofs).fill(-1), leafSize: opts.leafSize ?? 32, leaf: opts.leaf ?? 'minimumDegree',
    cut: opts.cut ?? 'ratio', balance: opts.balance ?? 1, hist3: [new Int32Array(nx), new Int32Array(ny), new Int32Array(nz)], chainPlanes: [], chainWeight: opts.chainWeight ?? 0.4,
  };
  const whole: Box = [0, 0, 0, nx - 1, ny - 1, nz - 1];
  const chain = opts.chain ?? true ? longestAxis(whole) : -1;
  dissect(d, whole, chain);
  emitChain(d, whole);
  if (d.count !== ndofs) throw new Error(`latticeDissection: ordered ${d.count} of ${ndofs} dofs`);
  return d.perm;
}

function validateLattice(lat: NodeLattice, ndofs: number): void {
  const [nx, ny, nz] = lat.dims;
  if (![nx, ny, nz, lat.step].every((v) => Number.isInteger(v) && v >= 1)) {
    throw new RangeError(`latticeDissection: dims ${lat.dims.join('×')} and step ${lat.step} must be positive integers`);
  }
  if (lat.dofOf.length !== nx * ny * nz) throw new RangeError(`latticeDissection: dofOf has ${lat.dofOf.length} entries, the lattice ${nx * ny * nz}`);
  const seen = new Uint8Array(ndofs);
  let found = 0;
  for (let l = 0; l < lat.dofOf.length; l++) {
    const dof = lat.dofOf[l];
    if (dof === -1) continue;
    if (dof < 0 || dof >= ndofs || seen[dof]) throw new RangeError(`latticeDissection: dof ${dof} at lattice node ${l} is out of range or repeated`);
    seen[dof] = 1;
    found++;
  }
  if (found !== ndofs) throw new RangeError(`latticeDissection: the lattice holds ${found} dofs, expected ${ndofs}`);
}

/**
 * Orders the box: its halves, then the separating plane. chain: the axis along which whole cross-sections
 * are still being cut (−1 once a cut went across it): such planes are set aside for emitChain.
 */
function dissect(d: Dissector, box: Box, chain: number): void {
  const cut = chooseCut(d, box, chain);
  if (cut === null) return orderLeaf(d, box);
  const [axis, plane] = cut;
  const left = box.slice() as Box;
  const right = box.slice() as Box;
  left[axis + 3] = plane - 1;
  right[axis] = plane + 1;
  const along = axis === chain ? chain : -1;
  dissect(d, left, along);
  dissect(d, right, along);
  if (along !== -1) {
    d.chainPlanes.push(plane);
    return;
  }
  const sep = box.slice() as Box;
  sep[axis] = plane;
  sep[axis + 3] = plane;
  emitLattice(d, sep, axis);
}

/**
 * The whole cross-sections cut along the long axis, after everything else, from both ends inwards. In
 * the nested order each of them would be eliminated with both its neighbours in its front (three cross-
 * sections); from the ends, each meets only the next one (two): the multisector eliminated by least
 * degree, as in Ashcraft & Liu, "Robust ordering of sparse matrices using multisection", SIAM J. Matrix
 * Anal. Appl. 19(3):816–832 (1998). The two ends meet at the last plane, so the tree keeps two branches.
 */
function emitChain(d: Dissector, whole: Box): void {
  const axis = longestAxis(whole);
  const planes = d.chainPlanes.sort((a, b) => a - b);
  for (let lo = 0, hi = planes.length - 1; lo <= hi; ) {
    for (const plane of lo === hi ? [planes[lo]] : [planes[lo], planes[hi]]) {
      const sep = whole.slice() as Box;
      sep[axis] = plane;
      sep[axis + 3] = plane;
      emitLattice(d, sep, axis);
    }
    lo++;
    hi--;
  }
}

function longestAxis(box: Box): number {
  return [0, 1, 2].reduce((best, a) => (box[a + 3] - box[a] > box[best + 3] - box[best] ? a : best), 0);
}

/**
 * The element-boundary plane nearest the dof median along the longest axis that has one strictly
 * inside the box; null for a leaf (few dofs or no such plane).
 */
function chooseCut(d: Dissector, box: Box, chain: number): [number, number] | null {
  if (d.cut === 'ratio') return ratioCut(d, box, chain);
  const step = d.lat.step;
  const axes = [0, 1, 2].sort((a, b) => box[b + 3] - box[b] - (box[a + 3] - box[a]));
  let total = -1;
  for (const a of axes) {
    const lo = box[a], hi = box[a + 3];
    const pmin = (Math.floor(lo / step) + 1) * step;
    const pmax = (Math.ceil(hi / step) - 1) * step;
    if (pmin > pmax) continue;
    const n = histogram(d, box, a);
    if (total === -1) {
      total = n;
      if (total <= d.leafSize) return null;
    }
    let cum = 0, median = lo;
    for (let i = lo; i <= hi; i++) {
      cum += d.hist[i];
      if (2 * cum >= total) {
        median = i;
        break;
      }
    }
    const plane = Math.min(pmax, Math.max(pmin, Math.round(median / step) * step));
    return [a, plane];
  }
  return null;
}

/** The element-boundary plane, on any axis, with the least separator size per balance, sep / (left·right)^balance; null for a leaf. */
function ratioCut(d: Dissector, box: Box, chain: number): [number, number] | null {
  const step = d.lat.step;
  const total = histograms(d, box);
  if (total <= d.leafSize) return null;
  let best: [number, number] | null = null, bestCost = Infinity;
  for (let a = 0; a < 3; a++) {
    const lo = box[a], hi = box[a + 3], h = d.hist3[a];
    const pmin = (Math.floor(lo / step) + 1) * step, pmax = (Math.ceil(hi / step) - 1) * step;
    let left = 0;
    for (let i = lo; i < pmin; i++) left += h[i];
    for (let plane = pmin; plane <= pmax; plane += step) {
      const sep = h[plane], right = total - left - sep;
      if (left > 0 && right > 0) {
        const cost = (a === chain ? d.chainWeight : 1) * sep / Math.pow(left * right, d.balance);
        if (cost < bestCost) { bestCost = cost; best = [a, plane]; }
      }
      for (let i = plane; i < plane + step && i <= hi; i++) left += h[i];
    }
  }
  return best;
}

/** hist3[a][i] = dofs of the box in plane i along axis a, for the three axes; returns their total. */
function histograms(d: Dissector, box: Box): number {
  const { dims, dofOf } = d.lat;
  const [hx, hy, hz] = d.hist3;
  hx.fill(0, box[0], box[3] + 1);
  hy.fill(0, box[1], box[4] + 1);
  hz.fill(0, box[2], box[5] + 1);
  let total = 0;
  for (let k = box[2]; k <= box[5]; k++) {
    for (let j = box[1]; j <= box[4]; j++) {
      const row = dims[0] * (j + dims[1] * k);
      for (let i = box[0]; i <= box[3]; i++) {
        if (dofOf[row + i] === -1) continue;
        hx[i]++;
        hy[j]++;
        hz[k]++;
        total++;
      }
    }
  }
  return total;
}

/** hist[i] = dofs of the box in plane i along axis a; returns their total. */
function histogram(d: Dissector, box: Box, a: number): number {
  const { dims, dofOf } = d.lat;
  const hist = d.hist;
  hist.fill(0, box[a], box[a + 3] + 1);
  let total = 0;
  for (let k = box[2]; k <= box[5]; k++) {
    for (let j = box[1]; j <= box[4]; j++) {
      const row = dims[0] * (j + dims[1] * k);
      for (let i = box[0]; i <= box[3]; i++) {
        if (dofOf[row + i] === -1) continue;
        hist[a === 0 ? i : a === 1 ? j : k]++;
        total++;
      }
    }
  }
  return total;
}

/** Appends the box's dofs in lattice order, axis `slow` outermost. */
function emitLattice(d: Dissector, box: Box, slow: number): void {
  const { dims, dofOf } = d.lat;
  const [f, m] = [0, 1, 2].filter((a) => a !== slow);
  const idx = [0, 0, 0];
  for (idx[slow] = box[slow]; idx[slow] <= box[slow + 3]; idx[slow]++) {
    for (idx[m] = box[m]; idx[m] <= box[m + 3]; idx[m]++) {
      for (idx[f] = box[f]; idx[f] <= box[f + 3]; idx[f]++) {
        const dof = dofOf[idx[0] + dims[0] * (idx[1] + dims[1] * idx[2])];
        if (dof !== -1) d.perm[d.count++] = dof;
      }
    }
  }
}

function orderLeaf(d: Dissector, box: Box): void {
  const longest = [0, 1, 2].reduce((best, a) => (box[a + 3] - box[a] > box[best + 3] - box[best] ? a : best), 0);
  const start = d.count;
  emitLattice(d, box, longest);
  const nLeaf = d.count - start;
  if (d.leaf === 'lattice' || nLeaf < 3) return;
  const nodes = d.perm.slice(start, d.count);
  for (let t = 0; t < nLeaf; t++) d.local[nodes[t]] = t;
  const order = minimumDegree(leafGraph(d, box, nodes));
  for (let t = 0; t < nLeaf; t++) d.perm[start + t] = nodes[order[t]];
  for (let t = 0; t < nLeaf; t++) d.local[nodes[t]] = -1;
}

/**
 * Pattern of the leaf's dofs coupled through elements (column order is irrelevant to minimumDegree): along each axis a node at i couples with
 * [i − step, i + step] if i lies on an element boundary, else with its own element's interval.
 * Elements missing under a mask make this a superset of the true graph, which is harmless here.
 */
function leafGraph(d: Dissector, box: Box, nodes: Int32Array): { n: number; rowPtr: Int32Array; colIdx: Int32Array } {
  const { dims, dofOf, step } = d.lat;
  const pos = new Int32Array(3);
  const lattice = latticeIndexOfDofs(d, box, nodes.length);
  const rowPtr = new Int32Array(nodes.length + 1);
  const cols: number[] = [];
  const range = new Int32Array(6);
  for (let t = 0; t < nodes.length; t++) {
    const l = lattice[t];
    pos[0] = l % dims[0];
    pos[1] = Math.floor(l / dims[0]) % dims[1];
    pos[2] = Math.floor(l / (dims[0] * dims[1]));
    for (let a = 0; a < 3; a++) {
      const x = pos[a];
      const lo = x % step === 0 ? x - step : x - (x % step);
      const hi = x % step === 0 ? x + step : lo + step;
      range[a] = Math.max(lo, box[a]);
      range[a + 3] = Math.min(hi, box[a + 3]);
    }
    for (let k = range[2]; k <= range[5]; k++) {
      for (let j = range[1]; j <= range[4]; j++) {
        for (let i = range[0]; i <= range[3]; i++) {
          const dof = dofOf[i + dims[0] * (j + dims[1] * k)];
          if (dof !== -1) cols.push(d.local[dof]);
        }
      }
    }
    rowPtr[t + 1] = cols.length;
  }
  return { n: nodes.length, rowPtr, colIdx: Int32Array.from(cols) };
}

/** Lattice index of each leaf dof, in the order they were emitted (local numbering). */
function latticeIndexOfDofs(d: Dissector, box: Box, nLeaf: number): Int32Array {
  const { dims, dofOf } = d.lat;
  const out = new Int32Array(nLeaf);
  for (let k = box[2]; k <= box[5]; k++) {
    for (let j = box[1]; j <= box[4]; j++) {
      for (let i = box[0]; i <= box[3]; i++) {
        const l = i + dims[0] * (j + dims[1] * k);
        const dof = dofOf[l];
        if (dof !== -1) out[d.local[dof]] = l;
      }
    }
  }
  return out;
}

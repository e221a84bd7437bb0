/**
 * Symbolic analysis for the supernodal multifrontal LDLᵀ factorisation: everything that depends
 * on the pattern only, computed once per geometry and reused for every frequency.
 *
 * Steps: fill-reducing order → elimination tree → postorder → column counts → supernodes with
 * relaxed amalgamation → row structure of each supernode → sizes, flops and peak memory.
 * The multifrontal method and its stack of update matrices: Duff & Reid, "The multifrontal
 * solution of indefinite sparse symmetric linear equations", ACM TOMS 9(3):302–325 (1983);
 * Liu, "The multifrontal method for sparse matrix solution: theory and practice", SIAM Review
 * 34(1):82–109 (1992).
 */
import type { SparsePattern } from './sparse.ts';
import { minimumDegree } from './ordering.ts';
import { eliminationTree, postorder } from './etree.ts';
import { columnCounts } from './colCounts.ts';
import { supernodePartition } from './supernodes.ts';
import { assertPermutation, invertPermutation } from './permutation.ts';
import { arenaLayout, NB, type ArenaLayout } from './frontArena.ts';

export interface Symbolic {
  n: number;
  nnzA: number; // entries of A, both triangles
  perm: Int32Array; // n: perm[new] = old, the order actually factored (postordered, amalgamated)
  pinv: Int32Array; // n: pinv[old] = new
  parent: Int32Array; // n: elimination tree in the new numbering, −1 for roots
  colCount: Int32Array; // n: nonzeros of each column of L including the diagonal (exact)
  nnzL: number; // Σ colCount: nonzeros of L including the diagonal, no amalgamation zeros
  flops: number; // real flops of the exact factorisation, Σ_j 4 r_j(r_j+1) + 6 r_j with r_j = colCount_j − 1
  nSuper: number;
  superStart: Int32Array; // nSuper+1: first column of each supernode
  superParent: Int32Array; // nSuper: parent supernode, −1 for roots
  childPtr: Int32Array; // nSuper+1: children of s are child[childPtr[s] .. childPtr[s+1]), increasing
  child: Int32Array; // nSuper − roots
  rowPtr: Int32Array; // nSuper+1: rows below the diagonal block of s are rowIdx[rowPtr[s] .. rowPtr[s+1])
  rowIdx: Int32Array; // Σ m_s: sorted, in the new numbering
  panelPtr: Float64Array; // nSuper+1: offset (in complex entries) of each supernode's panel in the factor
  storedEntries: number; // panelPtr[nSuper] = Σ (ns + m)·ns: complex entries the factor stores
  frontFlops: number; // real flops the dense kernels perform, amalgamation zeros included
  stackPeak: number; // complex entries of the update-matrix stack at its peak
  workEntries: number; // complex entries of the packed scaled rows the kernels read (2 per pair)
  maxFront: number; // largest front order ns + m
  maxPivots: number; // largest ns
  arena: ArenaLayout; // where each front is computed (frontArena.ts)
  memoryBytes: number; // bytes of factor()'s memory (FactorWorkspace): panels + arena + per-column arrays
}

/** Analyses the pattern once; perm (perm[new] = old) defaults to minimumDegree(p). */
export function analyze(p: SparsePattern, perm?: Int32Array): Symbolic {
  const n = p.n;
  const perm0 = perm ?? minimumDegree(p);
  assertPermutation(perm0, n, 'analyze: the ordering');
  // postorder so that subtrees, and so supernodes, are contiguous
  const parent0 = eliminationTree(p, perm0, invertPermutation(perm0));
  const post = postorder(parent0);
  const permP = new Int32Array(n);
  for (let k = 0; k < n; k++) permP[k] = perm0[post[k]];
  const parentP = relabelTree(parent0, post);
  const identity = new Int32Array(n);
  for (let k = 0; k < n; k++) identity[k] = k;
  const countP = columnCounts(p, permP, invertPermutation(permP), parentP, identity);
  const { order, superStart } = supernodePartition(parentP, countP);
  const finalPerm = new Int32Array(n);
  const colCount = new Int32Array(n);
  for (let k = 0; k < n; k++) {
    finalPerm[k] = permP[order[k]];
    colCount[k] = countP[order[k]];
  }
  const parent = relabelTree(parentP, order);
  return supernodalStructure(p, finalPerm, parent, colCount, superStart);
}

/** The same tree in the numbering new = position in order (order[new] = old). */
function relabelTree(parent: Int32Array, order: Int32Array): Int32Array {
  const n = parent.length;
  const pos = invertPermutation(order);
  const out = new Int32Array(n);
  for (let k = 0; k < n; k++) {
    const p = parent[order[k]];
    out[k] = p === -1 ? -1 : pos[p];
  }
  return out;
}

function supernodalStructure(p: SparsePattern, perm: Int32Array, parent: Int32Array, colCount: Int32Array, superStart: Int32Array): Symbolic {
  const n = p.n;
  const nSuper = superStart.length - 1;
  const pinv = invertPermutation(perm);
  const superOf = new Int32Array(n);
  for (let s = 0; s < nSuper; s++) for (let j = superStart[s]; j < superStart[s + 1]; j++) superOf[j] = s;
  const superParent = new Int32Array(nSuper);
  for (let s = 0; s < nSuper; s++) {
    const up = parent[superStart[s + 1] - 1];
    superParent[s] = up === -1 ? -1 : superOf[up];
  }
  const { childPtr, child } = childLists(superParent);
  const rowPtr = new Int32Array(nSuper + 1);
  for (let s = 0; s < nSuper; s++) rowPtr[s + 1] = rowPtr[s] + colCount[superStart[s + 1] - 1] - 1;
  const rowIdx = new Int32Array(rowPtr[nSuper]);
  fillRowStructure(p, perm, pinv, superStart, childPtr, child, rowPtr, rowIdx);
  const sizes = frontSizes(superStart, rowPtr, childPtr, child);
  let nnzL = 0, flops = 0;
  for (let j = 0; j < n; j++) {
    const r = colCount[j] - 1;
    nnzL += colCount[j];
    flops += 4 * r * (r + 1) + 6 * r;
  }
  // the arrays of a FactorWorkspace (factor.ts): panels (complex), the front arena, D and 1/D (4 reals a column), row scales and the map
  const arena = arenaLayout(sizes);
  const memoryBytes = 16 * sizes.storedEntries + arena.bytes + (32 + 8 + 4) * n;
  return {
    n, nnzA: p.rowPtr[n], perm, pinv, parent, colCount, nnzL, flops, nSuper, superStart, superParent,
    childPtr, child, rowPtr, rowIdx, ...sizes, arena, memoryBytes,
  };
}

function childLists(superParent: Int32Array): { childPtr: Int32Array; child: Int32Array } {
  const nSuper = superParent.length;
  const childPtr = new Int32Array(nSuper + 1);
  for (let s = 0; s < nSuper; s++) if (superParent[s] !== -1) childPtr[superParent[s] + 1]++;
  for (let s = 0; s < nSuper; s++) childPtr[s + 1] += childPtr[s];
  const child = new Int32Array(childPtr[nSuper]);
  const fill = childPtr.slice(0, nSuper);
  for (let s = 0; s < nSuper; s++) if (superParent[s] !== -1) child[fill[superParent[s]]++] = s;
  return { childPtr, child };
}

/**
 * Rows of supernode s below its diagonal block: the entries of A in its columns and the rows of
 * its children, beyond its last column. Their number must equal colCount − 1 of its last column.
 */
function fillRowStructure(
  p: SparsePattern, perm: Int32Array, pinv: Int32Array, superStart: Int32Array,
  childPtr: Int32Array, child: Int32Array, rowPtr: Int32Array, rowIdx: Int32Array,
): void {
  const nSuper = superStart.length - 1;
  const marker = new Int32Array(p.n).fill(-1);
  for (let s = 0; s < nSuper; s++) {
    const last = superStart[s + 1] - 1;
    const begin = rowPtr[s], end = rowPtr[s + 1];
    let q = begin;
    for (let j = superStart[s]; j <= last; j++) {
      const row = perm[j];
      for (let k = p.rowPtr[row]; k < p.rowPtr[row + 1]; k++) {
        const i = pinv[p.colIdx[k]];
        if (i <= last || marker[i] === s) continue;
        if (q === end) throw structureError(s, end - begin);
        marker[i] = s;
        rowIdx[q++] = i;
      }
    }
    for (let c = childPtr[s]; c < childPtr[s + 1]; c++) {
      const ch = child[c];
      for (let k = rowPtr[ch]; k < rowPtr[ch + 1]; k++) {
        const i = rowIdx[k];
        if (i <= last || marker[i] === s) continue;
        if (q === end) throw structureError(s, end - begin);
        marker[i] = s;
        rowIdx[q++] = i;
      }
    }
    if (q !== end) throw structureError(s, end - begin);
    rowIdx.subarray(begin, end).sort();
  }
}

function structureError(s: number, expected: number): Error {
  return new Error(`analyze: internal error, the rows of supernode ${s} disagree with its column count (${expected})`);
}

interface FrontSizes {
  panelPtr: Float64Array;
  storedEntries: number;
  frontFlops: number;
  stackPeak: number;
  workEntries: number;
  maxFront: number;
  maxPivots: number;
}

/** Replays the multifrontal sweep: panel offsets, dense flops, and the peak of the update stack (a front's children are popped before its own update matrix is pushed). */
function frontSizes(superStart: Int32Array, rowPtr: Int32Array, childPtr: Int32Array, child: Int32Array): FrontSizes {
  const nSuper = superStart.length - 1;
  const panelPtr = new Float64Array(nSuper + 1);
  let frontFlops = 0, stack = 0, stackPeak = 0, workEntries = 0, maxFront = 0, maxPivots = 0;
  for (let s = 0; s < nSuper; s++) {
    const ns = superStart[s + 1] - superStart[s];
    const m = rowPtr[s + 1] - rowPtr[s];
    panelPtr[s + 1] = panelPtr[s] + (ns + m) * ns;
    // diagonal block ns³/6, panel m·ns²/2, update m²·ns/2 complex multiply-adds of 8 flops
    frontFlops += 8 * ((ns * ns * ns) / 6 + (m * ns * ns) / 2 + (m * m * ns) / 2);
    for (let c = childPtr[s]; c < childPtr[s + 1]; c++) {
      const mc = rowPtr[child[c] + 1] - rowPtr[child[c]];
      stack -= (mc * (mc + 1)) / 2;
    }
    stack += (m * (m + 1)) / 2;
    stackPeak = Math.max(stackPeak, stack);
    workEntries = Math.max(workEntries, 2 * ns * Math.max(m, Math.min(ns, NB)));
    maxFront = Math.max(maxFront, ns + m);
    maxPivots = Math.max(maxPivots, ns);
  }
  return { panelPtr, storedEntries: panelPtr[nSuper], frontFlops, stackPeak, workEntries, maxFront, maxPivots };
}

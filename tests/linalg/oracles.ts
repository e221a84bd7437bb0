/** Brute-force references for the symbolic phase: dense boolean elimination on small patterns. */
import type { SparsePattern } from '../../engine/linalg/sparse.ts';

/**
 * Pattern of L for C = P A Pᵀ by eliminating a dense boolean matrix: L_ij ≠ 0 (i > j) iff A_ij ≠ 0
 * or L_ik, L_jk ≠ 0 for some k < j (George & Liu, "Computer Solution of Large Sparse Positive
 * Definite Systems", Prentice-Hall 1981, §4.2, the elimination graph). filled[i·n + j] for i ≥ j.
 */
export function bruteForceFill(p: SparsePattern, perm: Int32Array): Uint8Array {
  const n = p.n;
  const pinv = new Int32Array(n);
  for (let k = 0; k < n; k++) pinv[perm[k]] = k;
  const L = new Uint8Array(n * n);
  for (let r = 0; r < n; r++) {
    for (let q = p.rowPtr[r]; q < p.rowPtr[r + 1]; q++) {
      const i = pinv[r], j = pinv[p.colIdx[q]];
      L[Math.max(i, j) * n + Math.min(i, j)] = 1;
    }
    L[pinv[r] * n + pinv[r]] = 1;
  }
  for (let k = 0; k < n; k++) {
    for (let i = k + 1; i < n; i++) {
      if (!L[i * n + k]) continue;
      for (let j = k + 1; j <= i; j++) if (L[j * n + k]) L[i * n + j] = 1;
    }
  }
  return L;
}

/** Elimination tree and column counts read off the brute-force fill. */
export function bruteForceTree(p: SparsePattern, perm: Int32Array): { parent: Int32Array; colCount: Int32Array; filled: Uint8Array } {
  const n = p.n;
  const filled = bruteForceFill(p, perm);
  const parent = new Int32Array(n).fill(-1);
  const colCount = new Int32Array(n);
  for (let j = 0; j < n; j++) {
    for (let i = j; i < n; i++) {
      if (!filled[i * n + j]) continue;
      colCount[j]++;
      if (i > j && parent[j] === -1) parent[j] = i;
    }
  }
  return { parent, colCount, filled };
}

/** Greedy exact minimum degree on the explicit elimination graph (ties to the lowest index). */
export function exactMinimumDegree(p: SparsePattern): Int32Array {
  const n = p.n;
  const adj: Set<number>[] = [];
  for (let i = 0; i < n; i++) {
    const s = new Set<number>();
    for (let k = p.rowPtr[i]; k < p.rowPtr[i + 1]; k++) if (p.colIdx[k] !== i) s.add(p.colIdx[k]);
    adj.push(s);
  }
  const alive = new Uint8Array(n).fill(1);
  const perm = new Int32Array(n);
  for (let step = 0; step < n; step++) {
    let best = -1;
    for (let i = 0; i < n; i++) if (alive[i] && (best === -1 || adj[i].size < adj[best].size)) best = i;
    perm[step] = best;
    alive[best] = 0;
    const nb = [...adj[best]];
    for (const a of nb) {
      adj[a].delete(best);
      for (const b of nb) if (a !== b) adj[a].add(b);
    }
  }
  return perm;
}

/** 2D/3D grid graph: 5/7-point (box = false) or 9/27-point (box = true) neighbourhoods, lattice order. */
export function gridPattern(nx: number, ny: number, nz: number, box: boolean): SparsePattern {
  const n = nx * ny * nz;
  const rowPtr = new Int32Array(n + 1);
  const cols: number[] = [];
  for (let k = 0; k < nz; k++) for (let j = 0; j < ny; j++) for (let i = 0; i < nx; i++) {
    for (let c = -1; c <= 1; c++) for (let b = -1; b <= 1; b++) for (let a = -1; a <= 1; a++) {
      if (!box && Math.abs(a) + Math.abs(b) + Math.abs(c) > 1) continue;
      const I = i + a, J = j + b, K = k + c;
      if (I < 0 || J < 0 || K < 0 || I >= nx || J >= ny || K >= nz) continue;
      cols.push(I + nx * (J + ny * K));
    }
    rowPtr[i + nx * (j + ny * k) + 1] = cols.length;
  }
  return { n, rowPtr, colIdx: Int32Array.from(cols) };
}

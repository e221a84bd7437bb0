/**
 * Column counts of the Cholesky/LDLᵀ factor without forming it.
 * Gilbert, Ng & Peyton, "An efficient algorithm to compute row and column counts for sparse
 * Cholesky factorization", SIAM J. Matrix Anal. Appl. 15(4):1075–1091 (1994): column j of L
 * holds the rows i whose row subtree contains j; each A_ij that is a leaf of row subtree i adds
 * one at j and takes one back at the least common ancestor with the previous leaf, so the counts
 * are sums of these "deltas" over subtrees. Time O(nnz(A) α(n)).
 */
import type { SparsePattern } from './sparse.ts';

/**
 * colCount[j] = nnz of column j of L including the diagonal, for C = P A Pᵀ with elimination
 * tree parent and its postorder post (both in the permuted numbering).
 */
export function columnCounts(p: SparsePattern, perm: Int32Array, pinv: Int32Array, parent: Int32Array, post: Int32Array): Int32Array {
  const { n, rowPtr, colIdx } = p;
  const delta = new Int32Array(n); // becomes colCount
  const first = new Int32Array(n).fill(-1); // postorder number of the first descendant
  const maxfirst = new Int32Array(n).fill(-1);
  const prevleaf = new Int32Array(n).fill(-1);
  const ancestor = new Int32Array(n);
  for (let k = 0; k < n; k++) {
    let j = post[k];
    delta[j] = first[j] === -1 ? 1 : 0; // a leaf of the etree starts at 1
    for (; j !== -1 && first[j] === -1; j = parent[j]) first[j] = k;
  }
  for (let i = 0; i < n; i++) ancestor[i] = i;
  for (let k = 0; k < n; k++) {
    const j = post[k];
    if (parent[j] !== -1) delta[parent[j]]--; // j is not a root
    const row = perm[j];
    for (let q = rowPtr[row]; q < rowPtr[row + 1]; q++) {
      const i = pinv[colIdx[q]];
      // is j a leaf of the row subtree of i?
      if (i <= j || first[j] <= maxfirst[i]) continue;
      maxfirst[i] = first[j];
      const jprev = prevleaf[i];
      prevleaf[i] = j;
      delta[j]++;
      if (jprev === -1) continue; // first leaf: the subtree's root is i itself
      let lca = jprev; // least common ancestor of jprev and j, with path compression
      while (lca !== ancestor[lca]) lca = ancestor[lca];
      for (let s = jprev; s !== lca;) {
        const up = ancestor[s];
        ancestor[s] = lca;
        s = up;
      }
      delta[lca]--;
    }
    if (parent[j] !== -1) ancestor[j] = parent[j];
  }
  for (let j = 0; j < n; j++) if (parent[j] !== -1) delta[parent[j]] += delta[j];
  return delta;
}

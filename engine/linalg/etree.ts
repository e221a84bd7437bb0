/**
 * Elimination tree of a symmetrically permuted pattern, and its postorder.
 * Liu, "The role of elimination trees in sparse factorization", SIAM J. Matrix Anal. Appl.
 * 11(1):134–172 (1990): parent(j) = min{i > j : L_ij ≠ 0}, found from the pattern of A alone with
 * path-compressed "virtual ancestors" in O(nnz(A) α(n)).
 */
import type { SparsePattern } from './sparse.ts';

/** parent[newIndex] of C = P A Pᵀ (−1 for a root); perm[new] = old, pinv its inverse. */
export function eliminationTree(p: SparsePattern, perm: Int32Array, pinv: Int32Array): Int32Array {
  const { n, rowPtr, colIdx } = p;
  const parent = new Int32Array(n).fill(-1);
  const ancestor = new Int32Array(n).fill(-1);
  for (let k = 0; k < n; k++) {
    const row = perm[k];
    for (let q = rowPtr[row]; q < rowPtr[row + 1]; q++) {
      let i = pinv[colIdx[q]];
      while (i !== -1 && i < k) { // climb from i towards the root, pointing the path at k
        const up = ancestor[i];
        ancestor[i] = k;
        if (up === -1) parent[i] = k;
        i = up;
      }
    }
  }
  return parent;
}

/** post[k] = node visited k-th by a depth-first postorder (children in increasing order). */
export function postorder(parent: Int32Array): Int32Array {
  const n = parent.length;
  const head = new Int32Array(n).fill(-1);
  const next = new Int32Array(n);
  for (let j = n - 1; j >= 0; j--) {
    const pj = parent[j];
    if (pj === -1) continue;
    next[j] = head[pj];
    head[pj] = j;
  }
  const post = new Int32Array(n);
  const stack = new Int32Array(n);
  let k = 0;
  for (let root = 0; root < n; root++) {
    if (parent[root] !== -1) continue;
    let top = 0;
    stack[0] = root;
    while (top >= 0) {
      const x = stack[top];
      const c = head[x];
      if (c === -1) {
        top--;
        post[k++] = x;
      } else {
        head[x] = next[c];
        stack[++top] = c;
      }
    }
  }
  return post;
}

/** Permutations as Int32Array with perm[newIndex] = oldIndex. */

/** Throws unless perm holds every index 0..n−1 exactly once. */
export function assertPermutation(perm: Int32Array, n: number, what = 'permutation'): void {
  if (perm.length !== n) throw new RangeError(`${what} has length ${perm.length}, expected ${n}`);
  const seen = new Uint8Array(n);
  for (let k = 0; k < n; k++) {
    const i = perm[k];
    if (i < 0 || i >= n || seen[i]) throw new RangeError(`${what} is not a permutation (entry ${k} = ${i})`);
    seen[i] = 1;
  }
}

/** pinv[oldIndex] = newIndex */
export function invertPermutation(perm: Int32Array): Int32Array {
  const pinv = new Int32Array(perm.length);
  for (let k = 0; k < perm.length; k++) pinv[perm[k]] = k;
  return pinv;
}

/** The identity, for callers that want the matrix's own order. */
export function identityPermutation(n: number): Int32Array {
  const perm = new Int32Array(n);
  for (let k = 0; k < n; k++) perm[k] = k;
  return perm;
}

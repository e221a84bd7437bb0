/**
 * Supernode partition of a postordered elimination tree.
 *
 * Fundamental supernodes (Liu, Ng & Peyton, "On finding supernodes for sparse matrix
 * computations", SIAM J. Matrix Anal. Appl. 14(1):242–252, 1993): column j joins j−1 when j−1 is
 * its only child and colCount[j−1] = colCount[j] + 1, so the columns share one dense structure.
 *
 * Relaxed amalgamation (Ashcraft & Grimes, "The influence of relaxed supernode partitions on the
 * multifrontal method", ACM TOMS 15(4):291–309, 1989): a child supernode is merged into its
 * parent when the explicit zeros this adds are few, trading a little arithmetic on zeros for
 * fewer, larger dense fronts. A merged child need not be the last child; the columns are
 * renumbered afterwards by a postorder of the merged tree, which is a topological order of the
 * elimination tree and so has exactly the same fill (Liu 1990).
 */

export interface SupernodePartition {
  order: Int32Array; // n: order[newIndex] = index in the postordered numbering
  superStart: Int32Array; // nSuper+1: first column of each supernode in the new numbering
}

/** Merge rule: size limits and the zero fractions allowed under them. */
const RELAX_COLUMNS = [4, 16, 48];
const RELAX_ZEROS = [0.8, 0.1, 0.05];

/** parent and colCount in a postordered numbering (parent[j] > j). */
export function supernodePartition(parent: Int32Array, colCount: Int32Array, relax = true): SupernodePartition {
  const { start, sparent } = fundamentalSupernodes(parent, colCount);
  const nsup = sparent.length;
  const cols = new Int32Array(nsup);
  const below = new Int32Array(nsup); // rows under the diagonal block
  for (let s = 0; s < nsup; s++) {
    cols[s] = start[s + 1] - start[s];
    below[s] = colCount[start[s + 1] - 1] - 1;
  }
  const member = relax ? amalgamate(sparent, cols, below) : singletonGroups(nsup);
  return renumber(start, sparent, member);
}

function fundamentalSupernodes(parent: Int32Array, colCount: Int32Array): { start: Int32Array; sparent: Int32Array } {
  const n = parent.length;
  const children = new Int32Array(n);
  for (let j = 0; j < n; j++) if (parent[j] !== -1) children[parent[j]]++;
  const superOf = new Int32Array(n);
  const startList: number[] = [];
  for (let j = 0; j < n; j++) {
    const joins = j > 0 && parent[j - 1] === j && colCount[j - 1] === colCount[j] + 1 && children[j] === 1;
    if (!joins) startList.push(j);
    superOf[j] = startList.length - 1;
  }
  const nsup = startList.length;
  const start = new Int32Array(nsup + 1);
  start.set(startList);
  start[nsup] = n;
  const sparent = new Int32Array(nsup);
  for (let s = 0; s < nsup; s++) {
    const p = parent[start[s + 1] - 1];
    sparent[s] = p === -1 ? -1 : superOf[p];
  }
  return { start, sparent };
}

/** Group membership as linked lists: head[g] first member, next[s] following, mergedInto[s] ≠ −1 if absorbed. */
interface Groups {
  head: Int32Array;
  next: Int32Array;
  mergedInto: Int32Array;
}

function singletonGroups(nsup: number): Groups {
  const head = new Int32Array(nsup);
  for (let s = 0; s < nsup; s++) head[s] = s;
  return { head, next: new Int32Array(nsup).fill(-1), mergedInto: new Int32Array(nsup).fill(-1) };
}

function amalgamate(sparent: Int32Array, cols: Int32Array, below: Int32Array): Groups {
  const nsup = sparent.length;
  const g = singletonGroups(nsup);
  const zeros = new Float64Array(nsup);
  const ncols = Int32Array.from(cols);
  // supernodes are numbered in postorder, so every child is final before its parent looks at it
  const childHead = new Int32Array(nsup).fill(-1);
  const sibling = new Int32Array(nsup).fill(-1);
  for (let s = nsup - 1; s >= 0; s--) {
    const p = sparent[s];
    if (p !== -1) {
      sibling[s] = childHead[p];
      childHead[p] = s;
    }
  }
  for (let s = 0; s < nsup; s++) {
    for (let c = childHead[s]; c !== -1; c = sibling[c]) {
      const nc = ncols[c], ng = ncols[s], m = below[s];
      // c's columns gain rows for every column of the group and its structure they did not have
      const z = zeros[s] + zeros[c] + nc * (ng + m - below[c]);
      const total = nc + ng;
      const entries = (total * (total + 1)) / 2 + total * m;
      if (!relaxedMerge(total, z / entries)) continue;
      g.next[c] = g.head[s]; // c's members (c last) go before the group's
      g.head[s] = g.head[c];
      g.mergedInto[c] = s;
      ncols[s] = total;
      zeros[s] = z;
    }
  }
  return g;
}

function relaxedMerge(columns: number, zeroFraction: number): boolean {
  if (columns <= RELAX_COLUMNS[0]) return true;
  if (columns <= RELAX_COLUMNS[1]) return zeroFraction < RELAX_ZEROS[0];
  if (columns <= RELAX_COLUMNS[2]) return zeroFraction < RELAX_ZEROS[1];
  return zeroFraction < RELAX_ZEROS[2];
}

/** Postorder of the merged tree; inside a group its members' columns in list order. */
function renumber(start: Int32Array, sparent: Int32Array, g: Groups): SupernodePartition {
  const nsup = sparent.length;
  const n = start[nsup];
  const root = new Int32Array(nsup); // group of each fundamental supernode
  for (let s = nsup - 1; s >= 0; s--) root[s] = g.mergedInto[s] === -1 ? s : root[g.mergedInto[s]];
  const childHead = new Int32Array(nsup).fill(-1);
  const sibling = new Int32Array(nsup).fill(-1);
  for (let s = nsup - 1; s >= 0; s--) {
    if (g.mergedInto[s] !== -1 || sparent[s] === -1) continue;
    const p = root[sparent[s]];
    sibling[s] = childHead[p];
    childHead[p] = s;
  }
  const order = new Int32Array(n);
  const starts: number[] = [];
  const stack = new Int32Array(nsup);
  let k = 0;
  for (let r = 0; r < nsup; r++) {
    if (g.mergedInto[r] !== -1 || sparent[r] !== -1) continue;
    let top = 0;
    stack[0] = r;
    while (top >= 0) {
      const x = stack[top];
      const c = childHead[x];
      if (c !== -1) {
        childHead[x] = sibling[c];
        stack[++top] = c;
        continue;
      }
      top--;
      starts.push(k);
      for (let s = g.head[x]; s !== -1; s = g.next[s]) for (let j = start[s]; j < start[s + 1]; j++) order[k++] = j;
    }
  }
  if (k !== n) throw new Error(`supernodePartition: internal error, numbered ${k} of ${n} columns`);
  const superStart = new Int32Array(starts.length + 1);
  superStart.set(starts);
  superStart[starts.length] = n;
  return { order, superStart };
}

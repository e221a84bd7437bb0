/**
 * Approximate minimum degree ordering on the quotient graph.
 *
 * Amestoy, Davis & Duff, "An approximate minimum degree ordering algorithm",
 * SIAM J. Matrix Anal. Appl. 17(4):886–905 (1996): elements (eliminated pivots) stand for the
 * cliques they created, so the graph never grows; degrees are upper bounds
 * d_i ≤ min(n − k, d_i_prev + |Lp∖i|, |Ai∖i| + |Lp∖i| + Σ_e |Le∖Lp|) (their eq. 4), computed from
 * |Le∖Lp| in one sweep; indistinguishable variables are merged into supervariables (hashing),
 * dominated elements absorbed (aggressive absorption), and variables whose external degree drops
 * to zero are eliminated with the pivot (mass elimination). Overview of the tricks: George & Liu,
 * "The evolution of the minimum degree ordering algorithm", SIAM Review 31(1):1–19 (1989).
 * Dense rows (degree > 10√n) are set aside and ordered last, as in Davis, "Direct Methods for
 * Sparse Linear Systems", SIAM (2006), §7.1.
 */
import type { SparsePattern } from './sparse.ts';

/** −1 marks "none"; flip(i) ≤ −2 stores a parent pointer in pe[]. */
const flip = (i: number): number => -i - 2;
const INT_LIMIT = 0x7fffffff;

/** Quotient graph and workspaces; node n is a dummy root that adopts the dense rows. */
interface QuotientGraph {
  n: number;
  iw: Int32Array; // nzmax: lists of variables and elements; free space from cnz on
  pe: Int32Array; // n+1: start of the list of i in iw; flip(parent) once absorbed; −1 for a root
  len: Int32Array; // n+1: length of the list of i
  elen: Int32Array; // n+1: number of elements leading the list of variable i; −1 dead variable, −2 element
  nv: Int32Array; // n+1: size of supervariable i, 0 if not principal; negated while i ∈ Lk
  degree: Int32Array; // n+1: approximate external degree of a variable, |Le| of an element
  w: Int32Array; // n+1: marks; w[e] − mark = |Le∖Lk| during an update, 0 for absorbed elements
  head: Int32Array; // n+1: degree lists; later children lists of the assembly tree
  next: Int32Array; // n+1: degree-list / hash-bucket / sibling links
  last: Int32Array; // n+1: back links of degree lists; hash of i during supervariable detection
  hhead: Int32Array; // n+1: hash buckets
  cnz: number;
  nel: number;
  mindeg: number;
  mark: number;
  lemax: number;
}

/**
 * Fill-reducing permutation of a symmetric pattern (both triangles stored; the diagonal is ignored).
 * Returns perm with perm[newIndex] = oldIndex.
 */
export function minimumDegree(p: SparsePattern): Int32Array {
  const n = p.n;
  if (n === 0) return new Int32Array(0);
  const g = buildQuotientGraph(p);
  while (g.nel < n) eliminatePivot(g);
  return postorderAssemblyTree(g);
}

function buildQuotientGraph(p: SparsePattern): QuotientGraph {
  const { n, rowPtr, colIdx } = p;
  let nz = 0;
  for (let i = 0; i < n; i++) for (let k = rowPtr[i]; k < rowPtr[i + 1]; k++) if (colIdx[k] !== i) nz++;
  const nzmax = nz + Math.floor(nz / 5) + 2 * n + 16; // elbow room so that compaction is rare
  const g: QuotientGraph = {
    n, iw: new Int32Array(nzmax), pe: new Int32Array(n + 1), len: new Int32Array(n + 1),
    elen: new Int32Array(n + 1), nv: new Int32Array(n + 1), degree: new Int32Array(n + 1),
    w: new Int32Array(n + 1), head: new Int32Array(n + 1).fill(-1), next: new Int32Array(n + 1).fill(-1),
    last: new Int32Array(n + 1).fill(-1), hhead: new Int32Array(n + 1).fill(-1),
    cnz: nz, nel: 0, mindeg: 0, mark: 0, lemax: 0,
  };
  const { iw, pe, len, elen, nv, degree, w } = g;
  let q = 0;
  for (let i = 0; i < n; i++) {
    pe[i] = q;
    for (let k = rowPtr[i]; k < rowPtr[i + 1]; k++) if (colIdx[k] !== i) iw[q++] = colIdx[k];
    len[i] = q - pe[i];
  }
  const dense = Math.min(n - 2, Math.max(16, Math.floor(10 * Math.sqrt(n))));
  pe[n] = -1; elen[n] = -2; w[n] = 0;
  g.mark = clearMarks(g, 0, 0);
  for (let i = 0; i < n; i++) {
    nv[i] = 1; w[i] = 1; elen[i] = 0; degree[i] = len[i];
    const d = degree[i];
    if (d === 0) { // isolated: an element with nothing in it
      elen[i] = -2; g.nel++; pe[i] = -1; w[i] = 0;
    } else if (d > dense) { // ordered last, under the dummy root
      nv[n]++; nv[i] = 0; elen[i] = -1; g.nel++; pe[i] = flip(n);
    } else {
      insertDegreeList(g, i, d);
    }
  }
  return g;
}

/** Keeps marks below overflow: resets every live mark to 1 when mark + lemax would overflow. */
function clearMarks(g: QuotientGraph, mark: number, lemax: number): number {
  if (mark < 2 || mark + lemax >= INT_LIMIT) {
    const w = g.w;
    for (let x = 0; x < g.n; x++) if (w[x] !== 0) w[x] = 1;
    mark = 2;
  }
  return mark;
}

function insertDegreeList(g: QuotientGraph, i: number, d: number): void {
  const { head, next, last } = g;
  const h = head[d];
  if (h !== -1) last[h] = i;
  next[i] = h; last[i] = -1; head[d] = i;
}

function removeDegreeList(g: QuotientGraph, i: number): void {
  const { head, next, last } = g;
  if (next[i] !== -1) last[next[i]] = last[i];
  if (last[i] !== -1) next[last[i]] = next[i];
  else head[g.degree[i]] = next[i];
}

/** One step: pick a minimum-degree supervariable k, form element Lk, update its neighbours. */
function eliminatePivot(g: QuotientGraph): void {
  const { head, next, elen, nv } = g;
  while (g.mindeg < g.n && head[g.mindeg] === -1) g.mindeg++;
  const k = head[g.mindeg];
  if (next[k] !== -1) g.last[next[k]] = -1;
  head[g.mindeg] = next[k];
  const elenk = elen[k];
  const nvk = nv[k];
  g.nel += nvk;
  // |Lk| ≤ degree[k] = mindeg, so this much free space suffices for the new element
  if (elenk > 0 && g.cnz + g.mindeg >= g.iw.length) compact(g);
  const [pk1, pk2, dk0] = formElement(g, k, elenk, nvk);
  g.mark = clearMarks(g, g.mark, g.lemax);
  countOutsideLk(g, pk1, pk2);
  const [dk, nvkTotal] = updateDegrees(g, k, pk1, pk2, dk0, nvk);
  g.degree[k] = dk;
  g.lemax = Math.max(g.lemax, dk);
  g.mark = clearMarks(g, g.mark + g.lemax, g.lemax);
  detectSupervariables(g, pk1, pk2);
  finishElement(g, k, elenk, pk1, pk2, dk, nvkTotal);
}

/** Garbage collection: slides every live list to the front of iw. */
function compact(g: QuotientGraph): void {
  const { iw, pe, len, n } = g;
  for (let j = 0; j < n; j++) {
    const p = pe[j];
    if (p >= 0) { // tag the first slot of each live list with its owner
      pe[j] = iw[p];
      iw[p] = flip(j);
    }
  }
  let q = 0;
  for (let p = 0; p < g.cnz;) {
    const j = flip(iw[p++]);
    if (j >= 0) {
      iw[q] = pe[j];
      pe[j] = q++;
      for (let t = 0; t < len[j] - 1; t++) iw[q++] = iw[p++];
    }
  }
  g.cnz = q;
}

/**
 * Lk = (Ak ∪ ⋃ Le over elements e adjacent to k) ∖ k, as a list at the end of iw (or in place
 * when k touches no element). The elements are absorbed into k. Returns [pk1, pk2, |Lk| weighted].
 */
function formElement(g: QuotientGraph, k: number, elenk: number, nvk: number): [number, number, number] {
  const { iw, pe, len, nv, w } = g;
  let dk = 0;
  nv[k] = -nvk;
  let p = pe[k];
  const pk1 = elenk === 0 ? p : g.cnz;
  let pk2 = pk1;
  for (let k1 = 1; k1 <= elenk + 1; k1++) {
    let e: number, pj: number, ln: number;
    if (k1 > elenk) {
      e = k; pj = p; ln = len[k] - elenk;
    } else {
      e = iw[p++]; pj = pe[e]; ln = len[e];
    }
    for (let k2 = 0; k2 < ln; k2++) {
      const i = iw[pj++];
      const nvi = nv[i];
      if (nvi <= 0) continue; // already in Lk, or not principal
      dk += nvi;
      nv[i] = -nvi;
      iw[pk2++] = i;
      removeDegreeList(g, i);
    }
    if (e !== k) {
      pe[e] = flip(k);
      w[e] = 0;
    }
  }
  if (elenk !== 0) g.cnz = pk2;
  g.degree[k] = dk;
  pe[k] = pk1;
  len[k] = pk2 - pk1;
  g.elen[k] = -2;
  return [pk1, pk2, dk];
}

/** w[e] − mark = |Le ∖ Lk| for every element e adjacent to a variable of Lk (weighted). */
function countOutsideLk(g: QuotientGraph, pk1: number, pk2: number): void {
  const { iw, pe, elen, nv, w, degree } = g;
  const mark = g.mark;
  for (let pk = pk1; pk < pk2; pk++) {
    const i = iw[pk];
    const eln = elen[i];
    if (eln <= 0) continue;
    const nvi = -nv[i];
    const wnvi = mark - nvi;
    for (let p = pe[i]; p < pe[i] + eln; p++) {
      const e = iw[p];
      if (w[e] >= mark) w[e] -= nvi;
      else if (w[e] !== 0) w[e] = degree[e] + wnvi;
    }
  }
}

/**
 * Approximate external degree of each i ∈ Lk, pruning absorbed elements and variables of Lk from
 * its list and putting k first; aggressive absorption of elements with Le ⊆ Lk; mass elimination
 * of variables with nothing outside Lk. Returns the updated [|Lk|, size of the pivot].
 */
function updateDegrees(g: QuotientGraph, k: number, pk1: number, pk2: number, dk: number, nvk: number): [number, number] {
  const { iw, pe, len, elen, nv, w, degree, next, last, hhead, n } = g;
  const mark = g.mark;
  for (let pk = pk1; pk < pk2; pk++) {
    const i = iw[pk];
    const p1 = pe[i];
    const p2 = p1 + elen[i] - 1;
    let pn = p1;
    let h = 0, d = 0;
    for (let p = p1; p <= p2; p++) {
      const e = iw[p];
      if (w[e] === 0) continue;
      const dext = w[e] - mark;
      if (dext > 0) {
        d += dext; iw[pn++] = e; h += e;
      } else {
        pe[e] = flip(k); w[e] = 0;
      }
    }
    elen[i] = pn - p1 + 1;
    const p3 = pn;
    const p4 = p1 + len[i];
    for (let p = p2 + 1; p < p4; p++) {
      const j = iw[p];
      const nvj = nv[j];
      if (nvj <= 0) continue;
      d += nvj; iw[pn++] = j; h += j;
    }
    if (d === 0) {
      pe[i] = flip(k);
      const nvi = -nv[i];
      dk -= nvi; nvk += nvi; g.nel += nvi;
      nv[i] = 0; elen[i] = -1;
    } else {
      degree[i] = Math.min(degree[i], d);
      iw[pn] = iw[p3]; // first variable to the end
      iw[p3] = iw[p1]; // first element to the end of the elements
      iw[p1] = k; // k becomes the first element of i
      len[i] = pn - p1 + 1;
      h %= n;
      next[i] = hhead[h]; hhead[h] = i; last[i] = h;
    }
  }
  return [dk, nvk];
}

/** Merges variables of Lk with identical lists (same hash, then compared by marking). */
function detectSupervariables(g: QuotientGraph, pk1: number, pk2: number): void {
  const { iw, pe, len, elen, nv, w, next, last, hhead } = g;
  for (let pk = pk1; pk < pk2; pk++) {
    let i = iw[pk];
    if (nv[i] >= 0) continue; // dead by mass elimination
    const h = last[i];
    i = hhead[h];
    hhead[h] = -1;
    for (; i !== -1 && next[i] !== -1; i = next[i], g.mark++) {
      const ln = len[i];
      const eln = elen[i];
      const mark = g.mark;
      for (let p = pe[i] + 1; p < pe[i] + ln; p++) w[iw[p]] = mark;
      let jlast = i;
      for (let j = next[i]; j !== -1;) {
        let ok = len[j] === ln && elen[j] === eln;
        for (let p = pe[j] + 1; ok && p < pe[j] + ln; p++) if (w[iw[p]] !== mark) ok = false;
        if (ok) {
          pe[j] = flip(i);
          nv[i] += nv[j]; // both negative while in Lk
          nv[j] = 0; elen[j] = -1;
          j = next[j];
          next[jlast] = j;
        } else {
          jlast = j;
          j = next[j];
        }
      }
    }
  }
}

/** Final degrees of the variables of Lk into the degree lists; compacts Lk. */
function finishElement(g: QuotientGraph, k: number, elenk: number, pk1: number, pk2: number, dk: number, nvk: number): void {
  const { iw, pe, len, nv, w, degree, n } = g;
  let p = pk1;
  for (let pk = pk1; pk < pk2; pk++) {
    const i = iw[pk];
    const nvi = -nv[i];
    if (nvi <= 0) continue;
    nv[i] = nvi;
    const d = Math.min(degree[i] + dk - nvi, n - g.nel - nvi);
    insertDegreeList(g, i, d);
    g.mindeg = Math.min(g.mindeg, d);
    degree[i] = d;
    iw[p++] = i;
  }
  nv[k] = nvk;
  len[k] = p - pk1;
  if (len[k] === 0) {
    pe[k] = -1;
    w[k] = 0;
  }
  if (elenk !== 0) g.cnz = p;
}

/**
 * Orders by a depth-first postorder of the assembly tree (absorbed elements and merged variables
 * hang below the element that took them): children first, so each merged variable lands next to
 * its pivot and the result is an elimination order equivalent to the pivot sequence.
 */
function postorderAssemblyTree(g: QuotientGraph): Int32Array {
  const { pe, nv, n } = g;
  const head = g.head.fill(-1);
  const next = g.next;
  const parent = new Int32Array(n + 1);
  for (let j = 0; j <= n; j++) parent[j] = j === n || pe[j] > -2 ? -1 : flip(pe[j]);
  for (let j = n; j >= 0; j--) { // variables
    if (nv[j] > 0 || parent[j] === -1) continue;
    next[j] = head[parent[j]]; head[parent[j]] = j;
  }
  for (let e = n; e >= 0; e--) { // elements
    if (nv[e] <= 0 || parent[e] === -1) continue;
    next[e] = head[parent[e]]; head[parent[e]] = e;
  }
  const order = new Int32Array(n);
  const stack = g.last; // free now
  let k = 0;
  for (let root = 0; root <= n; root++) {
    if (parent[root] !== -1) continue;
    let top = 0;
    stack[0] = root;
    while (top >= 0) {
      const x = stack[top];
      const c = head[x];
      if (c === -1) {
        top--;
        if (x !== n) order[k++] = x;
      } else {
        head[x] = next[c];
        stack[++top] = c;
      }
    }
  }
  if (k !== n) throw new Error(`minimumDegree: internal error, ordered ${k} of ${n} nodes`);
  return order;
}

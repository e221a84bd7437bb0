/**
 * Which thread factors which fronts: subtree-to-thread mapping of the assembly tree (Geist & Ng,
 * "Task scheduling for parallel sparse Cholesky factorization", Int. J. Parallel Programming 18(4),
 * 1989). Disjoint subtrees have no data in common until their parents, so each thread factors whole
 * subtrees with its own stack; the fronts above them (the top part) follow on the calling thread.
 *
 * Starting from the roots, the heaviest subtree is split (its root moves to the top part, its children
 * become subtrees) until the subtrees, packed onto the threads largest first, give the shortest
 * estimated time: the fullest thread's work plus the top part's.
 */
import type { Symbolic } from './symbolic.ts';
import { NB, type ArenaSizes } from './frontArena.ts';

export interface ParallelPlan {
  threads: number;
  lists: Int32Array[]; // threads: the supernodes each thread factors, whole subtrees, increasing (children first; thread 0 is the caller)
  top: Int32Array; // supernodes factored by the caller after the others, increasing (children first)
  handoffAt: Float64Array; // nSuper: offset (doubles) of a subtree root's update matrix in the handoff buffer, −1 elsewhere
  handoffDoubles: number; // size of the handoff buffer
  arenas: ArenaSizes[]; // threads: what each thread's arena must hold (thread 0 also factors the top part: the analysis' sizes)
  work: number[]; // threads: estimated flops of each thread's subtrees
  topWork: number; // estimated flops of the top part
}

/** Flops of front s as the kernels perform them (symbolic.ts, frontSizes). */
function frontWork(S: Symbolic, s: number): number {
  const ns = S.superStart[s + 1] - S.superStart[s], m = S.rowPtr[s + 1] - S.rowPtr[s];
  return 8 * ((ns * ns * ns) / 6 + (m * ns * ns) / 2 + (m * m * ns) / 2);
}

export function planParallel(S: Symbolic, threads: number): ParallelPlan {
  if (!(Number.isInteger(threads) && threads >= 1)) throw new RangeError(`threads must be a whole number, 1 or more (got ${threads})`);
  const nSuper = S.nSuper, parent = S.superParent;
  const own = new Float64Array(nSuper), subtree = new Float64Array(nSuper), firstDesc = new Int32Array(nSuper);
  for (let s = 0; s < nSuper; s++) firstDesc[s] = s;
  for (let s = 0; s < nSuper; s++) {
    own[s] = frontWork(S, s);
    subtree[s] += own[s];
    const p = parent[s];
    if (p !== -1) {
      subtree[p] += subtree[s];
      firstDesc[p] = Math.min(firstDesc[p], firstDesc[s]);
    }
  }
  let candidates: number[] = [];
  for (let s = 0; s < nSuper; s++) if (parent[s] === -1) candidates.push(s);
  const topSet: number[] = [];
  let topWork = 0;
  let best = { time: Infinity, candidates: candidates.slice(), top: [] as number[], topWork: 0 };
  const total = subtree.reduce((a, s, i) => (parent[i] === -1 ? a + s : a), 0);
  for (let iter = 0; iter < 4 * nSuper && candidates.length > 0; iter++) {
    const bins = pack(candidates, subtree, threads).load;
    const time = Math.max(...bins) + topWork;
    if (time < best.time) best = { time, candidates: candidates.slice(), top: topSet.slice(), topWork };
    // split the heaviest subtree with children
    let h = -1;
    for (const c of candidates) if (S.childPtr[c + 1] > S.childPtr[c] && (h === -1 || subtree[c] > subtree[h])) h = c;
    if (h === -1 || subtree[h] < total / (256 * threads)) break;
    candidates = candidates.filter((c) => c !== h);
    for (let k = S.childPtr[h]; k < S.childPtr[h + 1]; k++) candidates.push(S.child[k]);
    topSet.push(h);
    topWork += own[h];
  }
  const { bin } = pack(best.candidates, subtree, threads);
  const lists: number[][] = Array.from({ length: threads }, () => []);
  const work = new Array<number>(threads).fill(0);
  best.candidates.forEach((r, k) => {
    for (let s = firstDesc[r]; s <= r; s++) lists[bin[k]].push(s);
    work[bin[k]] += subtree[r];
  });
  const handoffAt = new Float64Array(nSuper).fill(-1);
  let handoffDoubles = 0;
  for (const r of best.candidates) {
    if (parent[r] === -1) continue;
    const m = S.rowPtr[r + 1] - S.rowPtr[r];
    handoffAt[r] = handoffDoubles;
    handoffDoubles += m * (m + 1);
  }
  const arenas = lists.map((l, t) => (t === 0 ? { maxFront: S.maxFront, maxPivots: S.maxPivots, workEntries: S.workEntries, stackPeak: S.stackPeak } : listSizes(S, l, handoffAt)));
  return {
    threads, lists: lists.map((l) => Int32Array.from(l).sort()), top: Int32Array.from(best.top.sort((a, b) => a - b)), handoffAt, handoffDoubles,
    arenas, work, topWork: best.topWork,
  };
}

/** Largest first onto the least loaded thread. */
function pack(candidates: number[], subtree: Float64Array, threads: number): { bin: number[]; load: number[] } {
  const order = candidates.map((_, k) => k).sort((a, b) => subtree[candidates[b]] - subtree[candidates[a]]);
  const load = new Array<number>(threads).fill(0), bin = new Array<number>(candidates.length).fill(0);
  for (const k of order) {
    let t = 0;
    for (let u = 1; u < threads; u++) if (load[u] < load[t]) t = u;
    bin[k] = t;
    load[t] += subtree[candidates[k]];
  }
  return { bin, load };
}

/** The arena a thread needs for whole subtrees factored in the given order (roots handed off, not stacked). */
function listSizes(S: Symbolic, list: number[], handoffAt: Float64Array): ArenaSizes {
  let maxFront = 1, maxPivots = 1, workEntries = 1, stack = 0, stackPeak = 1;
  for (const s of list) {
    const ns = S.superStart[s + 1] - S.superStart[s], m = S.rowPtr[s + 1] - S.rowPtr[s];
    for (let k = S.childPtr[s]; k < S.childPtr[s + 1]; k++) {
      const mc = S.rowPtr[S.child[k] + 1] - S.rowPtr[S.child[k]];
      stack -= (mc * (mc + 1)) / 2;
    }
    if (handoffAt[s] < 0) stack += (m * (m + 1)) / 2;
    stackPeak = Math.max(stackPeak, stack);
    maxFront = Math.max(maxFront, ns + m);
    maxPivots = Math.max(maxPivots, ns);
    workEntries = Math.max(workEntries, 2 * ns * Math.max(m, Math.min(ns, NB)));
  }
  return { maxFront, maxPivots, workEntries, stackPeak };
}

/**
 * A duct made only of uniform sections (straight runs, lined runs, parallel baffles, area steps, offset
 * ports), solved with no 3D mesh: the modes of each section's cross-section (modes.ts), mode matching at
 * every interface and the scattering-matrix cascade (matching.ts), and transmission loss from modal powers.
 *
 * Layout. When no section's contents vary along z and all share one height h, every field separates as
 * Y(y)·cos(nπ(z − z0)/h) and each z-order n is an independent duct with 1D cross-sections ('z-separated');
 * likewise with y and z exchanged ('y-separated'). Otherwise every section gets a 2D cross-section grid.
 * Both give the same answer where both apply (tests/waveguide); the separated one costs far less.
 *
 * Incidence. 'mode': one mode of the inlet (index in the inlet's modes sorted by attenuation, 0 the least
 * attenuated: the plane wave of a rigid inlet) with unit power. 'equal-power': every propagating inlet mode
 * with the same power and random phase, i.e. incoherent, the usual model of fan noise in a duct above the
 * first cut-on: TL = 10 log10(Σ W_incident / Σ W_transmitted), each mode's powers computed on its own.
 *
 * Truncation check. Modes are kept up to a transverse cut-off K·√1.5 (about 1.5 n modes in every section);
 * for each section the whole duct is solved again with that section cut back to K (n modes), and the change
 * in TL is reported.
 */
import { porousMedium, type PorousModel } from '../acoustics/index.ts';
import { buildSectionGrid, type Fill, type Rect, type SectionGrid } from './grid.ts';
import { sectionModes, type ModeSet, type SlotMedium } from './modes.ts';
import { axialPower, coupling, interfaceScattering, pick, powerGram, propagation, star, starPropagation, type Coupling, type Scattering } from './matching.ts';
import { cmatrix, identity, luFactor, luSolve, matmul, type CMatrix } from './dense.ts';

export interface PorousFill { model: PorousModel; flowResistivity: number }
export interface SectionFill { rect: Rect; material: 'rigid' | PorousFill }

export interface WaveguideSection {
  name: string;
  length: number;
  /** The duct's rigid walls in the cross-section (y, z), m. */
  outer: Rect;
  /** Porous regions and rigid cores; where they overlap the first listed decides. */
  fills: SectionFill[];
}

export type WaveguideIncidence = { kind: 'mode'; index: number } | { kind: 'equal-power' };

export interface WaveguideDuct {
  sections: WaveguideSection[];
  air: { density: number; soundSpeed: number };
  termination: 'anechoic' | 'rigid';
  order: number;
  pointsPerWavelength: number;
  maxFrequencyHz: number;
  incidence: WaveguideIncidence;
  /** Transverse cut-off K = max(ratio·k, k + orders·π/D), D the largest cross-section dimension. Defaults 1.5 and 8. */
  cutoff?: { ratio?: number; orders?: number };
  /** 'auto' separates in z or y when the duct allows it; '2d' always uses 2D cross-section grids. */
  layout?: 'auto' | '2d';
}

export type WaveguideLayout = 'z-separated' | 'y-separated' | '2d';

export interface PreparedWaveguide {
  duct: WaveguideDuct;
  layout: WaveguideLayout;
  /** Sections as solved (y and z exchanged for 'y-separated'), fills with material indices. */
  solved: { name: string; length: number; outer: Rect; fills: Fill[]; grid: number }[];
  grids: SectionGrid[]; // one per distinct cross-section
  materials: PorousFill[];
  height: number; // h of the separated axis (0 in 2D)
  largestDimension: number;
}

export interface SectionReport {
  name: string;
  modes: number; // kept (at K·√1.5), summed over z-orders when separated
  propagating: number;
  truncatedModes: number; // at K
  truncationDeltaDb: number | null; // TL with this section at K minus TL with all at K·√1.5
  leastAttenuationDbPerM: number; // of its least attenuated mode, 20 log10(e)·(−Im k_x)
  gridDofs: number;
}

export interface WaveguidePoint {
  frequencyHz: number;
  tlDb: number | null; // null with a rigid termination
  incidentPower: number; // W, summed over incident modes (1 W each)
  transmittedPower: number;
  reflectedPower: number;
  energyBalance: number; // |1 − (W_r + W_t)/W_i|: 0 in a lossless duct
  incidentModes: number;
  inletReflection: number | null; // |R| of the incident mode ('mode' incidence)
  cutoff: { base: number; kept: number }; // K and K·√1.5, 1/m
  channels: number; // z-orders solved (1 in 2D)
  sections: SectionReport[];
  truncationDb: number; // the largest |truncationDeltaDb|
  stats: { modeSeconds: number; matchingSeconds: number; krylovMax: number };
}

const TOL = 1e-9;
const DB_PER_NEPER = 20 / Math.LN10;
const CHECK_FACTOR = Math.sqrt(1.5);

function swapRect(r: Rect): Rect { return { y0: r.z0, y1: r.z1, z0: r.y0, z1: r.y1 }; }

function separatedIn(sections: WaveguideSection[], axis: 'z' | 'y'): boolean {
  const lo = axis === 'z' ? 'z0' : 'y0', hi = axis === 'z' ? 'z1' : 'y1';
  const o0 = sections[0].outer;
  return sections.every((s) => Math.abs(s.outer[lo] - o0[lo]) < TOL && Math.abs(s.outer[hi] - o0[hi]) < TOL
    && s.fills.every((f) => f.rect[lo] <= s.outer[lo] + TOL && f.rect[hi] >= s.outer[hi] - TOL));
}

function checkDuct(d: WaveguideDuct): void {
  if (d.sections.length === 0) throw new RangeError('waveguide: sections is empty; give at least one section');
  d.sections.forEach((s, i) => {
    if (!(s.length > 0)) throw new RangeError(`waveguide: sections[${i}].length = ${s.length}: must be positive (m)`);
    if (!(s.outer.y1 > s.outer.y0 && s.outer.z1 > s.outer.z0)) throw new RangeError(`waveguide: sections[${i}].outer is empty: y1 > y0 and z1 > z0 needed`);
    s.fills.forEach((f, j) => {
      if (f.material !== 'rigid' && !(f.material.flowResistivity > 0)) throw new RangeError(`waveguide: sections[${i}].fills[${j}].material.flowResistivity must be positive (Pa·s/m²)`);
    });
  });
  if (!(d.order >= 1 && d.order <= 12 && Number.isInteger(d.order))) throw new RangeError(`waveguide: order = ${d.order}: an integer 1..12`);
  if (!(d.pointsPerWavelength > 0) || !(d.maxFrequencyHz > 0)) throw new RangeError('waveguide: pointsPerWavelength and maxFrequencyHz must be positive');
}

/** K(f) and the grading it needs. */
export function transverseCutoff(duct: WaveguideDuct, largestDimension: number, frequencyHz: number): number {
  const k = (2 * Math.PI * frequencyHz) / duct.air.soundSpeed, ratio = duct.cutoff?.ratio ?? 1.5, orders = duct.cutoff?.orders ?? 8;
  return Math.max(ratio * k, k + (orders * Math.PI) / largestDimension);
}

function mediaAt(prep: PreparedWaveguide, frequencyHz: number): SlotMedium[] {
  const { density, soundSpeed } = prep.duct.air;
  const air: SlotMedium = { rhoInv: { re: 1 / density, im: 0 }, kappaInv: { re: 1 / (density * soundSpeed ** 2), im: 0 } };
  return [air, ...prep.materials.map((m) => porousMedium(m.model, frequencyHz, m.flowResistivity, { density, soundSpeed }))];
}

export function prepareWaveguide(duct: WaveguideDuct): PreparedWaveguide {
  checkDuct(duct);
  let layout: WaveguideLayout = '2d';
  if ((duct.layout ?? 'auto') === 'auto') layout = separatedIn(duct.sections, 'z') ? 'z-separated' : separatedIn(duct.sections, 'y') ? 'y-separated' : '2d';
  const materials: PorousFill[] = [];
  const indexOf = (m: PorousFill) => {
    let i = materials.findIndex((x) => x.model === m.model && x.flowResistivity === m.flowResistivity);
    if (i < 0) { materials.push(m); i = materials.length - 1; }
    return i;
  };
  const tr = layout === 'y-separated' ? swapRect : (r: Rect) => r;
  const largestDimension = Math.max(...duct.sections.map((s) => Math.max(s.outer.y1 - s.outer.y0, s.outer.z1 - s.outer.z0)));
  const prep: PreparedWaveguide = { duct, layout, solved: [], grids: [], materials, height: 0, largestDimension };
  const keyed = new Map<string, number>();
  const pending: { outer: Rect; fills: Fill[] }[] = [];
  for (const s of duct.sections) {
    const outer = tr(s.outer), fills: Fill[] = s.fills.map((f) => ({ rect: tr(f.rect), material: f.material === 'rigid' ? 'rigid' : indexOf(f.material) }));
    const key = JSON.stringify([outer, fills]);
    let g = keyed.get(key);
    if (g === undefined) { g = pending.length; keyed.set(key, g); pending.push({ outer, fills }); }
    prep.solved.push({ name: s.name, length: s.length, outer, fills, grid: g });
  }
  prep.height = layout === '2d' ? 0 : prep.solved[0].outer.z1 - prep.solved[0].outer.z0;
  // grade for the top frequency: air cells resolve the kept transverse wavenumbers, porous cells also their own
  const fTop = duct.maxFrequencyHz, kTop = (2 * Math.PI * fTop) / duct.air.soundSpeed;
  const Kkept = CHECK_FACTOR * transverseCutoff(duct, largestDimension, fTop), media = mediaAt(prep, fTop);
  const maxSize = media.map((m, s) => {
    let K = Kkept;
    if (s > 0) {
      // |k_c²| = ω²|ρ/κ| of the material
      const kc2 = (2 * Math.PI * fTop) ** 2 * Math.hypot(m.kappaInv.re, m.kappaInv.im) / Math.hypot(m.rhoInv.re, m.rhoInv.im);
      K = Math.sqrt(Kkept * Kkept + Math.max(0, kc2 - kTop * kTop));
    }
    return (duct.order * 2 * Math.PI) / (duct.pointsPerWavelength * K);
  });
  for (const p of pending) prep.grids.push(buildSectionGrid({ outer: p.outer, fills: p.fills, order: duct.order, maxSize, dim: layout === '2d' ? 2 : 1 }));
  return prep;
}

interface Channel {
  modes: ModeSet[]; // per distinct grid
  base: number[][]; // per section: indices of the modes within K
  full: number[][]; // per section: all indices
  couplings: Coupling[]; // per interface
  grams: Map<number, CMatrix>; // per distinct grid, the power form of all its modes (computed when first needed)
}

export function solveWaveguideAt(prep: PreparedWaveguide, frequencyHz: number, now: () => number = () => 0): WaveguidePoint {
  const { duct, solved } = prep, omega = 2 * Math.PI * frequencyHz, k = omega / duct.air.soundSpeed;
  const K = transverseCutoff(duct, prep.largestDimension, frequencyHz), Kc = CHECK_FACTOR * K;
  const media = mediaAt(prep, frequencyHz);
  const t0 = now();
  const orders = prep.layout === '2d' ? [0] : Array.from({ length: Math.floor((Kc * prep.height) / Math.PI) + 1 }, (_, n) => n);
  let krylovMax = 0;
  const channels: Channel[] = orders.map((n) => {
    const q2 = prep.layout === '2d' ? 0 : ((n * Math.PI) / prep.height) ** 2;
    const modes = prep.grids.map((g) => sectionModes(g, media, { omega, k, cutoff: Kc, q2 }));
    for (const m of modes) krylovMax = Math.max(krylovMax, m.krylov);
    const full = solved.map((s) => Array.from({ length: modes[s.grid].count }, (_, i) => i));
    const base = solved.map((s) => {
      const ms = modes[s.grid], out: number[] = [];
      for (let i = 0; i < ms.count; i++) if (Math.hypot(ms.mu.re[i] - k * k, ms.mu.im[i]) <= K * K * (1 + 1e-9)) out.push(i);
      return out;
    });
    const couplings = solved.slice(1).map((s, i) => coupling({ modes: modes[solved[i].grid], fills: solved[i].fills }, { modes: modes[s.grid], fills: s.fills }, [solved[i].name, s.name]));
    return { modes, base, full, couplings, grams: new Map() };
  });
  const t1 = now();
  // the inlet modes that can be incident, across z-orders, by attenuation
  const inlet = solved[0].grid;
  const candidates: { c: number; i: number; att: number; re: number }[] = [];
  channels.forEach((ch, c) => {
    const ms = ch.modes[inlet];
    for (let i = 0; i < ms.count; i++) candidates.push({ c, i, att: -ms.kx.im[i], re: ms.kx.re[i] });
  });
  candidates.sort((a, b) => a.att - b.att || b.re - a.re);
  let incident: { c: number; i: number }[];
  if (duct.incidence.kind === 'mode') {
    const j = duct.incidence.index, cand = candidates[j];
    if (!cand || !propagates(channels[cand.c].modes[inlet], cand.i)) {
      throw new RangeError(`waveguide: incidence.index = ${j}: the inlet has ${countPropagating(channels, inlet)} propagating mode(s) at ${frequencyHz} Hz; choose an index below that (0 is the least attenuated)`);
    }
    incident = [cand];
  } else incident = candidates.filter((x) => propagates(channels[x.c].modes[inlet], x.i));
  const full = run(prep, channels, incident, omega, (ch) => ch.full);
  const sections: SectionReport[] = solved.map((s, si) => {
    let trunc: number | null = null;
    if (full.tlDb !== null) {
      const r = run(prep, channels, incident, omega, (ch) => ch.full.map((f, j) => (j === si ? ch.base[j] : f)));
      trunc = r.tlDb === null ? null : r.tlDb - full.tlDb;
    }
    let prop = 0, kept = 0, base = 0, att = Infinity;
    for (const ch of channels) {
      const ms = ch.modes[s.grid];
      prop += ms.propagating;
      kept += ms.count;
      base += ch.base[si].length;
      if (ms.count > 0) att = Math.min(att, -ms.kx.im[0]);
    }
    return { name: s.name, modes: kept, propagating: prop, truncatedModes: base, truncationDeltaDb: trunc, leastAttenuationDbPerM: DB_PER_NEPER * att, gridDofs: prep.grids[s.grid].ndofs };
  });
  const t2 = now();
  return {
    frequencyHz, tlDb: full.tlDb, incidentPower: full.wi, transmittedPower: full.wt, reflectedPower: full.wr,
    energyBalance: Math.abs(1 - (full.wr + full.wt) / full.wi), incidentModes: incident.length,
    inletReflection: duct.incidence.kind === 'mode' ? full.reflection : null,
    cutoff: { base: K, kept: Kc }, channels: channels.length, sections,
    truncationDb: Math.max(0, ...sections.map((s) => Math.abs(s.truncationDeltaDb ?? 0))),
    stats: { modeSeconds: (t1 - t0) / 1000, matchingSeconds: (t2 - t1) / 1000, krylovMax },
  };
}

function propagates(ms: ModeSet, i: number): boolean {
  return ms.lossless ? ms.mu.re[i] > 0 : ms.kx.re[i] > -ms.kx.im[i];
}

function countPropagating(channels: Channel[], inlet: number): number {
  return channels.reduce((n, ch) => n + ch.modes[inlet].propagating, 0);
}

/** Every channel's cascade with the given mode subsets, and the powers of the incident modes. */
function run(prep: PreparedWaveguide, channels: Channel[], incident: { c: number; i: number }[], omega: number, subset: (ch: Channel) => number[][]): { tlDb: number | null; wi: number; wt: number; wr: number; reflection: number } {
  const { solved } = prep, last = solved.length - 1;
  let wi = 0, wt = 0, wr = 0, reflection = 0;
  channels.forEach((ch, c) => {
    const mine = incident.filter((x) => x.c === c);
    if (mine.length === 0) return;
    const sets = subset(ch);
    const kOf = (s: number) => {
      const ms = ch.modes[solved[s].grid], idx = sets[s];
      return { re: Float64Array.from(idx, (i) => ms.kx.re[i]), im: Float64Array.from(idx, (i) => ms.kx.im[i]) };
    };
    let S: Scattering = propagation(kOf(0), solved[0].length);
    for (let s = 1; s <= last; s++) {
      const cp = ch.couplings[s - 1], small = cp.smaller === 'left' ? s - 1 : s, large = cp.smaller === 'left' ? s : s - 1;
      const W = pick(cp.W, sets[small], sets[large]);
      S = star(S, interfaceScattering(W, kOf(small), kOf(large), cp.smaller));
      S = starPropagation(S, kOf(s), solved[s].length);
    }
    const inSet = sets[0], outSet = sets[last];
    const gram = (grid: number) => {
      let G = ch.grams.get(grid);
      if (!G) { G = powerGram(ch.modes[grid], ch.full[solved.findIndex((x) => x.grid === grid)]); ch.grams.set(grid, G); }
      return G;
    };
    const Gin = pick(gram(solved[0].grid), inSet, inSet), Gout = pick(gram(solved[last].grid), outSet, outSet), kin = kOf(0), kout = kOf(last);
    // incident columns: unit power in each incident mode
    const nIn = inSet.length, A = cmatrix(nIn, mine.length);
    mine.forEach((x, col) => {
      const row = inSet.indexOf(x.i);
      const e = { re: new Float64Array(nIn), im: new Float64Array(nIn) };
      e.re[row] = 1;
      const p = axialPower(Gin, kin, omega, e);
      A.re[row * mine.length + col] = 1 / Math.sqrt(p);
    });
    // termination: b_out = R_T a_out; a_out = (I − S22 R_T)⁻¹ S21 a_in, b_in = S11 a_in + S12 b_out
    const nOut = outSet.length;
    let aOut: CMatrix, bOut: CMatrix;
    if (prep.duct.termination === 'anechoic') {
      aOut = matmul(S.s21, A);
      bOut = cmatrix(nOut, mine.length);
    } else {
      const M = identity(nOut);
      for (let q = 0; q < nOut * nOut; q++) { M.re[q] -= S.s22.re[q]; M.im[q] -= S.s22.im[q]; }
      aOut = luSolve(luFactor(M), matmul(S.s21, A));
      bOut = aOut;
    }
    const bIn = matmul(S.s11, A);
    const bInPlus = prep.duct.termination === 'anechoic' ? bIn : addTo(bIn, matmul(S.s12, bOut));
    const col = (X: CMatrix, j: number) => ({ re: Float64Array.from({ length: X.rows }, (_, r) => X.re[r * X.cols + j]), im: Float64Array.from({ length: X.rows }, (_, r) => X.im[r * X.cols + j]) });
    const zeroIn = { re: new Float64Array(nIn), im: new Float64Array(nIn) };
    mine.forEach((x, j) => {
      wi += 1;
      wt += axialPower(Gout, kout, omega, col(aOut, j), col(bOut, j));
      wr += -axialPower(Gin, kin, omega, zeroIn, col(bInPlus, j));
      const row = inSet.indexOf(x.i);
      reflection = Math.hypot(bInPlus.re[row * mine.length + j], bInPlus.im[row * mine.length + j]) * Math.sqrt(axialPower(Gin, kin, omega, unit(nIn, row)));
    });
  });
  const tlDb = prep.duct.termination === 'anechoic' ? 10 * Math.log10(wi / wt) : null;
  return { tlDb, wi, wt, wr, reflection };
}

function unit(n: number, i: number) {
  const e = { re: new Float64Array(n), im: new Float64Array(n) };
  e.re[i] = 1;
  return e;
}

function addTo(A: CMatrix, B: CMatrix): CMatrix {
  for (let i = 0; i < A.re.length; i++) { A.re[i] += B.re[i]; A.im[i] += B.im[i]; }
  return A;
}

/**
 * The built-in verification suite (`quietgrid verify`, and the app's own check): small problems with known
 * answers, solved by the same engine that solves a user's scenario, each row naming its published source,
 * its tolerance, the value found and whether it passes. Pure engine code: the caller passes a clock.
 *
 * Groups:
 *  - outgoing: a plane wave in a long straight duct, truncated by a rigid end or 1–4 layers of each kind,
 *    against the exact e^{−jkx} (total side) and 0 (scattered side);
 *  - pade: the measured reflection of discrete layers against the Padé formula;
 *  - monopole: a point source in free field (an octant with rigid symmetry planes), face, edge and corner
 *    layers, against refinement and layer count: the error falls to the discretisation error as layers are added;
 *  - duct: an expansion chamber against Davis et al. (1954), a closed side stub's peak, the plane-wave chain
 *    against the closed forms;
 *  - porous: a rigid-backed porous layer at the end of a duct against its transfer-impedance absorption.
 */
import { DuctProblem, type DuctModel, type Medium } from './duct.ts';
import { RoomProblem, type RoomModel } from './room.ts';
import { chooseLengths, DEFAULT_RANGE, padeReflection, worstReflection, type AbsorberKind } from '../assembly/layers.ts';
import { closedSideBranchTl, cutOnFrequency, expansionChamberTl, normalIncidenceAbsorption, porousMedium, porousWave, rigidBackedImpedance, type PorousModel } from '../acoustics/index.ts';
import { readScenario } from '../scenario/index.ts';
import { prepareProblem } from './prepare.ts';
import type { Problem } from './problem.ts';

export type VerifyGroupId = 'outgoing' | 'pade' | 'monopole' | 'duct' | 'porous';

export interface VerifyRow {
  case: string;
  source: string;
  tolerance: string;
  value: number;
  /** The value as printed (with its unit). */
  shown: string;
  pass: boolean;
}

export interface VerifyTable { id: VerifyGroupId; title: string; note: string; rows: VerifyRow[]; seconds: number }

export interface VerifyReport { pass: boolean; tables: VerifyTable[]; seconds: number }

type Now = () => number;

const e2 = (v: number) => v.toExponential(2);
const pct = (v: number) => `${(100 * v).toFixed(3)} %`;
const db = (v: number) => `${v.toFixed(2)} dB`;

function row(c: string, source: string, tolerance: string, value: number, shown: string, pass: boolean): VerifyRow {
  return { case: c, source, tolerance, value, shown, pass: pass && Number.isFinite(value) };
}

// ---- (a) outgoing wave, (b) Padé reflection: a long straight duct, λ = 1 m ----

const C = 343, RHO = 1.2;

/** A 3 m straight duct (λ = 1 m at 343 Hz) with absorbing ends, the plane wave launched at its inlet. */
export function straightDuct(kind: AbsorberKind, layers: number, order: number, ppw: number, outletOpen = true): DuctModel {
  const side = 0.1, rect = { y0: 0, y1: side, z0: 0, z1: side }, open = { a0: 0, a1: side, b0: 0, b1: side };
  return {
    boxes: [{ x0: 0, x1: 3, y0: 0, y1: side, z0: 0, z1: side }],
    openings: [{ side: '-x', rect: open }, ...(outletOpen ? [{ side: '+x' as const, rect: open }] : [])],
    inlet: { x: 0, rect, clearTo: 1.5 }, outlet: { x: 3, rect, clearFrom: 1.5, termination: outletOpen ? 'anechoic' : 'rigid' },
    soundSpeed: C, density: RHO, order, pointsPerWavelength: ppw, maxFrequencyHz: C,
    absorber: { kind, layers, range: DEFAULT_RANGE }, incident: { mode: [0, 0], amplitude: 1 },
  };
}

/** max |u − u_exact| over the physical dofs: e^{−jkx} on the total side, 0 on the scattered side (1 Pa incident). */
export function outgoingError(model: DuctModel, now: Now): number {
  const k = 2 * Math.PI, prep = new DuctProblem(model), u = prep.solve(C, now, true).field!;
  let error = 0;
  for (let i = 0; i < u.re.length; i++) {
    const x = prep.xyz[3 * i];
    if (x < 0 || x > 3) continue;
    const tot = prep.onTotalSide[i] === 1;
    error = Math.max(error, Math.hypot(u.re[i] - (tot ? Math.cos(k * x) : 0), u.im[i] - (tot ? -Math.sin(k * x) : 0)));
  }
  return error;
}

const PADE_SOURCE = 'Guddati & Lim, IJNME 66 (2006); arXiv:2308.12255';

function planeReflection(p: number, layers: number): number {
  const R = padeReflection(p, chooseLengths(p, layers, DEFAULT_RANGE), { re: 1, im: 0 });
  return Math.hypot(R.re, R.im);
}

function outgoingTable(now: Now): Omit<VerifyTable, 'seconds'> {
  const rows: VerifyRow[] = [];
  const eh = outgoingError(straightDuct('discrete', 8, 4, 12), now);
  rows.push(row('interior discretisation error e_h (8 discrete layers)', 'common practice (order 4, 12 points/λ)', '< 1e-3', eh, e2(eh), eh < 1e-3));
  const rigid = outgoingError(straightDuct('discrete', 3, 4, 12, false), now);
  rows.push(row('rigid end, no outlet layers', 'common practice: a rigid end reflects |R| = 1', '> 0.5', rigid, e2(rigid), rigid > 0.5));
  const errors: Record<string, number[]> = {};
  for (const kind of ['discrete', 'constant', 'smooth'] as const) errors[kind] = [1, 2, 3, 4].map((L) => outgoingError(straightDuct(kind, L, 4, 12), now));
  errors.discrete.forEach((e, i) => {
    const R = planeReflection(4, i + 1), lo = Math.max(0, R - 2 * eh), hi = R + 2 * eh;
    rows.push(row(`discrete, ${i + 1} layer${i ? 's' : ''}`, PADE_SOURCE, `|R| ± 2e_h = ${e2(lo)} … ${e2(hi)}`, e, e2(e), e >= lo && e <= hi));
  });
  errors.constant.forEach((e, i) => {
    rows.push(row(`constant, ${i + 1} layer${i ? 's' : ''}`, 'common practice: absorbs (a rigid end gives 1)', '< 0.05', e, e2(e), e < 0.05));
  });
  for (const i of [2, 3]) {
    const ratio = errors.constant[i] / errors.discrete[i];
    rows.push(row(`constant / discrete, ${i + 1} layers (same lengths)`, 'arXiv:2308.12255: reduced integration beats the full rule', '≥ 5', ratio, ratio.toFixed(1), ratio >= 5));
  }
  errors.smooth.forEach((e, i) => {
    const prev = i > 0 ? errors.smooth[i - 1] : 0.1;
    rows.push(row(`smooth, ${i + 1} layer${i ? 's' : ''}`, 'common practice: a thicker graded layer reflects less', i > 0 ? `< ${e2(prev)} (${i} layer${i > 1 ? 's' : ''})` : '< 0.1', e, e2(e), e < prev));
  });
  return { id: 'outgoing', title: 'Outgoing plane wave in a long straight duct (order 4, 12 points/λ, λ = 1 m): max |p − e^{−jkx}|, 1 Pa incident', note: 'e_h: the same duct with 8 discrete layers, whose own reflection is far below the interior error; |R|: the Padé formula for the layers chosen.', rows };
}

/**
 * |R| of the outlet layers of a straightDuct, measured: on the total side u − e^{−jkx} = B e^{+jkx}, so the
 * mean of |u − e^{−jkx}| over the downstream run is |B| = |R| (1 Pa incident, λ = 1 m).
 */
export function measuredOutletReflection(model: DuctModel, now: Now): number {
  const k = 2 * Math.PI, prep = new DuctProblem(model), u = prep.solve(C, now, true).field!;
  let sum = 0, count = 0;
  for (let i = 0; i < u.re.length; i++) {
    const x = prep.xyz[3 * i];
    if (!prep.onTotalSide[i] || x < 1.6 || x > 2.9) continue;
    sum += Math.hypot(u.re[i] - Math.cos(k * x), u.im[i] + Math.sin(k * x));
    count++;
  }
  return sum / count;
}

function padeTable(now: Now): Omit<VerifyTable, 'seconds'> {
  const rows: VerifyRow[] = [];
  for (const p of [3, 4]) {
    const layers = 2, measured = measuredOutletReflection(straightDuct('discrete', layers, p, 16), now), predicted = planeReflection(p, layers), rel = Math.abs(measured - predicted) / predicted;
    rows.push(row(`p = ${p}, ${layers} layers: measured ${e2(measured)}, formula ${e2(predicted)}`, PADE_SOURCE, 'relative difference < 1 %', rel, pct(rel), rel < 0.01));
  }
  return { id: 'pade', title: 'Reflection of discrete layers, measured in a straight duct (16 points/λ) against R = ∏[P_p(z)/P_p(−z)]²', note: 'The interior is fine enough that its own error is far below the reflection compared.', rows };
}

// ---- (c) monopole in free field ----

const MONOPOLE_SOURCE = 'Kinsler, Frey, Coppens & Sanders, Fundamentals of Acoustics, 4th ed. (2000), §7.4';

/** Worst relative error of |p| against ρω|Q|/(4πr) at eight receivers in generic directions, r = 0.55 and 0.75 λ. */
function monopoleError(lowSide: boolean, ppw: number, layers: number, now: Now): number {
  const f = C, omega = 2 * Math.PI * f, Q = 1e-3, L = 0.8, o = lowSide ? L : 0, s = lowSide ? -1 : 1, receivers: RoomModel['receivers'] = [];
  for (const [dx, dy, dz] of [[1, 0.5, 0.2], [0.3, 1, 0.8], [0.7, 0.6, 1], [1, 0.9, 0.1]]) for (const r of [0.55, 0.75]) {
    const n = Math.hypot(dx, dy, dz);
    receivers.push({ name: `r${receivers.length}`, position: [o + (s * r * dx) / n, o + (s * r * dy) / n, o + (s * r * dz) / n] });
  }
  const model: RoomModel = {
    box: { x0: 0, x1: L, y0: 0, y1: L, z0: 0, z1: L }, open: lowSide ? ['-x', '-y', '-z'] : ['+x', '+y', '+z'], surfaces: [],
    // rigid planes through the source are exact by symmetry; an eighth of the volume velocity flows into the octant
    sources: [{ name: 'Q', position: [o, o, o], volumeVelocity: Q / 8 }], receivers,
    soundSpeed: C, density: RHO, order: 4, pointsPerWavelength: ppw, maxFrequencyHz: f, absorber: { kind: 'discrete', layers },
  };
  const r = new RoomProblem(model).solve(f, now);
  let worst = 0;
  r.receivers.forEach((rec, i) => {
    const p = receivers[i].position, dist = Math.hypot(p[0] - o, p[1] - o, p[2] - o), exact = (RHO * omega * Q) / (4 * Math.PI * dist);
    worst = Math.max(worst, Math.abs(Math.hypot(rec.pressure.re, rec.pressure.im) / exact - 1));
  });
  return worst;
}

function monopoleTable(now: Now): Omit<VerifyTable, 'seconds'> {
  const rows: VerifyRow[] = [], reference = 5, eh: Record<number, number> = {};
  for (const ppw of [8, 12]) {
    eh[ppw] = monopoleError(false, ppw, reference, now);
    for (const layers of [1, 2, 3, 4]) {
      const e = monopoleError(false, ppw, layers, now), R = worstReflection(4, chooseLengths(4, layers, DEFAULT_RANGE), DEFAULT_RANGE), bound = eh[ppw] + R;
      rows.push(row(`${ppw} points/λ, ${layers} layer${layers > 1 ? 's' : ''}`, PADE_SOURCE, `≤ e_h + max|R| = ${pct(bound)}`, e, pct(e), e <= bound));
    }
  }
  rows.push(row(`12 points/λ, ${reference} layers: e_h`, `${MONOPOLE_SOURCE}; 2 % acceptance`, '< 2 %', eh[12], pct(eh[12]), eh[12] < 0.02));
  const ratio = eh[8] / eh[12];
  rows.push(row('e_h at 8 / e_h at 12 points/λ', 'Ciarlet (1978): error O(h^{p+1}), (12/8)^5 = 7.6', '≥ 5', ratio, ratio.toFixed(1), ratio >= 5));
  const low = monopoleError(true, 12, 3, now);
  rows.push(row('12 points/λ, 3 layers on the low sides (−x, −y, −z)', MONOPOLE_SOURCE, '< 2 %', low, pct(low), low < 0.02));
  return {
    id: 'monopole', title: 'Monopole in free field, octant with face, edge and corner layers (order 4, λ = 1 m, box 0.8 λ): worst |p|/|p_exact| − 1 at r = 0.55, 0.75 λ',
    note: `e_h: the discretisation error, measured with ${reference} layers; max|R|: the Padé formula's worst reflection over the tuned range (k_x/k ∈ [0.2, 1], κ/k ∈ [0.2, 5]).`, rows,
  };
}

// ---- (d) duct silencers ----

function scenario(json: object): Problem {
  return prepareProblem(readScenario(JSON.stringify({ format: 'quietgrid/1', ...json })).scenario);
}

function ductTl(p: Problem, f: number, now: Now): { tl: number; balance: number } {
  const r = p.solve(f, now);
  if (r.kind !== 'duct' || r.tlDb === null) throw new Error('verify: expected a duct with an anechoic outlet');
  return { tl: r.tlDb, balance: r.energyBalance };
}

function ductTable(now: Now): Omit<VerifyTable, 'seconds'> {
  const rows: VerifyRow[] = [], air = { soundSpeed: C, density: RHO };
  const davis = 'Davis, Stokes, Moore & Stevens, NACA Report 1192 (1954)';
  // area ratio (0.45 × 0.30)/(0.15 × 0.10) = 9, chamber 0.5 m long, chamber cut-on 381 Hz
  const chamber = scenario({
    air, sweep: { fromHz: 50, toHz: 200, spacing: 'third-octave' }, mesh: { order: 4, pointsPerWavelength: 8 },
    duct: { sections: [{ name: 'in', length: 0.5, width: 0.15, height: 0.1 }, { name: 'chamber', length: 0.5, width: 0.45, height: 0.3 }, { name: 'out', length: 0.5, width: 0.15, height: 0.1 }] },
  });
  let chain = 0, balance = 0;
  for (const f of [50, 80, 125, 160, 190]) {
    const r = ductTl(chamber, f, now), theory = expansionChamberTl(9, (2 * Math.PI * f) / C, 0.5), d = Math.abs(r.tl - theory);
    rows.push(row(`expansion chamber m = 9, ${f} Hz: 3D ${db(r.tl)}, theory ${db(theory)}`, davis, '|ΔTL| < 1 dB (below half the cut-on)', d, db(d), d < 1));
    chain = Math.max(chain, Math.abs(chamber.planeWave(f)!.tlDb - theory));
    balance = Math.max(balance, r.balance);
  }
  rows.push(row('expansion chamber: energy balance |1 − (W_r + W_t)/W_i|, worst', 'common practice: a lossless duct conserves power', '< 1e-3', balance, e2(balance), balance < 1e-3));
  rows.push(row('expansion chamber: tl_plane_db (four-pole chain) vs the closed form, worst', `${davis}; Munjal (1987)`, '< 1e-9 dB', chain, e2(chain), chain < 1e-9));
  const L = 0.23, w = 0.08, lo = C / (4 * (L + w)), hi = C / (4 * L);
  const stub = scenario({
    air, sweep: { fromHz: 250, toHz: 400, spacing: 'linear', count: 4 }, mesh: { order: 4, pointsPerWavelength: 8 },
    duct: { sections: [{ name: 'run', length: 1.2, width: 0.2, height: 0.15 }], branches: [{ name: 'stub', section: 'run', at: 0.6, side: '+z', length: L, width: w, height: 0.2, end: 'closed' }] },
  });
  // golden-section search for the TL maximum on a bracket wider than the theory's interval
  const g = (Math.sqrt(5) - 1) / 2, tl = (f: number) => ductTl(stub, f, now).tl;
  let a = 0.8 * lo, b = 1.1 * hi, x1 = b - g * (b - a), x2 = a + g * (b - a), f1 = tl(x1), f2 = tl(x2);
  while (b - a > 0.05) {
    if (f1 > f2) { b = x2; x2 = x1; f2 = f1; x1 = b - g * (b - a); f1 = tl(x1); }
    else { a = x1; x1 = x2; f1 = f2; x2 = a + g * (b - a); f2 = tl(x2); }
  }
  const peak = 0.5 * (a + b), peakTl = tl(peak);
  const munjal = 'Munjal, Acoustics of Ducts and Mufflers (1987): quarter-wave stub, end correction up to the branch width';
  rows.push(row(`closed stub L = ${L} m, w = ${w} m: peak frequency`, munjal, `${lo.toFixed(1)} … ${hi.toFixed(1)} Hz`, peak, `${peak.toFixed(1)} Hz`, peak > lo && peak < hi));
  rows.push(row('closed stub: TL at the peak', munjal, '> 20 dB', peakTl, db(peakTl), peakTl > 20));
  let stubChain = 0;
  for (const f of [250, 300, 350, 400]) {
    const k = (2 * Math.PI * f) / C, closed = closedSideBranchTl(0.2 * 0.15, w * 0.2, k, L);
    stubChain = Math.max(stubChain, Math.abs(stub.planeWave(f)!.tlDb - closed));
  }
  rows.push(row('closed stub: tl_plane_db (four-pole chain) vs the closed form, worst', 'Munjal (1987): shunt four-pole, Y_b = j(S_b/ρc)·tan kL', '< 1e-9 dB', stubChain, e2(stubChain), stubChain < 1e-9));
  const cut = cutOnFrequency(0.45, 0.3, C, 1, 0);
  return { id: 'duct', title: 'Duct silencers through the scenario path (order 4, 8 points/λ)', note: `Chamber cut-on ${cut.toFixed(0)} Hz; the plane-wave checks stay below half of it.`, rows };
}

// ---- (e) porous layer ----

function porousTable(now: Now): Omit<VerifyTable, 'seconds'> {
  const rows: VerifyRow[] = [], a = 0.08, d = 0.05, sigma = 10_000, air = { density: RHO, soundSpeed: C };
  const rect = { y0: 0, y1: a, z0: 0, z1: a };
  for (const model of ['delany-bazley', 'miki'] as PorousModel[]) {
    const media = (f: number): (Medium | null)[] => [null, porousMedium(model, f, sigma, air)];
    const prep = new DuctProblem({
      boxes: [{ x0: 0, x1: 1, y0: 0, y1: a, z0: 0, z1: a }, { x0: 1, x1: 1 + d, y0: 0, y1: a, z0: 0, z1: a }], media,
      openings: [{ side: '-x', rect: { a0: 0, a1: a, b0: 0, b1: a } }],
      inlet: { x: 0, rect, clearTo: 0.8 }, outlet: { x: 1 + d, rect, clearFrom: 1, termination: 'rigid' },
      soundSpeed: C, density: RHO, order: 4, pointsPerWavelength: 12, maxFrequencyHz: 2000, absorber: { kind: 'discrete', layers: 3 }, incident: { mode: [0, 0], amplitude: 1 },
    });
    for (const f of [250, 500, 1000, 2000]) {
      const r = prep.solve(f, now), alpha = normalIncidenceAbsorption(rigidBackedImpedance(porousWave(model, f, sigma, air), d), RHO * C);
      const measured = 1 - r.inletReflection ** 2, diff = Math.abs(measured - alpha);
      rows.push(row(`${model}, ${f} Hz: α = ${alpha.toFixed(4)}, 1 − |R|² = ${measured.toFixed(4)}`, 'Allard & Atalla, Propagation of Sound in Porous Media, 2nd ed. (2009), ch. 2', '|Δα| < 1e-3', diff, e2(diff), diff < 1e-3));
    }
  }
  return {
    id: 'porous', title: `Rigid-backed porous layer (${d * 1000} mm, σ = ${sigma / 1000} kPa·s/m²) closing a duct, normal incidence (order 4, 12 points/λ)`,
    note: 'The layer is an equivalent fluid in the mesh; the reference is Zs = −j·Zc·cot(kc·d) and α = 1 − |(Zs − ρc)/(Zs + ρc)|².', rows,
  };
}

export const VERIFY_GROUPS: { id: VerifyGroupId; run: (now: Now) => Omit<VerifyTable, 'seconds'> }[] = [
  { id: 'outgoing', run: outgoingTable },
  { id: 'pade', run: padeTable },
  { id: 'monopole', run: monopoleTable },
  { id: 'duct', run: ductTable },
  { id: 'porous', run: porousTable },
];

export const VERIFY_GROUP_IDS: VerifyGroupId[] = VERIFY_GROUPS.map((g) => g.id);

/** Runs the named groups in order (all by default); `onTable` sees each table as it is done. */
export function runVerify(now: Now, ids: readonly VerifyGroupId[] = VERIFY_GROUP_IDS, onTable?: (t: VerifyTable) => void): VerifyReport {
  const start = now(), tables: VerifyTable[] = [];
  for (const g of VERIFY_GROUPS) {
    if (!ids.includes(g.id)) continue;
    const t0 = now(), table = { ...g.run(now), seconds: (now() - t0) / 1000 };
    tables.push(table);
    onTable?.(table);
  }
  return { pass: tables.every((t) => t.rows.every((r) => r.pass)), tables, seconds: (now() - start) / 1000 };
}

/**
 * The plane-wave (one-dimensional) estimate of a duct's transmission loss, beside the 3D result: the
 * sections as a chain of four-poles, each side branch a shunt at its centre, Munjal, Acoustics of Ducts and
 * Mufflers (1987). Offsets do not enter plane-wave theory: only lengths and areas do. An open branch end
 * carries absorbing layers in the 3D model, i.e. an anechoic continuation, which is the chain's 'open' end.
 *
 * Valid below the lowest first cut-on of every cross-section (Morse & Ingard, Theoretical Acoustics, 1968):
 * above it the higher modes carry power that the chain ignores.
 */
import { firstCutOn, planeWaveTl, type Chain, type ChainElement } from '../acoustics/index.ts';
import { lower, upper, type Axis, type Box, type Side } from '../core/space.ts';
import type { PlaneWaveEstimate } from './problem.ts';

/** A duct's parts as laid out along x: what the chain and the cut-on list are built from. */
export interface DuctLayout {
  sections: readonly { name: string; x0: number; x1: number; width: number; height: number }[];
  /** Side branches: the wall they stand on (±y, ±z), their end, and their box. */
  branches: readonly { name: string; section: string; side: Side; end: 'open' | 'closed'; box: Box }[];
}

/** The branch's length along its own axis and its cross-section normal to that axis. */
export function branchShape(box: Box, side: Side): { length: number; a: number; b: number } {
  const axis = side[1] as Axis, other: Axis = axis === 'y' ? 'z' : 'y', extent = (d: Axis) => upper(box, d) - lower(box, d);
  return { length: extent(axis), a: extent('x'), b: extent(other) };
}

/** Inlet to outlet: a duct element per straight piece, a shunt per branch at its centre line. */
export function planeWaveChain(layout: DuctLayout): Chain {
  const chain: ChainElement[] = [];
  for (const s of layout.sections) {
    const area = s.width * s.height;
    const here = layout.branches
      .filter((b) => b.section === s.name)
      .map((b) => ({ b, x: 0.5 * (b.box.x0 + b.box.x1) }))
      .sort((u, v) => u.x - v.x);
    let x = s.x0;
    for (const { b, x: xb } of here) {
      if (xb > x) chain.push({ kind: 'duct', length: xb - x, area });
      x = Math.max(x, xb);
      const shape = branchShape(b.box, b.side);
      chain.push({ kind: 'branch', area: shape.a * shape.b, length: shape.length, end: b.end === 'open' ? 'open' : 'closed' });
    }
    if (s.x1 > x) chain.push({ kind: 'duct', length: s.x1 - x, area });
  }
  return chain;
}

/** The smallest first cut-on of every section and branch cross-section, Hz. */
export function planeWaveValidBelowHz(layout: DuctLayout, soundSpeed: number): number {
  const sections = layout.sections.map((s) => firstCutOn(s.width, s.height, soundSpeed));
  const branches = layout.branches.map((b) => { const s = branchShape(b.box, b.side); return firstCutOn(s.a, s.b, soundSpeed); });
  return Math.min(...sections, ...branches);
}

/**
 * A duct's plane-wave model: its chain, or why it has none; and the lowest first cut-on of its cross-sections,
 * known (and reported) for any laid-out duct, a chain or not.
 */
export type PlaneWaveModel = { chain: Chain; validBelowHz: number; unavailable: null } | { chain: null; validBelowHz: number | null; unavailable: string };

export function planeWaveModel(layout: DuctLayout | undefined, why: string | null, soundSpeed: number): PlaneWaveModel {
  if (!layout) return { chain: null, validBelowHz: null, unavailable: why ?? 'the duct has no section layout' };
  const validBelowHz = planeWaveValidBelowHz(layout, soundSpeed);
  return why !== null ? { chain: null, validBelowHz, unavailable: why } : { chain: planeWaveChain(layout), validBelowHz, unavailable: null };
}

/** TL of the chain at one frequency, or null without a chain. */
export function planeWaveAt(model: PlaneWaveModel, frequencyHz: number, air: { soundSpeed: number; density: number }): PlaneWaveEstimate | null {
  if (model.chain === null) return null;
  const tlDb = planeWaveTl(model.chain, { frequencyHz, air });
  return { frequencyHz, tlDb, validBelowHz: model.validBelowHz, valid: frequencyHz < model.validBelowHz };
}

/**
 * The plane-wave (one-dimensional) estimate of a duct scenario's transmission loss, beside the 3D result:
 * the sections as a chain of four-poles, each side branch a shunt at its centre, Munjal, Acoustics of Ducts
 * and Mufflers (1987). Offsets do not enter plane-wave theory: only lengths and areas do. An open branch end
 * carries absorbing layers in the 3D model, i.e. an anechoic continuation, which is the chain's 'open' end.
 *
 * Valid below the lowest first cut-on of every cross-section (Morse & Ingard, Theoretical Acoustics, 1968):
 * above it the higher modes carry power that the chain ignores.
 */
import { firstCutOn, planeWaveTl, type Chain, type ChainElement } from '../acoustics/index.ts';
import type { Box } from '../core/space.ts';
import type { Prepared } from './scenario.ts';

export interface PlaneWaveEstimate {
  frequencyHz: number;
  tlDb: number;
  /** The smallest first cut-on of all sections and branches, Hz. */
  validBelowHz: number;
  valid: boolean;
}

/** Why a scenario has no plane-wave estimate, or null when it has one. */
export function planeWaveUnavailable(p: Prepared): string | null {
  if (p.kind !== 'duct') return 'a room has no plane-wave chain';
  const s = p.scenario;
  if (s.kind !== 'duct') return 'a room has no plane-wave chain';
  if (s.duct.outlet !== 'anechoic') return 'the outlet is closed: there is no transmitted power';
  if (s.linings.length > 0) return 'the duct is lined: the four-pole chain here has no lining model';
  if (s.duct.incident.mode[0] !== 0 || s.duct.incident.mode[1] !== 0) return 'the incident wave is a higher mode, not the plane wave';
  return null;
}

function extent(b: Box, axis: 'x' | 'y' | 'z'): number {
  return axis === 'x' ? b.x1 - b.x0 : axis === 'y' ? b.y1 - b.y0 : b.z1 - b.z0;
}

/** The branch's length along its own axis and its cross-section normal to that axis. */
function branchShape(box: Box, side: string): { length: number; a: number; b: number } {
  const axis = side[1] as 'y' | 'z', other = axis === 'y' ? 'z' : 'y';
  return { length: extent(box, axis), a: extent(box, 'x'), b: extent(box, other) };
}

/** Inlet to outlet: a duct element per straight piece, a shunt per branch at its centre line. */
export function planeWaveChain(p: Prepared): Chain | null {
  if (planeWaveUnavailable(p) !== null) return null;
  const d = p.geometry.duct!, chain: ChainElement[] = [];
  for (const s of d.sections) {
    const area = s.width * s.height;
    const here = d.branches
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

/** The smallest first cut-on of every section and branch cross-section, Hz (null for a room). */
export function planeWaveValidBelowHz(p: Prepared): number | null {
  if (p.kind !== 'duct') return null;
  const c = p.scenario.air.soundSpeed, d = p.geometry.duct!;
  const sections = d.sections.map((s) => firstCutOn(s.width, s.height, c));
  const branches = d.branches.map((b) => { const s = branchShape(b.box, b.side); return firstCutOn(s.a, s.b, c); });
  return Math.min(...sections, ...branches);
}

/** TL of the four-pole chain at one frequency, or null where plane-wave theory has no answer (see planeWaveUnavailable). */
export function planeWaveEstimate(p: Prepared, frequencyHz: number): PlaneWaveEstimate | null {
  const chain = planeWaveChain(p);
  if (chain === null) return null;
  const validBelowHz = planeWaveValidBelowHz(p)!;
  const tlDb = planeWaveTl(chain, { frequencyHz, air: { soundSpeed: p.scenario.air.soundSpeed, density: p.scenario.air.density } });
  return { frequencyHz, tlDb, validBelowHz, valid: frequencyHz < validBelowHz };
}

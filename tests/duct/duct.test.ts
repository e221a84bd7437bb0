/** Duct transmission loss through the scenario path, against plane-wave theory where it holds. */
import { describe, expect, it } from 'vitest';
import { expansionChamberTl, cutOnFrequency } from '../../engine/acoustics/index.ts';
import { duct, prepare } from './helpers.ts';
import { typedArrayBytes } from '../../engine/solve/size.ts';

const air = { soundSpeed: 343, density: 1.2 };

describe('straight uniform duct', () => {
  const p = prepare({ air, sweep: { fromHz: 50, toHz: 1000, spacing: 'octave' }, duct: { sections: [{ name: 'run', length: 1.5, width: 0.2, height: 0.15 }] } });
  it('|TL| < 0.05 dB and inlet reflection < 1e-3 below cut-on, with the default mesh', () => {
    const cutOn = cutOnFrequency(0.2, 0.15, 343, 1, 0); // 857.5 Hz
    for (const f of [63, 125, 250, 500, 800]) {
      expect(f).toBeLessThan(cutOn);
      const r = duct(p, f);
      // common practice: a uniform rigid duct with anechoic ends transmits all incident power
      expect(Math.abs(r.tlDb!)).toBeLessThan(0.05);
      expect(r.inletReflection).toBeLessThan(1e-3);
      // Source: Chung & Blaser, JASA 68 (1980) / ASTM E2611 — the decomposition and the intensity agree below cut-on
      expect(Math.abs(r.tlDecompositionDb! - r.tlDb!)).toBeLessThan(0.05);
    }
  });
  it('still small above cut-on (1 kHz, modes (1,0) propagating)', () => {
    const r = duct(p, 1000);
    expect(r.tlDecompositionDb).toBeNull();
    expect(Math.abs(r.tlDb!)).toBeLessThan(0.1);
    expect(r.inletReflection).toBeLessThan(1e-2);
  });
});

describe('simple expansion chamber', () => {
  // area ratio m = (0.45 × 0.30)/(0.15 × 0.10) = 9, chamber length 0.5 m; chamber cut-on c/(2·0.45) = 381 Hz
  const p = prepare({
    air, sweep: { fromHz: 50, toHz: 200, spacing: 'third-octave' }, mesh: { order: 4, pointsPerWavelength: 8 },
    duct: { sections: [{ name: 'in', length: 0.5, width: 0.15, height: 0.1 }, { name: 'chamber', length: 0.5, width: 0.45, height: 0.3 }, { name: 'out', length: 0.5, width: 0.15, height: 0.1 }] },
  });
  it('TL within 1 dB of plane-wave theory below half the chamber cut-on', () => {
    const half = cutOnFrequency(0.45, 0.3, 343, 1, 0) / 2;
    for (const f of [50, 80, 125, 160, 190]) {
      expect(f).toBeLessThan(half);
      const r = duct(p, f), theory = expansionChamberTl(9, (2 * Math.PI * f) / 343, 0.5);
      console.log(`${f} Hz: TL ${r.tlDb!.toFixed(2)} dB, plane-wave theory ${theory.toFixed(2)} dB`);
      // Source: Davis, Stokes, Moore & Stevens, NACA Report 1192 (1954): TL = 10 log10[1 + ¼(m − 1/m)² sin²(kL)]
      expect(Math.abs(r.tlDb! - theory)).toBeLessThan(1);
      // common practice: a lossless scenario conserves power
      expect(r.energyBalance).toBeLessThan(1e-3);
    }
  });
});

describe('closed side stub', () => {
  const L = 0.23, w = 0.08;
  const p = prepare({
    air, sweep: { fromHz: 250, toHz: 400, spacing: 'linear', count: 4 }, mesh: { order: 4, pointsPerWavelength: 8 },
    duct: { sections: [{ name: 'run', length: 1.2, width: 0.2, height: 0.15 }], branches: [{ name: 'stub', section: 'run', at: 0.6, side: '+z', length: L, width: w, height: 0.2, end: 'closed' }] },
  });
  it('peaks between c/(4(L + w)) and c/(4L), above 20 dB', () => {
    const lo = 343 / (4 * (L + w)), hi = 343 / (4 * L);
    // golden-section search for the TL maximum on a bracket wider than the theory's interval
    let a = 0.8 * lo, b = 1.1 * hi;
    const g = (Math.sqrt(5) - 1) / 2, tl = (f: number) => duct(p, f).tlDb!;
    let x1 = b - g * (b - a), x2 = a + g * (b - a), f1 = tl(x1), f2 = tl(x2);
    while (b - a > 0.05) {
      if (f1 > f2) { b = x2; x2 = x1; f2 = f1; x1 = b - g * (b - a); f1 = tl(x1); }
      else { a = x1; x1 = x2; f1 = f2; x2 = a + g * (b - a); f2 = tl(x2); }
    }
    const peak = 0.5 * (a + b), peakTl = tl(peak);
    console.log(`stub peak ${peak.toFixed(2)} Hz (${lo.toFixed(1)} … ${hi.toFixed(1)}), TL ${peakTl.toFixed(1)} dB`);
    // Source: Munjal, Acoustics of Ducts and Mufflers (1987), quarter-wave side-branch resonator with an end correction of up to the branch width
    expect(peak).toBeGreaterThan(lo);
    expect(peak).toBeLessThan(hi);
    expect(peakTl).toBeGreaterThan(20);
  });
});

describe('a sweep in kept memory', () => {
  const scenario = { air, sweep: { fromHz: 100, toHz: 400, spacing: 'octave' }, duct: { sections: [{ name: 'in', length: 0.4, width: 0.15, height: 0.1 }, { name: 'chamber', length: 0.3, width: 0.3, height: 0.2 }, { name: 'out', length: 0.4, width: 0.15, height: 0.1 }] } };
  it('gives at every frequency the same bits as a problem prepared afresh for that frequency alone', () => {
    const kept = prepare(scenario); // its matrix values and factor memory are reused from one frequency to the next
    for (const f of [400, 100, 250]) {
      const a = duct(kept, f), b = duct(prepare(scenario), f);
      // common practice: the same arithmetic on the same numbers, whatever the reused arrays held before
      expect([a.tlDb, a.inletReflection, a.energyBalance]).toEqual([b.tlDb, b.inletReflection, b.energyBalance]);
    }
  });
});

describe('the memory a worker holds', () => {
  it('is what MeshInfo.workerMemoryBytes counts: after a solve, the prepared problem, the kept matrix values and factor memory, to the byte, with the solve vectors on top', () => {
    const p = prepare({ air, sweep: { fromHz: 100, toHz: 400, spacing: 'octave' }, duct: { sections: [{ name: 'in', length: 0.4, width: 0.15, height: 0.1 }, { name: 'chamber', length: 0.3, width: 0.3, height: 0.2 }, { name: 'out', length: 0.4, width: 0.15, height: 0.1 }] } });
    const before = typedArrayBytes(p);
    duct(p, 250);
    const held = typedArrayBytes(p), { dofs, nnz, memoryEstimateBytes, workerMemoryBytes } = p.info;
    // the factor's memory and the matrix values are what a sweep adds to the prepared problem; the solve's vectors come and go
    expect(held - before).toBe(memoryEstimateBytes + 16 * nnz);
    expect(workerMemoryBytes - held).toBe(8 * 16 * dofs);
  });
});

import { describe, expect, it } from 'vitest';
import {
  airProperties,
  areaChangeTl,
  chainFourPole,
  closedSideBranchTl,
  expansionChamberTl,
  fourPoleDeterminant,
  inletImpedance,
  inletReflection,
  planeWaveTl,
  planeWaveTransmission,
  type Chain,
} from '../../engine/acoustics/index.ts';

const air = airProperties({ temperatureC: 20 });
const c = air.soundSpeed;
const rhoC = air.impedance;
const waveNumber = (f: number) => (2 * Math.PI * f) / c;
const frequencyFor = (k: number) => (k * c) / (2 * Math.PI);
const FREQS = Array.from({ length: 60 }, (_, i) => 10 + 33.7 * i);

const S = 0.01;

describe('four-pole chains', () => {
  it('gives zero TL for a uniform duct of any length', () => {
    for (const length of [0, 0.37, 2.5]) {
      for (const f of FREQS) {
        // common practice: a lossless uniform duct between anechoic ends transmits all incident power
        expect(Math.abs(planeWaveTl([{ kind: 'duct', length, area: S }], { frequencyHz: f, air }))).toBeLessThan(1e-12);
      }
    }
  });

  it('reproduces the single expansion chamber formula', () => {
    const m = 9;
    const L = 0.5;
    const chain: Chain = [
      { kind: 'duct', length: 0.3, area: S },
      { kind: 'duct', length: L, area: m * S },
      { kind: 'duct', length: 0.7, area: S },
    ];
    for (const f of FREQS) {
      const tl = planeWaveTl(chain, { frequencyHz: f, air });
      // Source: Davis, Stokes, Moore & Stevens, NACA Report 1192 (1954): TL = 10·log10[1 + ¼(m − 1/m)²·sin²(kL)]
      expect(Math.abs(tl - expansionChamberTl(m, waveNumber(f), L))).toBeLessThan(1e-9);
    }
  });

  it('gives the complex transmission ratio p_t/p_i whose power ratio is the TL', () => {
    const chain: Chain = [
      { kind: 'duct', length: 0.3, area: S },
      { kind: 'branch', area: 0.5 * S, length: 0.4, end: 'closed' },
      { kind: 'duct', length: 0.5, area: 4 * S },
      { kind: 'duct', length: 0.3, area: 2 * S },
    ];
    for (const f of FREQS) {
      const t = planeWaveTransmission(chain, { frequencyHz: f, air });
      // common practice: τ = |p_t/p_i|²·S_o/S_i for plane waves between anechoic pipes (Munjal, Acoustics of Ducts and Mufflers, 1987)
      expect(-10 * Math.log10((t.re ** 2 + t.im ** 2) * 2)).toBeCloseTo(planeWaveTl(chain, { frequencyHz: f, air }), 9);
      const pipe = planeWaveTransmission([{ kind: 'duct', length: 0.37, area: S }], { frequencyHz: f, air });
      // common practice: a uniform lossless duct only delays the wave, p_t/p_i = e^{−jkL} (e^{+jωt})
      expect(Math.hypot(pipe.re - Math.cos(waveNumber(f) * 0.37), pipe.im + Math.sin(waveNumber(f) * 0.37))).toBeLessThan(1e-12);
    }
  });

  it('is reciprocal: det T = 1 for any chain', () => {
    const chain: Chain = [
      { kind: 'duct', length: 0.2, area: S },
      { kind: 'branch', area: 0.3 * S, length: 0.4, end: 'closed', endCorrection: 0.01 },
      { kind: 'duct', length: 0.5, area: 4 * S },
      { kind: 'branch', area: S, length: 0.1, end: 'open' },
      { kind: 'branch', area: 0.5 * S, length: 0.25, end: 'pressure-release' },
      { kind: 'duct', length: 0.3, area: 2 * S },
    ];
    for (const f of FREQS) {
      const det = fourPoleDeterminant(chainFourPole(chain, waveNumber(f), rhoC));
      // Source: Munjal, Acoustics of Ducts and Mufflers (1987): the four-pole determinant of a reciprocal system is unity
      expect(Math.hypot(det.re - 1, det.im)).toBeLessThan(1e-9);
    }
  });

  it('gives the area-change TL for a sudden step', () => {
    const chain: Chain = [
      { kind: 'duct', length: 0.4, area: S },
      { kind: 'duct', length: 0.6, area: 5 * S },
    ];
    for (const f of [50, 400, 1200]) {
      // Source: Kinsler, Frey, Coppens & Sanders, Fundamentals of Acoustics, 4th ed. (2000), power transmission at a change in area, 4S₁S₂/(S₁ + S₂)²
      expect(planeWaveTl(chain, { frequencyHz: f, air })).toBeCloseTo(areaChangeTl(S, 5 * S), 9);
      const r = inletReflection(chain, { frequencyHz: f, air, termination: 'anechoic' });
      const phase = 2 * waveNumber(f) * 0.4;
      // Source: as above, pressure reflection (S₁ − S₂)/(S₁ + S₂) at the step, brought back to the inlet by e^{−2jkL}
      expect(r.re).toBeCloseTo((-4 / 6) * Math.cos(phase), 9);
      expect(r.im).toBeCloseTo((4 / 6) * Math.sin(phase), 9);
    }
  });
});

describe('side branches', () => {
  const Lb = 0.25;
  const Sb = 0.5 * S;
  const stub = (length = Lb, end: 'closed' | 'open' | 'pressure-release' = 'closed', endCorrection?: number): Chain => [
    { kind: 'duct', length: 0.4, area: S },
    { kind: 'branch', area: Sb, length, end, endCorrection },
    { kind: 'duct', length: 0.9, area: S },
  ];

  it('blocks all transmission when a closed stub is a quarter wavelength long, and none at half a wavelength', () => {
    const quarter = planeWaveTl(stub(), { frequencyHz: frequencyFor(Math.PI / 2 / Lb), air });
    // Source: Kinsler et al., Fundamentals of Acoustics, 4th ed. (2000), side branch: Y_b → ∞ at kL_b = π/2 (tan(π/2) is ~1.6e16 in floating point)
    expect(quarter).toBeGreaterThan(200);
    const half = planeWaveTl(stub(), { frequencyHz: frequencyFor(Math.PI / Lb), air });
    // Source: as above, Y_b = 0 at kL_b = π
    expect(Math.abs(half)).toBeLessThan(1e-9);
  });

  it('follows TL = 10·log10[1 + ((S_b/(2S))·tan kL_b)²] for a closed stub on a uniform duct', () => {
    for (const f of FREQS) {
      // Source: Munjal, Acoustics of Ducts and Mufflers (1987), shunt element between anechoic pipes; derived in planewaveClosedForms.ts
      expect(planeWaveTl(stub(), { frequencyHz: f, air })).toBeCloseTo(closedSideBranchTl(S, Sb, waveNumber(f), Lb), 8);
    }
  });

  it('treats an end correction as extra branch length', () => {
    for (const f of [100, 250, 500]) {
      const withCorrection = planeWaveTl(stub(Lb, 'closed', 0.02), { frequencyHz: f, air });
      expect(withCorrection).toBeCloseTo(planeWaveTl(stub(Lb + 0.02), { frequencyHz: f, air }), 12);
    }
  });

  it('gives a frequency-independent TL 20·log10(1 + S_b/(2S)) for an anechoic branch', () => {
    for (const f of [60, 600, 1500]) {
      // Source: Munjal (1987), shunt admittance S_b/ρc between anechoic pipes: A/p₂ = 1 + S_b/(2S)
      expect(planeWaveTl(stub(Lb, 'open'), { frequencyHz: f, air })).toBeCloseTo(20 * Math.log10(1 + Sb / (2 * S)), 12);
    }
  });

  it('makes a pressure-release branch block at half a wavelength and pass at a quarter', () => {
    const half = planeWaveTl(stub(Lb, 'pressure-release'), { frequencyHz: frequencyFor(Math.PI / Lb), air });
    // Source: Kinsler et al. (2000), open-ended branch: Y_b = −j(S_b/ρc)·cot kL_b is infinite at kL_b = π
    expect(half).toBeGreaterThan(200);
    const quarter = planeWaveTl(stub(Lb, 'pressure-release'), { frequencyHz: frequencyFor(Math.PI / 2 / Lb), air });
    // Source: as above, Y_b = 0 at kL_b = π/2
    expect(Math.abs(quarter)).toBeLessThan(1e-9);
  });
});

describe('inlet reflection', () => {
  it('vanishes for a uniform duct with an anechoic end', () => {
    const r = inletReflection([{ kind: 'duct', length: 0.8, area: S }], { frequencyHz: 300, air, termination: 'anechoic' });
    // common practice: no impedance change, no reflection
    expect(Math.hypot(r.re, r.im)).toBeLessThan(1e-12);
    const z = inletImpedance([{ kind: 'duct', length: 0.8, area: S }], { frequencyHz: 300, air });
    expect(z.re).toBeCloseTo(rhoC / S, 6);
    expect(Math.abs(z.im)).toBeLessThan(1e-6);
  });

  it('is e^{−2jkL} for a duct closed rigidly at length L', () => {
    const L = 0.63;
    for (const f of [40, 275, 980]) {
      const r = inletReflection([{ kind: 'duct', length: L, area: S }], { frequencyHz: f, air, termination: 'rigid' });
      const phase = 2 * waveNumber(f) * L;
      // Source: Kinsler et al. (2000), rigidly terminated tube: p = A e^{−jkx} + B e^{jkx} with u(L) = 0 gives B/A = e^{−2jkL}
      expect(r.re).toBeCloseTo(Math.cos(phase), 12);
      expect(r.im).toBeCloseTo(-Math.sin(phase), 12);
    }
  });

  it('has unit modulus for any lossless chain with a rigid end', () => {
    const chain: Chain = [
      { kind: 'duct', length: 0.2, area: S },
      { kind: 'branch', area: 0.3 * S, length: 0.4, end: 'closed' },
      { kind: 'duct', length: 0.5, area: 4 * S },
      { kind: 'duct', length: 0.3, area: S },
    ];
    for (const f of FREQS) {
      const r = inletReflection(chain, { frequencyHz: f, air, termination: 'rigid' });
      // common practice: a lossless system with a rigid end reflects all incident power
      expect(Math.hypot(r.re, r.im)).toBeCloseTo(1, 9);
    }
  });

  it('needs areas for a chain without ducts', () => {
    const branchOnly: Chain = [{ kind: 'branch', area: 0.5 * S, length: 0.2, end: 'closed' }];
    expect(() => planeWaveTl(branchOnly, { frequencyHz: 100, air })).toThrow(RangeError);
    const tl = planeWaveTl(branchOnly, { frequencyHz: 100, air, inletArea: S, outletArea: S });
    expect(tl).toBeCloseTo(closedSideBranchTl(S, 0.5 * S, waveNumber(100), 0.2), 12);
  });
});

describe('closed forms', () => {
  it('peak the expansion chamber TL at 20·log10((m + 1/m)/2) where kL = π/2, zero at kL = π', () => {
    // Source: Davis et al., NACA Report 1192 (1954): 1 + ¼(m − 1/m)² = ¼(m + 1/m)², maximum at sin kL = 1
    expect(expansionChamberTl(16, Math.PI / 2, 1)).toBeCloseTo(20 * Math.log10((16 + 1 / 16) / 2), 12);
    // Source: as above, pass bands at kL = nπ
    expect(expansionChamberTl(16, Math.PI, 1)).toBeCloseTo(0, 12);
    expect(expansionChamberTl(1, 0.7, 1)).toBe(0);
  });
});

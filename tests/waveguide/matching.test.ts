/** Ducts of uniform sections solved by mode matching, with no 3D mesh, against closed forms and the 3D solver. */
import { describe, expect, it } from 'vitest';
import { prepareWaveguide, solveWaveguideAt, type WaveguideDuct, type WaveguideSection } from '../../engine/waveguide/duct.ts';
import { linedChannelWavenumber } from '../../engine/waveguide/lined-dispersion.ts';
import { equivalentFluid, expansionChamberTl, porousWave } from '../../engine/acoustics/index.ts';
import { duct as solve3d, prepare as prepare3d } from '../duct/helpers.ts';

const air = { density: 1.2, soundSpeed: 343 };
const box = (y0: number, y1: number, z0: number, z1: number) => ({ y0, y1, z0, z1 });
const plain = (name: string, length: number, outer: ReturnType<typeof box>): WaveguideSection => ({ name, length, outer, fills: [] });

function waveguide(sections: WaveguideSection[], extra: Partial<WaveguideDuct> = {}): WaveguideDuct {
  return { sections, air, termination: 'anechoic', order: 6, pointsPerWavelength: 10, maxFrequencyHz: 1000, incidence: { kind: 'mode', index: 0 }, ...extra };
}

describe('expansion chamber below cut-on', () => {
  // 0.1 × 0.1 m pipes into a 0.3 × 0.1 m chamber 0.5 m long (area ratio 3), the same height: z-separated
  const pipe = box(0.1, 0.2, 0, 0.1), chamber = box(0, 0.3, 0, 0.1);
  const sections = [plain('in', 0.2, pipe), plain('chamber', 0.5, chamber), plain('out', 0.2, pipe)];
  const half = air.soundSpeed / (2 * 0.3) / 2;

  it('is within 1 dB of plane-wave theory below half the chamber cut-on, lossless to 1e-3', () => {
    const prep = prepareWaveguide(waveguide(sections, { maxFrequencyHz: 300 }));
    expect(prep.layout).toBe('z-separated');
    for (const f of [100, 180, 250]) {
      const r = solveWaveguideAt(prep, f), theory = expansionChamberTl(3, (2 * Math.PI * f) / air.soundSpeed, 0.5);
      console.log(`${f} Hz: TL ${r.tlDb!.toFixed(3)} dB, plane-wave theory ${theory.toFixed(3)} dB, balance ${r.energyBalance.toExponential(1)}, truncation ${r.truncationDb.toFixed(4)} dB`);
      expect(f).toBeLessThan(half);
      // Source: Davis, Stokes, Moore & Stevens, NACA Report 1192 (1954): TL = 10 log10[1 + ¼(m − 1/m)² sin²(kL)]
      expect(Math.abs(r.tlDb! - theory)).toBeLessThan(1);
      // common practice: rigid walls and air dissipate nothing, so W_r + W_t = W_i
      expect(r.energyBalance).toBeLessThan(1e-3);
    }
  });

  it('gives the same TL with 2D cross-section grids as with the z-separated 1D ones', () => {
    const sep = prepareWaveguide(waveguide(sections, { maxFrequencyHz: 700 })), full = prepareWaveguide(waveguide(sections, { maxFrequencyHz: 700, layout: '2d' }));
    expect(full.layout).toBe('2d');
    for (const f of [250, 650]) {
      const a = solveWaveguideAt(sep, f), b = solveWaveguideAt(full, f);
      console.log(`${f} Hz: z-separated ${a.tlDb!.toFixed(4)} dB (${a.channels} z-orders), 2D ${b.tlDb!.toFixed(4)} dB`);
      // common practice: separation of variables is exact for sections uniform in z, so both discretisations converge to one answer
      expect(Math.abs(a.tlDb! - b.tlDb!)).toBeLessThan(0.01);
    }
  });
});

describe('offset chamber above cut-on', () => {
  it('matches the 3D finite-element solution within 0.1 dB', () => {
    // ports 0.1 × 0.1 m, one 0.12 m off the axis and one 0.05 m the other way, chamber 0.4 × 0.1 m (first cut-on 429 Hz), 0.3 m long
    const frequencies = [500, 800, 950];
    const fe = prepare3d({
      air: { soundSpeed: air.soundSpeed, density: air.density }, sweep: { frequenciesHz: frequencies }, mesh: { order: 4, pointsPerWavelength: 10 },
      duct: { sections: [{ name: 'in', length: 0.3, width: 0.1, height: 0.1, offsetY: 0.12 }, { name: 'ch', length: 0.3, width: 0.4, height: 0.1 }, { name: 'out', length: 0.3, width: 0.1, height: 0.1, offsetY: -0.05 }] },
    });
    const wg = prepareWaveguide(waveguide([plain('in', 0.3, box(0.07, 0.17, -0.05, 0.05)), plain('ch', 0.3, box(-0.2, 0.2, -0.05, 0.05)), plain('out', 0.3, box(-0.1, 0, -0.05, 0.05))]));
    for (const f of frequencies) {
      const a = solve3d(fe, f).tlDb!, b = solveWaveguideAt(wg, f);
      console.log(`${f} Hz: 3D ${a.toFixed(3)} dB, waveguide ${b.tlDb!.toFixed(3)} dB, truncation ${b.truncationDb.toFixed(3)} dB, modes ${b.sections.map((s) => s.modes).join('/')}`);
      // common practice: two discretisations of one boundary-value problem (3D FE with absorbing layers; modes with mode matching) converge to one TL
      expect(Math.abs(a - b.tlDb!)).toBeLessThan(0.1);
      expect(b.energyBalance).toBeLessThan(1e-3);
    }
  });
});

describe('equal-power incidence', () => {
  it('an empty straight duct gives TL 0 within 0.05 dB above several cut-ons', () => {
    const d = box(0, 0.3, 0, 0.2), sections = [plain('a', 0.4, d), plain('b', 1, d), plain('c', 0.4, d)];
    for (const [layout, f] of [['auto', 2500], ['2d', 1500]] as const) {
      const r = solveWaveguideAt(prepareWaveguide(waveguide(sections, { incidence: { kind: 'equal-power' }, layout, maxFrequencyHz: f })), f);
      console.log(`${layout} at ${f} Hz: ${r.incidentModes} incident modes, TL ${r.tlDb!.toExponential(2)} dB`);
      // common practice: the first cut-on of a 0.3 m duct is c/(2·0.3) = 572 Hz; several modes propagate here
      expect(r.incidentModes).toBeGreaterThan(5);
      // common practice: a uniform rigid duct with an anechoic end transmits all the power of every propagating mode
      expect(Math.abs(r.tlDb!)).toBeLessThan(0.05);
      expect(r.energyBalance).toBeLessThan(1e-3);
    }
  });

  it('gives the power-weighted TL of the single modes, and each mode conserves energy in a lossless chamber', () => {
    const sections = [plain('in', 0.2, box(0.1, 0.2, 0, 0.1)), plain('chamber', 0.5, box(0, 0.3, 0, 0.1)), plain('out', 0.2, box(0.1, 0.2, 0, 0.1))];
    const f = 2600, eq = solveWaveguideAt(prepareWaveguide(waveguide(sections, { incidence: { kind: 'equal-power' }, maxFrequencyHz: f })), f);
    let transmitted = 0;
    for (let i = 0; i < eq.incidentModes; i++) {
      const one = solveWaveguideAt(prepareWaveguide(waveguide(sections, { incidence: { kind: 'mode', index: i }, maxFrequencyHz: f })), f);
      transmitted += one.transmittedPower;
      // common practice: rigid walls dissipate nothing
      expect(one.energyBalance).toBeLessThan(1e-3);
    }
    console.log(`${f} Hz: ${eq.incidentModes} incident modes, equal-power TL ${eq.tlDb!.toFixed(3)} dB`);
    // common practice: incoherent (random-phase) modes add in power: TL = 10 log10(Σ W_i / Σ W_t)
    expect(Math.abs(eq.tlDb! - 10 * Math.log10(eq.incidentModes / transmitted))).toBeLessThan(1e-9);
  });
});

describe('lined run', () => {
  it('attenuates per metre as its least attenuated mode, within 1 %', () => {
    const h = 0.05, d = 0.05, sigma = 10_000, f = 500, omega = 2 * Math.PI * f, k = omega / air.soundSpeed;
    const outer = box(0, 2 * (h + d), 0, 0.1);
    const lined = (length: number): WaveguideSection => ({ name: 'lined', length, outer, fills: [
      { rect: box(0, d, 0, 0.1), material: { model: 'miki', flowResistivity: sigma } },
      { rect: box(2 * h + d, 2 * (h + d), 0, 0.1), material: { model: 'miki', flowResistivity: sigma } }] });
    const tl = (L: number) => solveWaveguideAt(prepareWaveguide(waveguide([plain('in', 0.2, outer), lined(L), plain('out', 0.2, outer)], { maxFrequencyHz: f })), f);
    const a = tl(1), b = tl(2);
    const wave = porousWave('miki', f, sigma, air);
    const exact = linedChannelWavenumber({ halfWidth: h, thickness: d, airDensity: air.density, k, porousDensity: equivalentFluid(wave, omega).density, porousWavenumber: wave.kc });
    const perMetre = b.tlDb! - a.tlDb!, theory = (20 / Math.LN10) * -exact.kx.im;
    console.log(`${f} Hz: TL ${a.tlDb!.toFixed(3)} dB (1 m), ${b.tlDb!.toFixed(3)} dB (2 m): ${perMetre.toFixed(4)} dB/m; least attenuated mode ${theory.toFixed(4)} dB/m`);
    // Source: Scott, Proc. Phys. Soc. 58 (1946); Morse & Ingard, Theoretical Acoustics (1968): far from the ends a lined run decays as its least attenuated mode, 20 log10(e)·|Im k_x| dB/m
    expect(Math.abs(perMetre - theory) / theory).toBeLessThan(0.01);
    // the section report carries the same figure
    expect(Math.abs(b.sections[1].leastAttenuationDbPerM - theory) / theory).toBeLessThan(1e-6);
  });
});

describe('the truncation check and long sections', () => {
  it('reports n and about 1.5 n modes per section, stays finite over 30 m with evanescent modes, and a rigid end reflects all', () => {
    const sections = [plain('in', 0.2, box(0.1, 0.2, 0, 0.1)), plain('long', 30, box(0, 0.3, 0, 0.1)), plain('out', 0.2, box(0.1, 0.2, 0, 0.1))];
    const r = solveWaveguideAt(prepareWaveguide(waveguide(sections, { maxFrequencyHz: 2000 })), 2000);
    for (const s of r.sections) {
      console.log(`${s.name}: ${s.modes} modes kept, ${s.truncatedModes} in the check, ΔTL ${s.truncationDeltaDb?.toFixed(4)} dB`);
      expect(s.truncatedModes).toBeLessThan(s.modes);
      expect(s.modes / s.truncatedModes).toBeGreaterThan(1.2);
      expect(Number.isFinite(s.truncationDeltaDb!)).toBe(true);
    }
    expect(Number.isFinite(r.tlDb!)).toBe(true);
    // common practice: a lossless duct conserves energy however long it is
    expect(r.energyBalance).toBeLessThan(1e-3);
    const closed = solveWaveguideAt(prepareWaveguide(waveguide(sections, { maxFrequencyHz: 2000, termination: 'rigid' })), 2000);
    expect(closed.tlDb).toBeNull();
    // common practice: a rigid end and rigid walls send all the incident power back
    expect(Math.abs(closed.reflectedPower - closed.incidentPower) / closed.incidentPower).toBeLessThan(1e-6);
  });

  it('refuses bad input with the field and the fix', () => {
    expect(() => prepareWaveguide(waveguide([plain('a', -1, box(0, 0.1, 0, 0.1))]))).toThrow(/sections\[0\]\.length/);
    const partial = waveguide([plain('a', 0.2, box(0, 0.2, 0, 0.1)), plain('b', 0.2, box(0.1, 0.3, 0, 0.1))]);
    expect(() => solveWaveguideAt(prepareWaveguide(partial), 200)).toThrow(/neither cross-section's open area contains the other's/);
    const tooHigh = waveguide([plain('a', 0.2, box(0, 0.1, 0, 0.1))], { incidence: { kind: 'mode', index: 3 } });
    expect(() => solveWaveguideAt(prepareWaveguide(tooHigh), 200)).toThrow(/incidence.index = 3/);
  });
});

import { describe, expect, it } from 'vitest';
import { airProperties, densityFromTemperature, soundSpeedFromTemperature } from '../../engine/acoustics/index.ts';

describe('airProperties', () => {
  it('gives the textbook values for air at 20 °C and one atmosphere', () => {
    const air = airProperties();
    // Source: Kinsler, Frey, Coppens & Sanders, Fundamentals of Acoustics, 4th ed. (2000), appendix table of fluid properties: air at 20 °C, 1 atm, c = 343 m/s, ρ = 1.21 kg/m³ (from memory)
    expect(air.soundSpeed).toBeCloseTo(343, 0);
    // Source: as above (from memory); the book rounds to three digits, the dry-air ideal gas gives 1.204
    expect(Math.abs(air.density / 1.21 - 1)).toBeLessThan(0.01);
    expect(air.temperatureC).toBe(20);
  });

  it('uses c = 331.3·√(1 + T/273.15), so c² grows linearly with absolute temperature', () => {
    // common practice: ideal-gas sound speed, c² ∝ T
    expect(soundSpeedFromTemperature(0)).toBeCloseTo(331.3, 12);
    const ratio = soundSpeedFromTemperature(100) ** 2 / soundSpeedFromTemperature(-50) ** 2;
    // common practice: ideal gas, c² ∝ T
    expect(ratio).toBeCloseTo((100 + 273.15) / (-50 + 273.15), 12);
  });

  it('takes density from the ideal-gas law and scales it with pressure', () => {
    // common practice: ρ = p/(R·T), R = 287.05 J/(kg·K) for dry air
    expect(densityFromTemperature(0, 101_325)).toBeCloseTo(101_325 / (287.05 * 273.15), 12);
    const a = airProperties({ temperatureC: 30, pressurePa: 50_000 });
    const b = airProperties({ temperatureC: 30, pressurePa: 100_000 });
    expect(b.density / a.density).toBeCloseTo(2, 12);
    expect(b.soundSpeed).toBe(a.soundSpeed);
  });

  it('lets explicit sound speed and density override, and derives κ = ρc² and ρc from them', () => {
    const air = airProperties({ temperatureC: 40, soundSpeed: 340, density: 1.2 });
    expect(air.soundSpeed).toBe(340);
    expect(air.density).toBe(1.2);
    expect(air.bulkModulus).toBeCloseTo(1.2 * 340 * 340, 9);
    expect(air.impedance).toBeCloseTo(1.2 * 340, 12);
  });

  it('refuses impossible input', () => {
    expect(() => airProperties({ temperatureC: -300 })).toThrow(RangeError);
    expect(() => airProperties({ soundSpeed: 0 })).toThrow(RangeError);
    expect(() => airProperties({ density: -1 })).toThrow(RangeError);
    expect(() => airProperties({ pressurePa: Number.NaN })).toThrow(RangeError);
  });
});

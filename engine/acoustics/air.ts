// Properties of air for the Helmholtz model: the two numbers the solver needs
// (ρ and κ = ρc²) and the characteristic impedance ρc used by ports and the
// plane-wave theory.
import { requirePositive } from './checks.ts';

/** Specific gas constant of dry air, J/(kg·K). */
export const GAS_CONSTANT_DRY_AIR = 287.05;
/** Standard atmospheric pressure, Pa. */
export const STANDARD_PRESSURE_PA = 101_325;
/** Temperature used when none is given, °C. */
export const DEFAULT_TEMPERATURE_C = 20;
const KELVIN_OFFSET = 273.15;
/** Speed of sound in dry air at 0 °C, m/s (the 331.3 of c = 331.3·√(1 + T/273.15)). */
const SOUND_SPEED_0C = 331.3;

export interface AirInput {
  temperatureC?: number;
  /** Overrides the value from temperature. */
  soundSpeed?: number;
  /** Overrides the ideal-gas value. */
  density?: number;
  pressurePa?: number;
}

export interface Air {
  soundSpeed: number;
  density: number;
  temperatureC: number;
  /** Adiabatic bulk modulus κ = ρc², Pa. */
  bulkModulus: number;
  /** Characteristic impedance ρc, Pa·s/m. */
  impedance: number;
}

/** Sound speed of dry air from temperature (ideal gas, c ∝ √T). */
export function soundSpeedFromTemperature(temperatureC: number): number {
  return SOUND_SPEED_0C * Math.sqrt(1 + temperatureC / KELVIN_OFFSET);
}

/** Density of dry air from the ideal-gas law ρ = p / (R·T). */
export function densityFromTemperature(temperatureC: number, pressurePa = STANDARD_PRESSURE_PA): number {
  return pressurePa / (GAS_CONSTANT_DRY_AIR * (temperatureC + KELVIN_OFFSET));
}

export function airProperties(input: AirInput = {}): Air {
  const temperatureC = input.temperatureC ?? DEFAULT_TEMPERATURE_C;
  if (!(Number.isFinite(temperatureC) && temperatureC > -KELVIN_OFFSET)) {
    throw new RangeError(`temperatureC must be above absolute zero (got ${temperatureC})`);
  }
  const pressurePa = input.pressurePa ?? STANDARD_PRESSURE_PA;
  requirePositive('pressurePa', pressurePa);
  const soundSpeed = input.soundSpeed ?? soundSpeedFromTemperature(temperatureC);
  const density = input.density ?? densityFromTemperature(temperatureC, pressurePa);
  requirePositive('soundSpeed', soundSpeed);
  requirePositive('density', density);
  return {
    soundSpeed,
    density,
    temperatureC,
    bulkModulus: density * soundSpeed * soundSpeed,
    impedance: density * soundSpeed,
  };
}

/**
 * The small blocks around the geometry: air, mesh and absorbing layer. Each is optional and every
 * field has a default, recorded so that a user can see what the run assumed.
 */
import { airProperties, DEFAULT_TEMPERATURE_C } from '../acoustics/index.ts';
import { join, type Checker } from './checker.ts';
import { ABSORBER_KINDS, LIMITS } from './fields.ts';
import { MISSING, num, type Found } from './issues.ts';
import { get, readEnumOr, readNumber, readNumberOr, readObject, type Json } from './reader.ts';
import type { NormalisedAbsorber, NormalisedAir, NormalisedMesh } from './types.ts';

const EMPTY: Json = {};

export const DEFAULT_ORDER = 4;
// 8, not 6: at order 4 a straight duct then reflects below 1e-4 up to the top of the sweep (6 gives ~2e-3 there)
export const DEFAULT_POINTS_PER_WAVELENGTH = 8;
export const DEFAULT_ABSORBER_KIND = 'discrete';
export const DEFAULT_ABSORBER_LAYERS = 3;

/** The block, or an empty one when absent (its defaults then all apply). */
function block(ck: Checker, value: Found, path: string, what: string): Json | undefined {
  if (value === MISSING) return EMPTY;
  return readObject(ck, value, path, what);
}

export function readAir(ck: Checker, root: Json): NormalisedAir | undefined {
  const air = block(ck, get(root, 'air'), 'air', 'the air block');
  if (air === undefined) return undefined;
  const temperatureC = readNumberOr(ck, get(air, 'temperatureC'), 'air.temperatureC', 'the air temperature',
    { unit: '°C', min: LIMITS.minTemperatureC, max: LIMITS.maxTemperatureC }, DEFAULT_TEMPERATURE_C, 'not given: room temperature');
  const soundSpeed = readNumber(ck, get(air, 'soundSpeed'), 'air.soundSpeed', 'the speed of sound', { unit: 'm/s', above: 0 });
  const density = readNumber(ck, get(air, 'density'), 'air.density', 'the air density', { unit: 'kg/m³', above: 0 });
  if (temperatureC === undefined || (soundSpeed === undefined && get(air, 'soundSpeed') !== MISSING)
    || (density === undefined && get(air, 'density') !== MISSING)) return undefined;
  const derived = airProperties({ temperatureC, soundSpeed, density });
  if (soundSpeed === undefined) {
    ck.usedDefault('air.soundSpeed', derived.soundSpeed, `not given: dry air at ${num(temperatureC)} °C (ideal gas)`);
  }
  if (density === undefined) {
    ck.usedDefault('air.density', derived.density, `not given: dry air at ${num(temperatureC)} °C and 101 325 Pa (ideal gas)`);
  }
  return { temperatureC, soundSpeed: derived.soundSpeed, density: derived.density };
}

export function readMesh(ck: Checker, root: Json): NormalisedMesh | undefined {
  const mesh = block(ck, get(root, 'mesh'), 'mesh', 'the mesh block');
  if (mesh === undefined) return undefined;
  const order = readNumberOr(ck, get(mesh, 'order'), 'mesh.order', 'the element order',
    { integer: true, min: LIMITS.minOrder, max: LIMITS.maxOrder }, DEFAULT_ORDER, 'not given: the default element order');
  const path = 'mesh.pointsPerWavelength';
  const ppw = readNumberOr(ck, get(mesh, 'pointsPerWavelength'), path, 'the mesh density',
    { unit: 'points per wavelength', above: 0 }, DEFAULT_POINTS_PER_WAVELENGTH, 'not given: the default mesh density');
  if (ppw !== undefined && ppw < LIMITS.lowPointsPerWavelength) {
    ck.warn(path, ppw, 'points-per-wavelength-low',
      `fewer than ${LIMITS.lowPointsPerWavelength} points per wavelength at the top frequency resolve the waves poorly, and the phase error grows along the duct`,
      `set ${join('mesh', 'pointsPerWavelength')} to ${LIMITS.lowPointsPerWavelength} or more (${DEFAULT_POINTS_PER_WAVELENGTH} is the default)`);
  }
  if (order === undefined || ppw === undefined) return undefined;
  return { order, pointsPerWavelength: ppw };
}

export function readAbsorber(ck: Checker, root: Json): NormalisedAbsorber | undefined {
  const absorber = block(ck, get(root, 'absorber'), 'absorber', 'the absorber block');
  if (absorber === undefined) return undefined;
  const kind = readEnumOr(ck, get(absorber, 'kind'), 'absorber.kind', 'the absorbing-layer kind', ABSORBER_KINDS,
    DEFAULT_ABSORBER_KIND, 'not given: the default absorbing-layer kind');
  const layers = readNumberOr(ck, get(absorber, 'layers'), 'absorber.layers', 'the number of absorbing element layers',
    { integer: true, min: LIMITS.minLayers, max: LIMITS.maxLayers }, DEFAULT_ABSORBER_LAYERS, 'not given: the default number of layers');
  const rawThickness = get(absorber, 'thickness');
  const thickness = readNumber(ck, rawThickness, 'absorber.thickness', 'the absorbing-layer thickness', { unit: 'm', above: 0 });
  if (rawThickness === MISSING) ck.usedDefault('absorber.thickness', null, 'not given: the solver sizes the layer stack');
  if (kind === undefined || layers === undefined || (thickness === undefined && rawThickness !== MISSING)) return undefined;
  return { kind, layers, thickness: thickness ?? null };
}

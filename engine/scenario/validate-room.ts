/**
 * The room block: a box [0, Lx]×[0, Ly]×[0, Lz] with a condition per wall, point sources of given
 * volume velocity and receivers, all strictly inside (a point on a wall is ambiguous for the mesh).
 */
import { SNAP_TOLERANCE, WALL_KEYS } from '../core/space.ts';
import { item, join, type Checker } from './checker.ts';
import { LIMITS, WALL_WORDS } from './fields.ts';
import { MISSING, num, type Found } from './issues.ts';
import { get, readArray, readName, readNumber, readNumbers, readObject, required, type Json } from './reader.ts';
import { readBoundary } from './validate-boundary.ts';
import type { NormalisedRoom, ReceiverInput, RoomSourceInput, WallCondition, WallKey } from './types.ts';

const AXES = ['x', 'y', 'z'];

export function readRoom(ck: Checker, value: Found): NormalisedRoom | undefined {
  const room = readObject(ck, value, 'room', 'the room');
  if (room === undefined) return undefined;
  const size = readNumbers(ck, required(ck, room, 'room', 'size', 'the room size [Lx, Ly, Lz]', '[2.0, 1.6, 1.2]'), 'room.size',
    'the room size [Lx, Ly, Lz]', 3, { unit: 'm', min: LIMITS.minDimension, max: LIMITS.maxDimension }, (i) => `the room's extent along ${AXES[i]}`);
  const walls = readWalls(ck, get(room, 'walls'));
  const sources = readPoints(ck, room, 'sources', size, readSource);
  const receivers = get(room, 'receivers') === MISSING ? [] : readPoints(ck, room, 'receivers', size, readReceiver);
  if (sources !== undefined && receivers !== undefined) checkUniqueNames(ck, sources, receivers);
  if (size === undefined || walls === undefined || sources === undefined || receivers === undefined) return undefined;
  if (sources.some((s) => s === undefined) || receivers.some((r) => r === undefined)) return undefined;
  return { size: [size[0], size[1], size[2]], walls, sources: sources as RoomSourceInput[], receivers: receivers as ReceiverInput[] };
}

function readWalls(ck: Checker, value: Found): Record<WallKey, WallCondition> | undefined {
  const walls = value === MISSING ? {} : readObject(ck, value, 'room.walls', 'the walls');
  if (walls === undefined) return undefined;
  const result: Partial<Record<WallKey, WallCondition>> = {};
  let clean = true;
  for (const key of WALL_KEYS) {
    const path = join('room.walls', key);
    const raw = get(walls, key);
    const condition = raw === MISSING ? 'rigid' : readBoundary(ck, raw, path, `wall ${key}`, WALL_WORDS as readonly ('rigid' | 'open')[]);
    if (raw === MISSING) ck.usedDefault(path, 'rigid', 'not given: a rigid wall');
    if (condition === undefined) clean = false;
    else result[key] = condition;
  }
  return clean ? (result as Record<WallKey, WallCondition>) : undefined;
}

type PointReader<T> = (ck: Checker, obj: Json, path: string, size: number[] | undefined) => T | undefined;

function readPoints<T>(ck: Checker, room: Json, key: 'sources' | 'receivers', size: number[] | undefined, readItem: PointReader<T>): (T | undefined)[] | undefined {
  const path = join('room', key);
  const isSource = key === 'sources';
  const raw = isSource ? required(ck, room, 'room', key, 'the list of sources', '[{"name": "engine", "position": [1, 0.8, 0.5], "volumeVelocity": 0.001}]') : get(room, key);
  const items = readArray(ck, raw, path, `the list of ${key}`, {
    minItems: isSource ? 1 : 0, maxItems: isSource ? LIMITS.maxSources : LIMITS.maxReceivers, itemWhat: isSource ? 'source' : 'receiver',
  });
  return items?.map((v, i) => {
    const p = item(path, i);
    const obj = readObject(ck, v, p, isSource ? 'a source' : 'a receiver');
    return obj === undefined ? undefined : readItem(ck, obj, p, size);
  });
}

function readSource(ck: Checker, obj: Json, path: string, size: number[] | undefined): RoomSourceInput | undefined {
  const name = readName(ck, obj, path, 'source');
  const position = readPosition(ck, obj, path, size, 'source');
  const what = 'the volume velocity (peak amplitude)';
  const volumeVelocity = readNumber(ck, required(ck, obj, path, 'volumeVelocity', what, '0.001'), join(path, 'volumeVelocity'), what, { unit: 'm³/s', above: 0 });
  if (name === undefined || position === undefined || volumeVelocity === undefined) return undefined;
  return { name, position, volumeVelocity };
}

function readReceiver(ck: Checker, obj: Json, path: string, size: number[] | undefined): ReceiverInput | undefined {
  const name = readName(ck, obj, path, 'receiver');
  const position = readPosition(ck, obj, path, size, 'receiver');
  if (name === undefined || position === undefined) return undefined;
  return { name, position };
}

function readPosition(ck: Checker, obj: Json, path: string, size: number[] | undefined, what: string): [number, number, number] | undefined {
  const p = join(path, 'position');
  const xyz = readNumbers(ck, required(ck, obj, path, 'position', `the ${what} position [x, y, z]`, '[1.0, 0.8, 0.6]'), p,
    `the ${what} position [x, y, z]`, 3, { unit: 'm' }, (i) => `the ${what}'s ${AXES[i]} coordinate`);
  if (xyz === undefined) return undefined;
  if (size === undefined) return [xyz[0], xyz[1], xyz[2]];
  let inside = true;
  xyz.forEach((v, i) => {
    if (v > SNAP_TOLERANCE && v < size[i] - SNAP_TOLERANCE) return;
    inside = false;
    ck.error(item(p, i), v, 'inside-room', `the ${what} must lie strictly inside the room, not on or beyond a wall (0 < ${AXES[i]} < ${num(size[i])} m)`,
      `set it between 0 and ${num(size[i])}, e.g. ${num(size[i] / 2)}`);
  });
  return inside ? [xyz[0], xyz[1], xyz[2]] : undefined;
}

function checkUniqueNames(ck: Checker, sources: ({ name: string } | undefined)[], receivers: ({ name: string } | undefined)[]): void {
  const seen = new Map<string, string>();
  const note = (named: { name: string } | undefined, path: string) => {
    if (named === undefined) return;
    const first = seen.get(named.name);
    if (first === undefined) seen.set(named.name, path);
    else ck.error(join(path, 'name'), named.name, 'unique-name', `the name "${named.name}" is already used by ${first}; sources and receivers label result columns and must differ`, 'give this one a name of its own');
  };
  sources.forEach((s, i) => note(s, item('room.sources', i)));
  receivers.forEach((r, i) => note(r, item('room.receivers', i)));
}

/**
 * validateScenario: any parsed JSON value → a normalised scenario with every default filled in, or
 * the list of everything wrong with it. Hand-written rather than schema-driven so that each message
 * can say, in the user's terms, what to change; fields.ts and the schema test keep it in step with
 * scenarios/schema.json.
 */
import { Checker } from './checker.ts';
import { LIMITS, READABLE_FORMATS } from './fields.ts';
import { MISSING } from './issues.ts';
import { get, isObject, readString, reportUnknownFields, type Json } from './reader.ts';
import { readDuct } from './validate-duct.ts';
import { readSourcePower } from './validate-extras.ts';
import { readLinings } from './validate-linings.ts';
import { readRoom } from './validate-room.ts';
import { readAbsorber, readAir, readMesh } from './validate-settings.ts';
import { readSweep } from './validate-sweep.ts';
import { SCENARIO_FORMAT, type NormalisedScenario, type ValidationResult } from './types.ts';

export const DEFAULT_TITLE = 'Untitled scenario';

export function validateScenario(value: unknown): ValidationResult {
  const ck = new Checker();
  if (!isObject(value)) {
    ck.error('', value, 'type', 'a scenario must be a JSON object {…}', 'start from one of the files in scenarios/, which begin {"format": "quietgrid/1", …}');
    return { ok: false, errors: ck.reportedErrors(), warnings: ck.warnings };
  }
  // A file in another format is not worth reading field by field: its fields would all look wrong.
  if (!checkFormat(ck, value)) return { ok: false, errors: ck.reportedErrors(), warnings: ck.warnings };
  reportUnknownFields(ck, value, '', 'a scenario');
  const scenario = readScenario(ck, value);
  if (scenario === undefined || ck.errorCount > 0) return { ok: false, errors: ck.reportedErrors(), warnings: ck.warnings };
  return { ok: true, scenario, warnings: ck.warnings };
}

function checkFormat(ck: Checker, root: Json): boolean {
  const format = get(root, 'format');
  const readable = READABLE_FORMATS.join(', ');
  if (format === MISSING) {
    ck.error('format', MISSING, 'format-missing', 'a scenario must say which format it is written in', `add "format": "${SCENARIO_FORMAT}" as its first field`);
    return false;
  }
  if (typeof format === 'string' && READABLE_FORMATS.includes(format)) return true;
  const ours = typeof format === 'string' && format.startsWith('quietgrid/');
  ck.error('format', format, 'format-version',
    ours ? `this program reads scenario format ${readable} only, not ${format}` : `this is not a quietgrid scenario (this program reads format ${readable})`,
    ours ? `rewrite the file in format ${SCENARIO_FORMAT} (described in scenarios/schema.json) and set "format": "${SCENARIO_FORMAT}"`
      : `start from one of the files in scenarios/ and set "format": "${SCENARIO_FORMAT}"`);
  return false;
}

function readText(ck: Checker, root: Json, key: 'title' | 'notes', maxLength: number, fallback: string): string | undefined {
  const raw = get(root, key);
  if (raw === MISSING) {
    if (key === 'title') ck.usedDefault(key, fallback, 'not given');
    return fallback;
  }
  return readString(ck, raw, key, `the ${key}`, { maxLength });
}

function readScenario(ck: Checker, root: Json): NormalisedScenario | undefined {
  const title = readText(ck, root, 'title', LIMITS.maxTitleLength, DEFAULT_TITLE);
  const notes = readText(ck, root, 'notes', LIMITS.maxNotesLength, '');
  const air = readAir(ck, root);
  const sweep = readSweep(ck, root);
  const mesh = readMesh(ck, root);
  const absorber = readAbsorber(ck, root);
  const kind = readKind(ck, root);
  const top = sweep?.frequenciesHz[sweep.frequenciesHz.length - 1];
  const context = { sweepTopHz: top, sweepBottomHz: sweep?.frequenciesHz[0], soundSpeed: air?.soundSpeed };
  const duct = kind === 'duct' ? readDuct(ck, root.duct, context) : undefined;
  const room = kind === 'room' ? readRoom(ck, root.room) : undefined;
  const linings = kind === 'room' ? refuseRoomLinings(ck, root) : readLinings(ck, get(root, 'linings'), { duct, sweep, air });
  const rawPower = get(root, 'sourcePower');
  const sourcePower = rawPower === MISSING ? undefined : readSourcePower(ck, rawPower, sweep);
  if (title === undefined || notes === undefined || air === undefined || sweep === undefined || mesh === undefined || absorber === undefined
    || linings === undefined || (rawPower !== MISSING && sourcePower === undefined)) return undefined;
  const common = { format: SCENARIO_FORMAT, title, notes, air, sweep, mesh, absorber, defaultsUsed: ck.defaultsUsed, ...(sourcePower ? { sourcePower } : {}) } as const;
  if (duct !== undefined) return { ...common, kind: 'duct', duct, linings };
  if (room !== undefined) return { ...common, kind: 'room', room };
  return undefined;
}

function readKind(ck: Checker, root: Json): 'duct' | 'room' | undefined {
  const hasDuct = get(root, 'duct') !== MISSING;
  const hasRoom = get(root, 'room') !== MISSING;
  if (hasDuct && hasRoom) {
    ck.error('room', root.room, 'duct-or-room', 'a scenario describes either a duct or a room, not both', 'remove "room" or "duct" (put the other in a scenario of its own)');
    return undefined;
  }
  if (!hasDuct && !hasRoom) {
    ck.error('duct', MISSING, 'duct-or-room', 'a scenario needs either a "duct" or a "room"', 'add "duct": {"sections": […]} or "room": {"size": […], "sources": […]}');
    return undefined;
  }
  return hasDuct ? 'duct' : 'room';
}

function refuseRoomLinings(ck: Checker, root: Json): [] | undefined {
  if (get(root, 'linings') === MISSING) return [];
  ck.error('linings', root.linings, 'linings-in-room', 'linings line duct sections, and this scenario is a room', 'remove "linings", or give the walls an "absorption" or "impedance" instead');
  return undefined;
}

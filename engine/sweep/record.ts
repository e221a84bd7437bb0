/**
 * The record of a sweep: what the run did, folded from its events (scheduler.ts) by one pure function, and
 * turned into the report's input by another. The CLI and the app both keep a SweepRecord and both build
 * their report input with `reportInput`, so a run of the same scenario reports the same flags and numbers
 * wherever it ran. A record is plain, immutable data: the app keeps it in its store, a journal can rebuild
 * it by folding the events it persisted.
 */
import { withOrderCheck } from '../solve/assess.ts';
import type { AssessedPoint, PointResult } from '../solve/points.ts';
import type { ReportFailure, ReportInput, ReportScenario } from '../report/results.ts';
import type { NormalisedScenario } from '../scenario/types.ts';
import type { SweepDescription } from './protocol.ts';
import type { SweepEvent } from './scheduler.ts';

export type FrequencyStatus = 'queued' | 'solving' | 'done' | 'failed' | 'unsolved';

export interface FrequencyRecord {
  frequencyHz: number;
  status: FrequencyStatus;
  /** ms on the host's clock. */
  startedAt?: number;
  seconds?: number;
  message?: string;
}

/** An order check: the frequency solved again one element order higher. finer: that solve's point, once back. */
export interface CheckRecord {
  frequencyHz: number;
  status: 'queued' | 'solving' | 'done' | 'failed' | 'dropped';
  message?: string;
  finer?: PointResult;
}

export interface SweepRecord {
  /** From the first worker that prepared the scenario; null before (or when none could). */
  description: SweepDescription | null;
  prepareSeconds: number | null;
  /** Every frequency asked for, ascending. */
  frequencies: readonly FrequencyRecord[];
  /** Solved points, ascending, without fields; each point's accuracy includes its order check once that is back. */
  points: readonly AssessedPoint[];
  checks: readonly CheckRecord[];
  status: 'running' | 'done' | 'cancelled';
  startedAt: number;
  finishedAt: number | null;
}

export function emptyRecord(startedAt: number): SweepRecord {
  return { description: null, prepareSeconds: null, frequencies: [], points: [], checks: [], status: 'running', startedAt, finishedAt: null };
}

const UNSOLVED = 'not solved: the run was stopped';

function withoutField<P extends PointResult>(p: P): P {
  const bare = { ...p };
  delete bare.field;
  return bare;
}

function setFrequency(r: SweepRecord, f: number, change: (s: FrequencyRecord) => FrequencyRecord): SweepRecord {
  return { ...r, frequencies: r.frequencies.map((s) => (s.frequencyHz === f ? change(s) : s)) };
}

function setCheck(r: SweepRecord, f: number, change: (c: CheckRecord) => CheckRecord): SweepRecord {
  return { ...r, checks: r.checks.map((c) => (c.frequencyHz === f ? change(c) : c)) };
}

/** The point with the order check applied, when both it and its check are in. */
function checkedPoint(p: AssessedPoint, checks: readonly CheckRecord[]): AssessedPoint {
  const c = checks.find((x) => x.frequencyHz === p.frequencyHz && x.status === 'done' && x.finer);
  return c ? { ...p, accuracy: withOrderCheck(p.accuracy, p, c.finer!) } : p;
}

const byFrequency = <T extends { frequencyHz: number }>(a: T, b: T) => a.frequencyHz - b.frequencyHz;

/** The record after one event. */
export function recordEvent(r: SweepRecord, e: SweepEvent): SweepRecord {
  switch (e.type) {
    case 'queued': {
      const have = new Set(r.frequencies.map((s) => s.frequencyHz)), checked = new Set(r.checks.map((c) => c.frequencyHz));
      const frequencies = [...r.frequencies, ...e.frequenciesHz.filter((f) => !have.has(f)).map((f): FrequencyRecord => ({ frequencyHz: f, status: 'queued' }))].sort(byFrequency);
      const checks = [...r.checks, ...e.checkHz.filter((f) => !checked.has(f)).map((f): CheckRecord => ({ frequencyHz: f, status: 'queued' }))].sort(byFrequency);
      return { ...r, frequencies, checks };
    }
    case 'ready':
      return r.description ? r : { ...r, description: e.description, prepareSeconds: e.prepareSeconds };
    case 'started':
      if (e.job.kind === 'check') return setCheck(r, e.job.frequencyHz, (c) => ({ ...c, status: 'solving' }));
      return setFrequency(r, e.job.frequencyHz, (s) => ({ ...s, status: 'solving', startedAt: e.at }));
    case 'result': {
      const point = checkedPoint(withoutField(e.point), r.checks);
      const points = [...r.points.filter((p) => p.frequencyHz !== point.frequencyHz), point].sort(byFrequency);
      return setFrequency({ ...r, points }, point.frequencyHz, (s) => ({ ...s, status: 'done', seconds: (e.at - (s.startedAt ?? e.at)) / 1000 }));
    }
    case 'failure':
      return setFrequency(r, e.frequencyHz, (s) => ({ ...s, status: 'failed', message: e.message, seconds: s.startedAt !== undefined ? (e.at - s.startedAt) / 1000 : undefined }));
    case 'checked': {
      const checked = setCheck(r, e.frequencyHz, (c) => ({ ...c, status: 'done', finer: withoutField(e.point) }));
      return { ...checked, points: checked.points.map((p) => (p.frequencyHz === e.frequencyHz ? checkedPoint(p, checked.checks) : p)) };
    }
    case 'check-failure':
      return setCheck(r, e.frequencyHz, (c) => ({ ...c, status: 'failed', message: e.message }));
    case 'done': {
      const left = new Set(e.unsolved);
      const open = (s: FrequencyRecord) => s.status === 'queued' || s.status === 'solving' || (left.has(s.frequencyHz) && s.status !== 'done' && s.status !== 'failed');
      const frequencies = r.frequencies.map((s) => (open(s) ? { frequencyHz: s.frequencyHz, status: 'unsolved' as const } : s));
      const checks = r.checks.map((c) => (c.status === 'queued' || c.status === 'solving' ? { ...c, status: 'dropped' as const } : c));
      return { ...r, frequencies, checks, status: e.cancelled ? 'cancelled' : 'done', finishedAt: e.at };
    }
  }
}

/** A record folded from events in order (a journal's replay). */
export function recordOf(events: readonly SweepEvent[], startedAt: number): SweepRecord {
  return events.reduce(recordEvent, emptyRecord(startedAt));
}

/** What the report reads of the scenario, as plain data (engine/report's ReportScenario). */
export function reportScenario(s: NormalisedScenario): ReportScenario {
  const out: ReportScenario = {
    title: s.title, kind: s.kind, defaultsUsed: s.defaultsUsed.map((d) => ({ ...d })),
    sweep: { spacing: s.sweep.spacing, frequenciesHz: [...s.sweep.frequenciesHz] },
  };
  if (s.sourcePower) out.sourcePower = { octaveBands: s.sourcePower.octaveBands.map((b) => ({ nominalHz: b.nominalHz, levelDb: b.levelDb })) };
  if (s.kind === 'room') out.room = { receivers: s.room.receivers.map((r) => ({ name: r.name })) };
  return out;
}

/** What the host measured of the run, beside the record. */
export interface RunMeasures {
  /** Wall-clock seconds of the whole run. */
  totalSeconds: number;
  /** The process's peak resident memory, when the host can measure it. */
  peakMemoryBytes: number | null;
  notes?: readonly string[];
}

/** The report's input from the record: the same function for every host. Null before the problem was described. */
export function reportInput(r: SweepRecord, measures: RunMeasures): ReportInput | null {
  const d = r.description;
  if (!d) return null;
  const failures: ReportFailure[] = r.frequencies.flatMap((s) =>
    s.status === 'failed' ? [{ frequencyHz: s.frequencyHz, message: s.message ?? 'failed' }] : s.status === 'unsolved' ? [{ frequencyHz: s.frequencyHz, message: UNSOLVED }] : []);
  const solved = new Set(r.points.map((p) => p.frequencyHz));
  return {
    scenario: d.scenario, info: d.problem.info, cutOns: d.problem.cutOns, points: r.points,
    frequenciesHz: r.frequencies.map((s) => s.frequencyHz), failures, warnings: d.warnings,
    totalSeconds: measures.totalSeconds, peakMemoryBytes: measures.peakMemoryBytes, notes: measures.notes ? [...measures.notes] : undefined,
    accuracy: {
      ...d.problem.accuracy, planeWaveValidBelowHz: d.problem.planeWaveValidBelowHz,
      orderCheckedHz: r.checks.filter((c) => c.status === 'done' && solved.has(c.frequencyHz)).map((c) => c.frequencyHz),
      orderCheckFailures: r.checks.filter((c) => c.status === 'failed').map((c) => ({ frequencyHz: c.frequencyHz, message: c.message ?? 'failed' })),
    },
  };
}

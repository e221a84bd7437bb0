/**
 * The state of one run as a plain immutable value: the engine's sweep record (engine/sweep/record.ts: the
 * frequencies, points, order checks and the problem's description, folded from the sweep's events by the
 * same function the command line uses) and what the screens add to it: the run's status and message, which
 * fields the field worker holds, the clock. The fields themselves are not here (they go to the field worker).
 */
import type { Issue, NormalisedScenario } from '../../../engine/scenario/index.ts';
import { emptyRecord, recordEvent, type CheckRecord, type FrequencyRecord, type FrequencyStatus, type SweepRecord } from '../../../engine/sweep/record.ts';
import type { SweepEvent } from '../../../engine/sweep/scheduler.ts';

export type { FrequencyStatus };
export type FrequencyState = FrequencyRecord;
export type CheckState = CheckRecord;

export type RunStatus = 'idle' | 'preparing' | 'running' | 'done' | 'cancelled' | 'failed';

export interface RunState {
  id: number;
  status: RunStatus;
  /** The scenario as validated when the run started (later edits do not touch it). */
  scenario: NormalisedScenario | null;
  input: unknown;
  warnings: readonly Issue[];
  /** What the sweep did, as the engine records it. */
  record: SweepRecord;
  workers: number;
  startedAt: number;
  finishedAt: number | null;
  /** Frequencies whose field the field worker holds. */
  fieldsHz: readonly number[];
  message: string | null;
}

export const IDLE_RUN: RunState = {
  id: 0, status: 'idle', scenario: null, input: null, warnings: [], record: emptyRecord(0), workers: 0, startedAt: 0, finishedAt: null, fieldsHz: [], message: null,
};

export function startedRun(id: number, scenario: NormalisedScenario, input: unknown, warnings: readonly Issue[], workers: number, at: number): RunState {
  return { ...IDLE_RUN, id, status: 'preparing', scenario, input, warnings, workers, startedAt: at, record: emptyRecord(at) };
}

/** The run after one of its sweep's events. */
export function runEvent(run: RunState, e: SweepEvent): RunState {
  const next = { ...run, record: recordEvent(run.record, e) };
  if (e.type === 'ready' || e.type === 'started') return run.status === 'preparing' ? { ...next, status: 'running' } : next;
  if (e.type !== 'done') return next;
  const { frequencies, points } = next.record, failed = frequencies.filter((s) => s.status === 'failed');
  const status: RunStatus = e.cancelled ? 'cancelled' : points.length === 0 && failed.length > 0 ? 'failed' : 'done';
  const message = e.cancelled
    ? `Cancelled: ${points.length} of ${frequencies.length} frequencies solved and kept.`
    : failed.length > 0 ? `${failed.length} of ${frequencies.length} frequencies failed: ${failed[0].message ?? ''}` : null;
  return { ...next, status, finishedAt: e.at, message };
}

export function fieldKept(run: RunState, f: number): RunState {
  return run.fieldsHz.includes(f) ? run : { ...run, fieldsHz: [...run.fieldsHz, f].sort((a, b) => a - b) };
}

export function isActive(run: RunState): boolean {
  return run.status === 'preparing' || run.status === 'running';
}

export interface Progress { done: number; failed: number; solving: number; total: number; elapsedSeconds: number; remainingSeconds: number | null }

/**
 * Where the run stands: counts, elapsed time, and the time left from the mean wall time of the
 * frequencies finished so far (spread over the workers), or from `predictedSeconds` before the first.
 */
export function progressOf(run: RunState, now: number, predictedSecondsPerFrequency: number | null): Progress {
  const { frequencies, checks } = run.record;
  const count = (st: FrequencyStatus) => frequencies.filter((s) => s.status === st).length;
  const done = count('done'), failed = count('failed'), solving = count('solving'), queued = count('queued');
  const end = run.finishedAt ?? now, elapsedSeconds = Math.max(0, (end - run.startedAt) / 1000);
  if (!isActive(run)) return { done, failed, solving, total: frequencies.length, elapsedSeconds, remainingSeconds: run.status === 'idle' ? null : 0 };
  const times = frequencies.flatMap((s) => (s.status === 'done' && s.seconds !== undefined ? [s.seconds] : []));
  const perFrequency = times.length > 0 ? times.reduce((a, b) => a + b, 0) / times.length : predictedSecondsPerFrequency;
  let remainingSeconds: number | null = null;
  if (perFrequency !== null) {
    const inFlight = frequencies.filter((s) => s.status === 'solving').map((s) => Math.max(0, perFrequency - (now - (s.startedAt ?? now)) / 1000));
    const workers = Math.max(1, run.workers);
    // An order check solves at p + 1: count it as two frequencies.
    const checksLeft = checks.filter((c) => c.status === 'queued').length;
    remainingSeconds = Math.max(...inFlight, 0) + ((queued + 2 * checksLeft) * perFrequency) / workers;
    if (run.status === 'preparing') remainingSeconds += perFrequency;
  }
  return { done, failed, solving, total: frequencies.length, elapsedSeconds, remainingSeconds };
}

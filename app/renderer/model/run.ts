/**
 * The state of one run as a plain immutable value, and the pure steps that move it on as the pool
 * reports. The fields themselves are not here (they go to the field worker); only which were kept.
 */
import type { Issue, NormalisedScenario } from '../../../engine/scenario/index.ts';
import type { MeshInfo } from '../../../engine/solve/problem.ts';
import type { PointAccuracy } from '../../../engine/solve/points.ts';
import type { AccuracyInfo, AssessedPoint } from '../protocol.ts';
import type { DuctMode } from '../../../engine/acoustics/index.ts';

export type FrequencyStatus = 'queued' | 'solving' | 'done' | 'failed' | 'unsolved';

export interface FrequencyState {
  frequencyHz: number;
  status: FrequencyStatus;
  /** ms on the run's clock. */
  startedAt?: number;
  seconds?: number;
  message?: string;
}

/** An order check: the frequency solved again at element order p + 1. */
export interface CheckState { frequencyHz: number; status: 'queued' | 'solving' | 'done' | 'failed' | 'dropped'; message?: string }

export type RunStatus = 'idle' | 'preparing' | 'running' | 'done' | 'cancelled' | 'failed';

export interface RunState {
  id: number;
  status: RunStatus;
  /** The scenario as validated when the run started (later edits do not touch it). */
  scenario: NormalisedScenario | null;
  input: unknown;
  warnings: readonly Issue[];
  frequencies: readonly FrequencyState[];
  /** Solved points, ascending in frequency, without their fields, each with its accuracy. */
  points: readonly AssessedPoint[];
  checks: readonly CheckState[];
  accuracy: AccuracyInfo | null;
  info: MeshInfo | null;
  cutOns: readonly { section: string; modes: readonly DuctMode[] }[];
  workers: number;
  startedAt: number;
  finishedAt: number | null;
  /** Frequencies whose field the field worker holds. */
  fieldsHz: readonly number[];
  message: string | null;
}

export const IDLE_RUN: RunState = {
  id: 0, status: 'idle', scenario: null, input: null, warnings: [], frequencies: [], points: [], checks: [], accuracy: null, info: null, cutOns: [],
  workers: 0, startedAt: 0, finishedAt: null, fieldsHz: [], message: null,
};

export function startedRun(id: number, scenario: NormalisedScenario, input: unknown, warnings: readonly Issue[], workers: number, at: number): RunState {
  return {
    ...IDLE_RUN, id, status: 'preparing', scenario, input, warnings, workers, startedAt: at,
    frequencies: scenario.sweep.frequenciesHz.map((f) => ({ frequencyHz: f, status: 'queued' })),
  };
}

function update(run: RunState, f: number, change: (s: FrequencyState) => FrequencyState): RunState {
  return { ...run, frequencies: run.frequencies.map((s) => (s.frequencyHz === f ? change(s) : s)) };
}

export function preparedRun(run: RunState, info: MeshInfo, cutOns: RunState['cutOns'], accuracy: AccuracyInfo | null = null, checkHz: readonly number[] = []): RunState {
  return { ...run, status: 'running', info, cutOns, accuracy, checks: checkHz.map((f) => ({ frequencyHz: f, status: 'queued' })) };
}

function updateCheck(run: RunState, f: number, change: (c: CheckState) => CheckState): RunState {
  return { ...run, checks: run.checks.map((c) => (c.frequencyHz === f ? change(c) : c)) };
}

export function checkStarted(run: RunState, f: number): RunState {
  return updateCheck(run, f, (c) => ({ ...c, status: 'solving' }));
}

/** The order check's verdict replaces the point's accuracy (now with order_check_db and, maybe, the 'order' flag). */
export function pointChecked(run: RunState, f: number, accuracy: PointAccuracy): RunState {
  const points = run.points.map((p) => (p.frequencyHz === f ? { ...p, accuracy } : p));
  return updateCheck({ ...run, points }, f, (c) => ({ ...c, status: 'done' }));
}

export function checkFailed(run: RunState, f: number, message: string): RunState {
  return updateCheck(run, f, (c) => ({ ...c, status: 'failed', message }));
}

export function frequencyStarted(run: RunState, f: number, at: number): RunState {
  return update({ ...run, status: 'running' }, f, (s) => ({ ...s, status: 'solving', startedAt: at }));
}

export function frequencySolved(run: RunState, point: AssessedPoint, at: number): RunState {
  const bare = { ...point, field: undefined } as AssessedPoint;
  delete (bare as { field?: unknown }).field;
  const points = [...run.points.filter((p) => p.frequencyHz !== point.frequencyHz), bare].sort((a, b) => a.frequencyHz - b.frequencyHz);
  return update({ ...run, points }, point.frequencyHz, (s) => ({ ...s, status: 'done', seconds: (at - (s.startedAt ?? at)) / 1000 }));
}

export function frequencyFailed(run: RunState, f: number, message: string, at: number): RunState {
  return update(run, f, (s) => ({ ...s, status: 'failed', message, seconds: s.startedAt !== undefined ? (at - s.startedAt) / 1000 : undefined }));
}

export function fieldKept(run: RunState, f: number): RunState {
  return run.fieldsHz.includes(f) ? run : { ...run, fieldsHz: [...run.fieldsHz, f].sort((a, b) => a - b) };
}

export function finishedRun(run: RunState, cancelled: boolean, unsolved: readonly number[], at: number): RunState {
  const left = new Set(unsolved);
  const frequencies = run.frequencies.map((s) => (left.has(s.frequencyHz) || s.status === 'queued' || s.status === 'solving' ? { ...s, status: 'unsolved' as const, startedAt: undefined } : s));
  const failed = frequencies.filter((s) => s.status === 'failed');
  const status = cancelled ? 'cancelled' : run.points.length === 0 && failed.length > 0 ? 'failed' : 'done';
  const message = cancelled
    ? `Cancelled: ${run.points.length} of ${frequencies.length} frequencies solved and kept.`
    : failed.length > 0 ? `${failed.length} of ${frequencies.length} frequencies failed: ${failed[0].message ?? ''}` : null;
  const checks = run.checks.map((c) => (c.status === 'queued' || c.status === 'solving' ? { ...c, status: 'dropped' as const } : c));
  return { ...run, status, frequencies, checks, finishedAt: at, message };
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
  const count = (st: FrequencyStatus) => run.frequencies.filter((s) => s.status === st).length;
  const done = count('done'), failed = count('failed'), solving = count('solving'), queued = count('queued');
  const end = run.finishedAt ?? now, elapsedSeconds = Math.max(0, (end - run.startedAt) / 1000);
  if (!isActive(run)) return { done, failed, solving, total: run.frequencies.length, elapsedSeconds, remainingSeconds: run.status === 'idle' ? null : 0 };
  const times = run.frequencies.flatMap((s) => (s.status === 'done' && s.seconds !== undefined ? [s.seconds] : []));
  const perFrequency = times.length > 0 ? times.reduce((a, b) => a + b, 0) / times.length : predictedSecondsPerFrequency;
  let remainingSeconds: number | null = null;
  if (perFrequency !== null) {
    const inFlight = run.frequencies.filter((s) => s.status === 'solving').map((s) => Math.max(0, perFrequency - (now - (s.startedAt ?? now)) / 1000));
    const workers = Math.max(1, run.workers);
    // An order check solves at p + 1: count it as two frequencies.
    const checksLeft = run.checks.filter((c) => c.status === 'queued').length;
    remainingSeconds = Math.max(...inFlight, 0) + ((queued + 2 * checksLeft) * perFrequency) / workers;
    if (run.status === 'preparing') remainingSeconds += perFrequency;
  }
  return { done, failed, solving, total: run.frequencies.length, elapsedSeconds, remainingSeconds };
}

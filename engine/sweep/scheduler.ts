/**
 * The scheduler of a sweep: frequencies of one scenario solved side by side by workers, over an abstract
 * WorkerPort (protocol.ts) so that the same code runs the CLI's worker threads and the app's Web Workers.
 *
 * Each worker prepares the scenario once, then takes jobs from one queue one at a time, so a slow frequency
 * holds up only its own worker. After the sweep come the order checks: chosen frequencies solved again one
 * element order higher by whichever worker is free, each once its own point is solved (a check of a failed
 * point is dropped). Cancel terminates every worker at once and keeps what has finished. A worker that dies
 * loses only its current job and is replaced, but not forever; a scenario that cannot be prepared fails
 * every frequency with the reason.
 *
 * Everything that happens is reported as a SweepEvent, in order, to `onEvent`: the run record (record.ts)
 * is a fold of these events, the CLI's progress and field files and the app's screens read them, and a
 * journal that persists each event as it comes can replay the record later.
 *
 * Open doors (add without changing the loop):
 *  - which frequencies are solved: a SweepPlan answers first with its initial frequencies and then, after
 *    every result or failure, with any more (adaptive placement); fixedPlan is the list given;
 *  - a new kind of job: a JobKind, its message in protocol.ts and its handler in job.ts, how it is sent
 *    (`messageOf`) and what its answer does (`receive`).
 */
import type { AssessedPoint, PointResult } from '../solve/points.ts';
import { send, type FromWorker, type SweepDescription, type ToWorker, type WorkerPort } from './protocol.ts';

/** A unit of work for one worker: solve a frequency, or check one at order p + 1. */
export type JobKind = 'solve' | 'check';
export interface Job { kind: JobKind; frequencyHz: number }

export type SweepEvent =
  /** Frequencies to solve (at the start, and whenever the plan adds some) and the order checks asked for. */
  | { type: 'queued'; frequenciesHz: number[]; checkHz: number[]; at: number }
  /** The first worker has prepared the scenario. */
  | { type: 'ready'; description: SweepDescription; prepareSeconds: number; at: number }
  | { type: 'started'; job: Job; worker: number; at: number }
  /** A solved frequency; its field (if kept) is in point.field, transferred to this thread. */
  | { type: 'result'; point: AssessedPoint; at: number }
  | { type: 'failure'; frequencyHz: number; message: string; at: number }
  /** An order check done: the frequency solved one element order higher. */
  | { type: 'checked'; frequencyHz: number; point: PointResult; at: number }
  | { type: 'check-failure'; frequencyHz: number; message: string; at: number }
  /** Once, at the end: finished, cancelled, or every worker gone. unsolved: frequencies not solved because of a cancel. */
  | { type: 'done'; cancelled: boolean; unsolved: number[]; at: number };

/** Which frequencies to solve: the first ones, then more after each frequency is done (adaptive placement). */
export interface SweepPlan {
  initial(): readonly number[];
  /** After a frequency is solved (point) or failed (message): further frequencies to solve, [] when none. */
  after(done: { frequencyHz: number; point?: AssessedPoint; failure?: string }): readonly number[];
}

/** The plan of a list: those frequencies, nothing more. */
export function fixedPlan(frequenciesHz: readonly number[]): SweepPlan {
  return { initial: () => frequenciesHz, after: () => [] };
}

export interface SweepOptions {
  /** The scenario file's value: every worker validates and prepares it itself. */
  scenario: unknown;
  /** The frequencies to solve: a list, or a plan that places them as results come in. */
  plan: readonly number[] | SweepPlan;
  /** Frequencies to solve once more one element order higher (the order check), each after its point. */
  checkHz?: readonly number[];
  /** At most this many workers (never more than there are frequencies to solve at the start). */
  workers: number;
  keepFields: boolean;
  /** The user confirmed a problem above the engine's size limit. */
  allowLarge: boolean;
  createWorker: () => WorkerPort;
  now: () => number;
  onEvent: (event: SweepEvent) => void;
  /** Workers replaced after a crash, at most, over the whole run; default the worker count. */
  respawns?: number;
}

/** workers: how many the run started with (replacements not counted). */
export interface SweepOutcome { cancelled: boolean; unsolved: number[]; workers: number }

export interface SweepRun {
  done: Promise<SweepOutcome>;
  /** Stops the run at once: workers terminated, finished results kept, the rest listed unsolved. */
  cancel(): void;
}

interface Slot { port: WorkerPort; index: number; job: Job | null; parked: boolean }

function messageOf(job: Job): ToWorker {
  return job.kind === 'solve' ? { type: 'solve', frequencyHz: job.frequencyHz } : { type: 'check', frequencyHz: job.frequencyHz };
}

export function runSweep(o: SweepOptions): SweepRun {
  const plan = Array.isArray(o.plan) ? fixedPlan(o.plan as readonly number[]) : (o.plan as SweepPlan);
  const queue: number[] = [], asked = new Set<number>(), checks: number[] = [...new Set(o.checkHz ?? [])];
  const solved = new Set<number>(), failed = new Set<number>(), slots = new Set<Slot>();
  let respawnsLeft = o.respawns ?? Math.max(1, o.workers), readySent = false, finished = false, nextIndex = 0, lastCrash = '';
  let resolve: (outcome: SweepOutcome) => void = () => undefined, count = 0;
  const done = new Promise<SweepOutcome>((r) => { resolve = r; });
  const emit = (e: SweepEvent) => o.onEvent(e);

  /** Adds new frequencies to the queue; true when any was new. */
  const enqueue = (freqs: readonly number[], initial: boolean): boolean => {
    const fresh = [...new Set(freqs)].filter((f) => !asked.has(f));
    if (fresh.length === 0 && !initial) return false;
    for (const f of fresh) { asked.add(f); queue.push(f); }
    emit({ type: 'queued', frequenciesHz: fresh, checkHz: initial ? [...checks] : [], at: o.now() });
    return fresh.length > 0;
  };

  const finish = (cancelled: boolean, unsolved: number[]) => {
    if (finished) return;
    finished = true;
    for (const s of slots) s.port.terminate();
    slots.clear();
    emit({ type: 'done', cancelled, unsolved, at: o.now() });
    resolve({ cancelled, unsolved, workers: count });
  };
  const workLeft = () => queue.length > 0 || checks.length > 0 || [...slots].some((s) => s.job !== null);
  const retire = (slot: Slot) => {
    slot.port.terminate();
    slots.delete(slot);
    if (!workLeft()) finish(false, []);
  };

  const solving = () => [...slots].some((s) => s.job?.kind === 'solve');

  /**
   * The next job: a frequency of the sweep, else an order check whose point is solved; 'wait': a check's
   * point is still being solved (or may yet be placed by the plan). A check of a failed point is dropped.
   */
  const nextJob = (): Job | 'wait' | null => {
    const f = queue.shift();
    if (f !== undefined) return { kind: 'solve', frequencyHz: f };
    for (let i = 0; i < checks.length; i++) {
      const c = checks[i];
      if (failed.has(c) || (!asked.has(c) && !solving())) { checks.splice(i--, 1); continue; }
      if (solved.has(c)) return { kind: 'check', frequencyHz: checks.splice(i, 1)[0] };
    }
    return checks.length > 0 ? 'wait' : null;
  };

  const feed = (slot: Slot) => {
    slot.job = null;
    slot.parked = false;
    const job = nextJob();
    if (job === null) return retire(slot);
    // A check whose point another worker is still solving: this worker waits for it.
    if (job === 'wait') { slot.parked = true; return; }
    slot.job = job;
    emit({ type: 'started', job, worker: slot.index, at: o.now() });
    send(slot.port, messageOf(job));
  };
  const wakeParked = () => { for (const s of [...slots]) if (s.parked) feed(s); };

  /** Workers for frequencies the plan placed later, up to the worker count (each prepares before it takes one). */
  const grow = () => {
    for (let n = Math.min(o.workers - slots.size, queue.length); n > 0; n--) spawn();
  };

  const failAll = (reason: string) => {
    const lost = [...[...slots].flatMap((s) => (s.job?.kind === 'solve' ? [s.job.frequencyHz] : [])), ...queue.splice(0)];
    for (const f of lost) { failed.add(f); emit({ type: 'failure', frequencyHz: f, message: reason, at: o.now() }); }
    checks.splice(0);
  };

  const receive = (slot: Slot, m: FromWorker) => {
    if (finished || !slots.has(slot)) return;
    const at = o.now();
    // The slot's job is done before anyone hears of it: a listener may cancel, and this frequency is not in flight.
    if (m.type !== 'ready' && m.type !== 'fatal') slot.job = null;
    switch (m.type) {
      case 'ready':
        if (!readySent) {
          readySent = true;
          emit({ type: 'ready', description: m.description, prepareSeconds: m.prepareSeconds, at });
        }
        return feed(slot);
      case 'result': {
        solved.add(m.point.frequencyHz);
        emit({ type: 'result', point: m.point, at });
        if (finished) return;
        // the plan first: what it places is queued before this worker asks for its next job
        const more = enqueue(plan.after({ frequencyHz: m.point.frequencyHz, point: m.point }), false);
        feed(slot);
        if (more) grow();
        return wakeParked();
      }
      case 'failure': {
        failed.add(m.frequencyHz);
        emit({ type: 'failure', frequencyHz: m.frequencyHz, message: m.message, at });
        if (finished) return;
        const more = enqueue(plan.after({ frequencyHz: m.frequencyHz, failure: m.message }), false);
        feed(slot);
        if (more) grow();
        return wakeParked();
      }
      case 'checked':
        emit({ type: 'checked', frequencyHz: m.frequencyHz, point: m.point, at });
        return finished ? undefined : feed(slot);
      case 'check-failure':
        emit({ type: 'check-failure', frequencyHz: m.frequencyHz, message: m.message, at });
        return finished ? undefined : feed(slot);
      case 'fatal':
        // No worker will prepare this scenario better: everything not solved fails with the same reason.
        failAll(m.message);
        return finish(false, []);
      default:
        return;
    }
  };

  const crashed = (slot: Slot, message: string) => {
    if (finished || !slots.has(slot)) return;
    slots.delete(slot);
    slot.port.terminate();
    lastCrash = message;
    const job = slot.job, at = o.now();
    if (job?.kind === 'solve') {
      const why = `the worker solving ${job.frequencyHz} Hz stopped: ${message}`;
      failed.add(job.frequencyHz);
      emit({ type: 'failure', frequencyHz: job.frequencyHz, message: why, at });
      if (finished) return;
      enqueue(plan.after({ frequencyHz: job.frequencyHz, failure: why }), false);
    }
    if (job?.kind === 'check') emit({ type: 'check-failure', frequencyHz: job.frequencyHz, message: `the worker checking ${job.frequencyHz} Hz stopped: ${message}`, at });
    if (queue.length > 0 || checks.length > 0) {
      if (respawnsLeft-- > 0) spawn();
      else if (slots.size === 0) {
        failAll(`not solved: every worker stopped (last: ${lastCrash})`);
        return finish(false, []);
      }
    }
    if (slots.size === 0 && !workLeft()) return finish(false, []);
    wakeParked();
  };

  const spawn = () => {
    const slot: Slot = { port: o.createWorker(), index: nextIndex++, job: null, parked: false };
    slots.add(slot);
    slot.port.onmessage = (e) => receive(slot, e.data);
    slot.port.onerror = (e) => {
      e.preventDefault?.();
      crashed(slot, e.message || 'the worker failed (out of memory?)');
    };
    send(slot.port, { type: 'prepare', role: 'solve', scenario: o.scenario, keepFields: o.keepFields, allowLarge: o.allowLarge });
  };

  enqueue(plan.initial(), true);
  if (queue.length === 0) finish(false, []);
  else {
    count = Math.max(1, Math.min(o.workers, queue.length));
    for (let i = 0; i < count; i++) spawn();
  }

  return {
    done,
    cancel() {
      if (finished) return;
      const inFlight = [...slots].flatMap((s) => (s.job?.kind === 'solve' ? [s.job.frequencyHz] : []));
      const unsolved = [...inFlight, ...queue.splice(0)].sort((a, b) => a - b);
      checks.splice(0);
      finish(true, unsolved);
    },
  };
}

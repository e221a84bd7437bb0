// The sweep's scheduler (engine/sweep/scheduler.ts) with stand-in workers: the queue, the order checks after
// their points, cancel, crashes and respawns, a scenario that cannot be prepared, a plan that places more
// frequencies as results come in; and the record folded from its events.
import { describe, expect, it } from 'vitest';
import { fixedPlan, runSweep, type SweepEvent, type SweepPlan } from '../../engine/sweep/scheduler.ts';
import { emptyRecord, recordEvent, recordOf, reportInput } from '../../engine/sweep/record.ts';
import { transferOf } from '../../engine/sweep/protocol.ts';
import { defaultWorkerCount, defaultOrderCheckFrequencies, orderCheckFrequencies } from '../../engine/sweep/plan.ts';
import { FakeWorker, point, ready } from './fakes.ts';

function harness(freqs: number[] | SweepPlan, workers: number, checkHz: number[] = []) {
  const made: FakeWorker[] = [], log: string[] = [], events: SweepEvent[] = [];
  const onEvent = (e: SweepEvent) => {
    events.push(e);
    if (e.type === 'started') log.push(`${e.job.kind === 'check' ? 'check' : 'start'} ${e.job.frequencyHz}@${e.worker}`);
    else if (e.type === 'result') log.push(`result ${e.point.frequencyHz}`);
    else if (e.type === 'failure') log.push(`fail ${e.frequencyHz}: ${e.message}`);
    else if (e.type === 'checked') log.push(`checked ${e.frequencyHz}: TL ${e.point.kind === 'duct' ? e.point.tlDb : '-'}`);
    else if (e.type === 'check-failure') log.push(`check failed ${e.frequencyHz}: ${e.message}`);
    else if (e.type !== 'queued') log.push(e.type);
  };
  const run = runSweep({
    scenario: { scenario: true }, plan: freqs, checkHz, workers, keepFields: true, allowLarge: false,
    createWorker: () => { const w = new FakeWorker(); made.push(w); return w; }, now: () => events.length, onEvent,
  });
  const outcome = () => events.find((e) => e.type === 'done') as Extract<SweepEvent, { type: 'done' }> | undefined;
  return { made, log, events, run, outcome };
}

describe('the scheduler', () => {
  it('starts no more workers than frequencies, each prepared once, and feeds them from one queue', () => {
    const h = harness([100, 200, 300], 8);
    expect(h.made).toHaveLength(3);
    for (const w of h.made) expect(w.received).toEqual([{ type: 'prepare', role: 'solve', scenario: { scenario: true }, keepFields: true, allowLarge: false }]);
    const h2 = harness([100, 200, 300], 2);
    const [a, b] = h2.made;
    a.reply(ready());
    b.reply(ready());
    expect([a.lastSolve(), b.lastSolve()]).toEqual([100, 200]);
    b.reply({ type: 'result', point: point(200) });
    expect(b.lastSolve()).toBe(300);
    b.reply({ type: 'result', point: point(300) });
    expect(b.terminated).toBe(true);
    a.reply({ type: 'failure', frequencyHz: 100, message: 'singular' });
    expect(h2.outcome()).toMatchObject({ cancelled: false, unsolved: [] });
    expect(h2.log).toEqual(['ready', 'start 100@0', 'start 200@1', 'result 200', 'start 300@1', 'result 300', 'fail 100: singular', 'done']);
  });

  it('cancels at once: workers terminated, finished results kept, the rest listed unsolved', async () => {
    const h = harness([100, 200, 300, 400], 2);
    h.made.forEach((w) => w.reply(ready()));
    h.made[0].reply({ type: 'result', point: point(100) });
    h.run.cancel();
    expect(h.made.every((w) => w.terminated)).toBe(true);
    expect(await h.run.done).toEqual({ cancelled: true, unsolved: [200, 300, 400], workers: 2 });
    h.made[1].reply({ type: 'result', point: point(200) });
    expect(h.log.filter((l) => l.startsWith('result'))).toEqual(['result 100']);
  });

  it('replaces a crashed worker, not forever, then fails what is left', () => {
    const h = harness([100, 200], 1);
    h.made[0].reply(ready());
    h.made[0].onerror!({ message: 'out of memory' });
    expect(h.made).toHaveLength(2);
    expect(h.log).toContain('fail 100: the worker solving 100 Hz stopped: out of memory');
    h.made[1].onerror!({ message: 'again' });
    expect(h.log).toContain('fail 200: not solved: every worker stopped (last: again)');
    expect(h.outcome()).toMatchObject({ cancelled: false, unsolved: [] });
  });

  it('fails everything not solved with the reason when the scenario cannot be prepared', () => {
    const h = harness([100, 200, 300], 2, [300]);
    h.made[0].reply({ type: 'fatal', message: 'too large' });
    expect(h.log).toEqual(['fail 100: too large', 'fail 200: too large', 'fail 300: too large', 'done']);
    expect(h.made.every((w) => w.terminated)).toBe(true);
  });

  it('runs the order checks after the sweep, each once its own point is solved, and drops the check of a failed point', () => {
    const h = harness([100, 200, 300], 2, [100, 200, 300]);
    const [a, b] = h.made;
    a.reply(ready());
    b.reply(ready());
    a.reply({ type: 'failure', frequencyHz: 100, message: 'singular' });
    expect(a.last()).toEqual({ type: 'solve', frequencyHz: 300 });
    // the sweep queue is empty and 200 Hz is still being solved: b's check of it must wait
    b.reply({ type: 'result', point: point(200) });
    expect(b.last()).toEqual({ type: 'check', frequencyHz: 200 });
    a.reply({ type: 'result', point: point(300) });
    expect(a.last()).toEqual({ type: 'check', frequencyHz: 300 });
    b.reply({ type: 'checked', frequencyHz: 200, point: point(200, 10.1) });
    a.reply({ type: 'check-failure', frequencyHz: 300, message: 'singular' });
    expect(h.outcome()).toMatchObject({ cancelled: false, unsolved: [] });
    expect(h.log).toEqual(['ready', 'start 100@0', 'start 200@1', 'fail 100: singular', 'start 300@0', 'result 200', 'check 200@1', 'result 300', 'check 300@0', 'checked 200: TL 10.1', 'check failed 300: singular', 'done']);
  });

  it('asks the plan for more frequencies after each result, and starts workers for them', () => {
    // a plan that halves the step while the TL changes by more than 1 dB between neighbours (one refinement)
    const placed: number[] = [];
    const plan: SweepPlan = {
      initial: () => [100, 400],
      after: (d) => {
        placed.push(d.frequencyHz);
        return placed.length === 2 ? [200] : [];
      },
    };
    const h = harness(plan, 2);
    h.made.forEach((w) => w.reply(ready()));
    h.made[0].reply({ type: 'result', point: point(100, 5) });
    expect(h.made[0].terminated).toBe(true);
    h.made[1].reply({ type: 'result', point: point(400, 15) });
    expect(h.made[1].last()).toEqual({ type: 'solve', frequencyHz: 200 });
    h.made[1].reply({ type: 'result', point: point(200, 9) });
    expect(h.events.filter((e) => e.type === 'queued').map((e) => (e as { frequenciesHz: number[] }).frequenciesHz)).toEqual([[100, 400], [200]]);
    expect(h.outcome()).toMatchObject({ cancelled: false });
    const record = recordOf(h.events, 0);
    expect(record.frequencies.map((s) => [s.frequencyHz, s.status])).toEqual([[100, 'done'], [200, 'done'], [400, 'done']]);
  });

  it('the fixed plan is the list', () => {
    expect(fixedPlan([1, 2]).initial()).toEqual([1, 2]);
    expect(fixedPlan([1, 2]).after({ frequencyHz: 1 })).toEqual([]);
  });

  it('transfers field buffers rather than copying them', () => {
    const p = point(100, 10, true);
    expect(transferOf({ type: 'result', point: p })).toEqual([p.field!.re.buffer, p.field!.im.buffer]);
    expect(transferOf({ type: 'solve', frequencyHz: 1 })).toEqual([]);
  });
});

describe('the record', () => {
  it('folds the events: points without fields, ascending, the order check applied to its point in either order', () => {
    const h = harness([100, 200], 2, [100, 200]);
    const [a, b] = h.made;
    a.reply(ready()); b.reply(ready());
    b.reply({ type: 'result', point: point(200, 12, true) });
    a.reply({ type: 'result', point: point(100, 10) });
    b.reply({ type: 'checked', frequencyHz: 200, point: point(200, 12.9) });
    a.reply({ type: 'checked', frequencyHz: 100, point: point(100, 10.1) });
    const r = recordOf(h.events, 0);
    expect(r.points.map((p) => p.frequencyHz)).toEqual([100, 200]);
    expect(r.points.every((p) => !('field' in p))).toBe(true);
    // common practice: the order check is |TL(p+1) − TL(p)|, flagged above 0.5 dB
    expect(r.points.map((p) => p.accuracy.orderCheckDb)).toEqual([expect.closeTo(0.1, 12), expect.closeTo(0.9, 12)]);
    expect(r.points.map((p) => p.accuracy.flags)).toEqual([[], ['order']]);
    // a check back before its point: paired when the point comes
    let late = emptyRecord(0);
    for (const e of [h.events[0], { type: 'checked', frequencyHz: 200, point: point(200, 12.9), at: 1 }, { type: 'result', point: point(200, 12), at: 2 }] as SweepEvent[]) late = recordEvent(late, e);
    expect(late.points[0].accuracy.flags).toEqual(['order']);
  });

  it('gives the report its input: failures and stopped frequencies, order checks done and failed, the description', () => {
    const h = harness([100, 200, 300], 1, [100, 200]);
    const w = h.made[0];
    w.reply(ready());
    w.reply({ type: 'result', point: point(100) });
    w.reply({ type: 'failure', frequencyHz: 200, message: 'singular at 200' });
    h.run.cancel();
    const input = reportInput(recordOf(h.events, 0), { totalSeconds: 1, peakMemoryBytes: null })!;
    expect(input.frequenciesHz).toEqual([100, 200, 300]);
    expect(input.points.map((p) => p.frequencyHz)).toEqual([100]);
    expect(input.failures).toEqual([{ frequencyHz: 200, message: 'singular at 200' }, { frequencyHz: 300, message: 'not solved: the run was stopped' }]);
    expect(input.accuracy!.orderCheckedHz).toEqual([]);
    expect(input.info.dofs).toBe(100);
    expect(reportInput(emptyRecord(0), { totalSeconds: 0, peakMemoryBytes: null })).toBeNull();
  });
});

describe('plans and worker counts', () => {
  it('checks by default the top of the sweep and two more, at most three', () => {
    expect(defaultOrderCheckFrequencies([100, 125, 160, 200, 250, 315, 400])).toEqual([160, 250, 400]);
    expect(defaultOrderCheckFrequencies([250, 500])).toEqual([250, 500]);
    expect(defaultOrderCheckFrequencies([800])).toEqual([800]);
    expect(defaultOrderCheckFrequencies([])).toEqual([]);
    expect(orderCheckFrequencies([1, 2, 3, 4, 5], 'all')).toEqual([1, 2, 3, 4, 5]);
    expect(orderCheckFrequencies([1, 2, 3, 4, 5], 'none')).toEqual([]);
  });
  it('starts one worker per core, no more than the frequencies, no more than the memory holds', () => {
    expect(defaultWorkerCount({ cores: 8, frequencies: 3, workerMemoryBytes: 1e9, memoryBytes: 16e9 })).toBe(3);
    expect(defaultWorkerCount({ cores: 8, frequencies: 30, workerMemoryBytes: 1e9, memoryBytes: 2.5e9 })).toBe(2);
    expect(defaultWorkerCount({ cores: 2, frequencies: 30, workerMemoryBytes: 1e9, memoryBytes: Infinity })).toBe(2);
    expect(defaultWorkerCount({ cores: 8, frequencies: 30, workerMemoryBytes: 1e12, memoryBytes: 1e9 })).toBe(1);
  });
});

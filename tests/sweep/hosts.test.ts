// One sweep, two hosts: the command line's (engine/node/pool.ts: worker_threads running engine/node/worker.ts)
// and the app's (app/renderer/engine.worker.ts, here in this process behind a stand-in Web Worker scope that
// clones and transfers as a browser does). The same scenario, frequencies and order check through both give
// the same flags, the same report input and the same CSV files, byte for byte: the run's wall-clock timings
// are measurements of the machine, not results, and are set aside before the report inputs are compared.
import { describe, expect, it, vi } from 'vitest';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { solveSweep } from '../../engine/node/pool.ts';
import { runSweep, type SweepEvent } from '../../engine/sweep/scheduler.ts';
import { emptyRecord, recordEvent, reportInput, type SweepRecord } from '../../engine/sweep/record.ts';
import type { FromWorker, ToWorker, WorkerPort } from '../../engine/sweep/protocol.ts';
import { buildReport, tableCsv, type ReportInput } from '../../engine/report/results.ts';
import { readScenario } from '../../engine/scenario/index.ts';
import { ROOT } from '../cli/helpers.ts';

interface Scope { postMessage(m: FromWorker, o: { transfer: ArrayBuffer[] }): void; onmessage: ((e: { data: ToWorker }) => void) | null }

/** A fresh instance of the app's worker module in this process, behind a port that clones and transfers both ways. */
async function appWorker(): Promise<WorkerPort> {
  let alive = true;
  const scope: Scope = { postMessage: () => undefined, onmessage: null };
  (globalThis as { self?: unknown }).self = scope;
  vi.resetModules();
  await import('../../app/renderer/engine.worker.ts');
  const port: WorkerPort = {
    postMessage(m, transfer) {
      const data = structuredClone(m, { transfer });
      setImmediate(() => { if (alive) scope.onmessage?.({ data }); });
    },
    terminate() { alive = false; },
    onmessage: null,
    onerror: null,
  };
  scope.postMessage = (m, { transfer }) => {
    const data = structuredClone(m, { transfer });
    setImmediate(() => { if (alive) port.onmessage?.({ data }); });
  };
  return port;
}

interface Case { file: string; pick: (f: readonly number[]) => number[] }

async function viaNode(value: unknown, freqs: number[], checks: number[]): Promise<SweepRecord> {
  let record = emptyRecord(0);
  const run = solveSweep({ scenario: value, plan: freqs, checkHz: checks, workers: 2, keepFields: false, allowLarge: false, onEvent: (e) => { record = recordEvent(record, e); } });
  expect((await run.done).workers).toBe(2);
  return record;
}

async function viaApp(value: unknown, freqs: number[], checks: number[]): Promise<SweepRecord> {
  const ports = [await appWorker(), await appWorker()], workers = new Set<number>();
  let record = emptyRecord(0);
  await new Promise<void>((resolve) => {
    runSweep({
      scenario: value, plan: freqs, checkHz: checks, workers: 2, keepFields: true, allowLarge: false, createWorker: () => ports.shift()!, now: () => performance.now(),
      onEvent: (e: SweepEvent) => {
        record = recordEvent(record, e);
        if (e.type === 'started') workers.add(e.worker);
        if (e.type === 'done') resolve();
      },
    });
  });
  // both module instances worked: each took a frequency
  expect(workers.size).toBe(2);
  return record;
}

/** The report input without the run's own wall-clock measurements (per-point seconds, total seconds, memory peak). */
function withoutTimings(input: ReportInput): ReportInput {
  return {
    ...input, totalSeconds: 0, peakMemoryBytes: null,
    points: input.points.map((p) => ({ ...p, stats: { ...p.stats, assembleSeconds: 0, factorSeconds: 0, solveSeconds: 0 } })),
  };
}

describe('the command line and the app run one sweep engine', () => {
  const cases: Case[] = [
    { file: 'scenarios/kitchen-extract-stub-resonator.json', pick: (f) => [f[2], f[5]] },
    { file: 'scenarios/generator-room-small.json', pick: (f) => [f[0], f[f.length - 1]] },
  ];
  for (const c of cases) {
    it(`${c.file}: the same flags, report input and CSV files through both hosts`, async () => {
      const text = readFileSync(join(ROOT, c.file), 'utf8'), value = JSON.parse(text) as unknown;
      const freqs = c.pick(readScenario(text).scenario.sweep.frequenciesHz), checks = [freqs[1]];
      const cli = await viaNode(value, freqs, checks), app = await viaApp(value, freqs, checks);
      expect(cli.status).toBe('done');
      expect(cli.points.map((p) => p.frequencyHz)).toEqual(freqs);
      expect(cli.checks.map((x) => x.status)).toEqual(['done']);
      const a = reportInput(cli, { totalSeconds: 0, peakMemoryBytes: null })!, b = reportInput(app, { totalSeconds: 0, peakMemoryBytes: null })!;
      expect(JSON.stringify(withoutTimings(b))).toBe(JSON.stringify(withoutTimings(a)));
      const ra = buildReport(a), rb = buildReport(b);
      expect(rb.summary.accuracy.flagsByFrequency).toEqual(ra.summary.accuracy.flagsByFrequency);
      expect(tableCsv(rb.spectrum)).toBe(tableCsv(ra.spectrum));
      expect(tableCsv(rb.bands)).toBe(tableCsv(ra.bands));
      expect(ra.summary.accuracy.orderCheckedHz).toEqual(checks);
    }, 600_000);
  }
});

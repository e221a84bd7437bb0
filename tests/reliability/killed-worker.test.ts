/**
 * A sweep whose worker dies mid-run: the frequencies that finished are kept and reported, the one it was
 * on is named as failed, the rest are solved by its replacement, and the next run works as usual.
 */
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { solveSweep } from '../../engine/node/pool.ts';
import { readScenario } from '../../engine/scenario/index.ts';
import { recordEvent, emptyRecord, type SweepRecord } from '../../engine/sweep/record.ts';
import type { NodeSweepOptions } from '../../engine/node/pool.ts';

const text = readFileSync('scenarios/kitchen-extract-stub-resonator.json', 'utf8');
const freqs = readScenario(text).scenario.sweep.frequenciesHz.slice(0, 6);

async function run(opts: Partial<NodeSweepOptions>): Promise<SweepRecord> {
  let record = emptyRecord(0);
  await solveSweep({ scenario: JSON.parse(text), plan: freqs, workers: 2, keepFields: false, allowLarge: true, onEvent: (e) => { record = recordEvent(record, e); }, ...opts }).done;
  return record;
}

describe('a killed worker', () => {
  it('keeps and reports what finished, names the frequency lost, and the next run works', async () => {
    const dying = new URL('./fixtures/dying-worker.mjs', import.meta.url);
    const out = await run({ entry: dying });
    const solved = out.points.map((r) => r.frequencyHz), failed = out.frequencies.filter((s) => s.status === 'failed');
    // every frequency is accounted for exactly once: solved, or failed with a message naming it
    expect([...solved, ...failed.map((f) => f.frequencyHz)].sort((a, b) => a - b)).toEqual(freqs);
    expect(solved.length).toBeGreaterThanOrEqual(2);
    expect(failed.length).toBeGreaterThan(0);
    for (const f of failed) expect(f.message).toMatch(/Hz|stopped|exit/);
    for (const r of out.points) expect(r.kind === 'duct' && Number.isFinite(r.tlDb!)).toBe(true);

    const again = await run({});
    expect(again.frequencies.filter((s) => s.status === 'failed')).toEqual([]);
    expect(again.points.map((r) => r.frequencyHz)).toEqual(freqs);
  });
});

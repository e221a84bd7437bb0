/**
 * A sweep whose worker dies mid-run: the frequencies that finished are kept and reported, the one it was
 * on is named as failed, the rest are solved by its replacement, and the next run works as usual.
 */
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { solveFrequencies } from '../../engine/node/pool.ts';
import { readScenario } from '../../engine/scenario/index.ts';

const scenario = readScenario(readFileSync('scenarios/kitchen-extract-stub-resonator.json', 'utf8')).scenario;
const freqs = scenario.sweep.frequenciesHz.slice(0, 6);

describe('a killed worker', () => {
  it('keeps and reports what finished, names the frequency lost, and the next run works', async () => {
    const dying = new URL('./fixtures/dying-worker.mjs', import.meta.url);
    const out = await solveFrequencies(scenario, freqs, { workers: 2, entry: dying }).done;
    const solved = out.results.map((r) => r.frequencyHz);
    // every frequency is accounted for exactly once: solved, or failed with a message naming it
    expect([...solved, ...out.failures.map((f) => f.frequencyHz)].sort((a, b) => a - b)).toEqual(freqs);
    expect(solved.length).toBeGreaterThanOrEqual(2);
    expect(out.failures.length).toBeGreaterThan(0);
    for (const f of out.failures) expect(f.message).toMatch(/Hz|stopped|exit/);
    for (const r of out.results) expect(r.kind === 'duct' && Number.isFinite(r.tlDb!)).toBe(true);

    const again = await solveFrequencies(scenario, freqs, { workers: 2 }).done;
    expect(again.failures).toEqual([]);
    expect(again.results.map((r) => r.frequencyHz).sort((a, b) => a - b)).toEqual(freqs);
  });
});

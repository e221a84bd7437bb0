// Every example in examples/ runs as a reader would run it (npx tsx examples/NAME.ts), ends without an error,
// prints its numbered steps in order, and keeps the literate shape: a header saying what it shows and how to
// run it, and a comment at every numbered step.
import { describe, expect, it } from 'vitest';
import { execFile } from 'node:child_process';
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { ROOT } from '../cli/helpers.ts';

const EXAMPLES = readdirSync(join(ROOT, 'examples')).filter((f) => f.endsWith('.ts'));
const TSX = join(ROOT, 'node_modules', 'tsx', 'dist', 'cli.mjs');

function run(file: string): Promise<{ code: number; stdout: string; stderr: string }> {
  return new Promise((resolve) => {
    execFile(process.execPath, [TSX, join('examples', file)], { cwd: ROOT, maxBuffer: 16 << 20 }, (error, stdout, stderr) => {
      resolve({ code: error ? (typeof error.code === 'number' ? error.code : -1) : 0, stdout, stderr });
    });
  });
}

describe('examples', () => {
  it('there is at least one', () => {
    expect(EXAMPLES.length).toBeGreaterThan(0);
  });
  for (const file of EXAMPLES) {
    it(`${file} is literate and runs`, async () => {
      const text = readFileSync(join(ROOT, 'examples', file), 'utf8');
      expect(text).toMatch(/^\/\*\*[\s\S]*What this shows[\s\S]*How to run[\s\S]*\*\//);
      const steps = [...text.matchAll(/^\/\/ (\d+)\. /gm)].map((m) => Number(m[1]));
      expect(steps).toEqual(steps.map((_, i) => i + 1));
      expect(steps.length).toBeGreaterThanOrEqual(5);
      const r = await run(file);
      expect(r.code, r.stderr).toBe(0);
      const printed = [...new Set([...r.stdout.matchAll(/^(\d+)\. /gm)].map((m) => Number(m[1])))];
      expect(printed).toEqual(steps);
    }, 600_000);
  }
});

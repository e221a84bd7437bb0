// Running the command as a user would: a child process with the repository as working folder.
import { execFile } from 'node:child_process';
import { readdirSync, readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { join } from 'node:path';

export const ROOT = fileURLToPath(new URL('../..', import.meta.url));
const BIN = join(ROOT, 'bin', 'quietgrid.mjs');

export interface Run { code: number; stdout: string; stderr: string }

export function quietgrid(...args: string[]): Promise<Run> {
  return new Promise((resolve) => {
    execFile(process.execPath, [BIN, ...args], { cwd: ROOT, maxBuffer: 64 << 20 }, (error, stdout, stderr) => {
      const code = error ? (typeof error.code === 'number' ? error.code : -1) : 0;
      resolve({ code, stdout, stderr });
    });
  });
}

/** Every scenario file in scenarios/ (the JSON Schema beside them is not one). */
export function scenarioFiles(): string[] {
  return readdirSync(join(ROOT, 'scenarios'))
    .filter((f) => f.endsWith('.json'))
    .filter((f) => !('$schema' in JSON.parse(readFileSync(join(ROOT, 'scenarios', f), 'utf8'))))
    .map((f) => join('scenarios', f));
}

/** First, middle and last frequency of a sweep (fewer if the sweep is shorter). */
export function pickFrequencies(sweep: readonly number[]): number[] {
  return [...new Set([sweep[0], sweep[Math.floor(sweep.length / 2)], sweep[sweep.length - 1]])];
}

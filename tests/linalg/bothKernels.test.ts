import { describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import { simdAvailable } from '../../engine/linalg/index.ts';

const root = fileURLToPath(new URL('../..', import.meta.url));

// The solver's tests run here with the default kernels (SIMD where the runtime has it); this runs them again with the plain-JS kernels.
describe.skipIf(process.env.QUIETGRID_KERNEL !== undefined)('the solver tests with the other kernels', () => {
  it(`pass with QUIETGRID_KERNEL=js as with the default (${simdAvailable() ? 'simd' : 'js'})`, () => {
    const r = spawnSync(process.execPath, [fileURLToPath(new URL('../../node_modules/vitest/vitest.mjs', import.meta.url)), 'run', 'tests/linalg', '--exclude', 'tests/linalg/bothKernels.test.ts', '--reporter=dot'], {
      cwd: root, encoding: 'utf8', env: { ...process.env, QUIETGRID_KERNEL: 'js', NO_COLOR: '1', FORCE_COLOR: '0' }, timeout: 300_000,
    });
    // common practice: the same suite, the same verdicts
    expect(r.status, `${r.stdout}\n${r.stderr}`).toBe(0);
    expect(r.stdout).toMatch(/Tests\s+\d+ passed/);
  });
});

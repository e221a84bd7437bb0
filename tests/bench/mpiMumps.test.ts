// bench/mpi-mumps.ts: export → MPI-parallel MUMPS on 2 ranks → import-solution gives the report of our own solve.
import { describe, expect, it, afterAll } from 'vitest';
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { parseCsv } from '../../engine/report/index.ts';
import { buildMumps } from '../../bench/mumps.ts';
import { ROOT, quietgrid } from '../cli/helpers.ts';

const FILE = 'scenarios/kitchen-extract-stub-resonator.json';
const mpi = buildMumps('mpi');
const hasMpirun = spawnSync('sh', ['-c', 'command -v mpirun'], { encoding: 'utf8' }).status === 0;
const missing = 'missing' in mpi ? mpi.missing : hasMpirun ? null : 'mpirun not found (apt-get install -y openmpi-bin)';
if (missing) console.warn(`skipped: MPI MUMPS round trip: ${missing}`);
const tmp = mkdtempSync(join(tmpdir(), 'quietgrid-mpi-'));
afterAll(() => rmSync(tmp, { recursive: true, force: true }));

describe.skipIf(missing !== null)('a frequency solved by MPI-parallel MUMPS and imported back', () => {
  it('gives the report of our own solve, on 2 ranks, with the residual at round-off', async () => {
    const r = spawnSync(process.execPath, ['--import', 'tsx', 'bench/mpi-mumps.ts', FILE, '--frequency', '250', '--ranks', '2', '--out', tmp], { cwd: ROOT, encoding: 'utf8', timeout: 300_000 });
    expect(r.status, r.stderr).toBe(0);
    const line = JSON.parse(r.stdout.trim().split('\n').pop()!) as { ranks: number; importResidual: number; mumps: { residual: number } };
    expect(line.ranks).toBe(2);
    // common practice: a backward-stable direct solve leaves a residual near round-off, measured by MUMPS and again by import-solution
    expect(line.mumps.residual).toBeLessThan(1e-10);
    expect(line.importResidual).toBeLessThan(1e-10);
    const solved = await quietgrid('solve', FILE, '--frequencies', '250', '--out', join(tmp, 'solved'));
    expect(solved.code, solved.stderr).toBe(0);
    const row = (dir: string) => parseCsv(readFileSync(join(dir, 'spectrum.csv'), 'utf8'))[1].map(Number);
    const a = row(join(tmp, 'report')), s = row(join(tmp, 'solved'));
    // common practice: the same system solved by two direct solvers gives the same levels to far below the report's precision
    expect(Math.abs(a[1] - s[1])).toBeLessThan(1e-6);
    expect(Math.abs(a[2] - s[2])).toBeLessThan(1e-6);
  });
});

/**
 * One frequency solved beyond this process: export the system, solve it with MPI-parallel MUMPS
 * (Debian's libmumps-dev with Open MPI), and bring the solution back as the usual report.
 *
 *   npx tsx bench/mpi-mumps.ts SCENARIO.json --frequency HZ [--ranks 2] [--ordering pord] [--out DIR] [--hosts FILE]
 *
 * Steps (each printed with its command, so that they can be run by hand on a cluster):
 *   1. quietgrid export-system SCENARIO.json --frequency HZ --out DIR/A.mtx
 *   2. mpicc builds bench/mumps/mumps_solve.c against libzmumps (once; kept in the temporary folder)
 *   3. mpirun -np RANKS mumps_solve DIR/A.mtx DIR/A.rhs.mtx ORDERING DIR/x.mtx
 *   4. quietgrid import-solution SCENARIO.json --frequency HZ --solution DIR/x.mtx --out DIR/report
 * Prints one JSON line at the end: MUMPS's figures and the residual import-solution measured.
 * Needs: apt-get install -y libmumps-dev openmpi-bin (and gfortran for the compiler wrapper's libraries).
 */
import { spawnSync } from 'node:child_process';
import { mkdirSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { parseArgs } from 'node:util';
import { buildMumps, MUMPS_MPI_INSTALL, type MumpsRun } from './mumps.ts';

const root = fileURLToPath(new URL('..', import.meta.url));
const BIN = join(root, 'bin', 'quietgrid.mjs');

function run(cmd: string, args: string[], env: NodeJS.ProcessEnv = process.env): string {
  console.error(`$ ${[cmd, ...args].join(' ')}`);
  const r = spawnSync(cmd, args, { cwd: root, encoding: 'utf8', env, maxBuffer: 1 << 26 });
  if (r.status !== 0) {
    console.error(r.stdout, r.stderr);
    throw new Error(`${cmd} failed (${r.signal ?? `exit ${r.status}`})`);
  }
  if (r.stderr.trim()) console.error(r.stderr.trim());
  return r.stdout;
}

const { values, positionals } = parseArgs({
  allowPositionals: true,
  options: { frequency: { type: 'string' }, ranks: { type: 'string', default: '2' }, ordering: { type: 'string', default: 'pord' }, out: { type: 'string' }, hosts: { type: 'string' } },
});
const scenario = positionals[0];
if (!scenario || values.frequency === undefined) {
  console.error('usage: npx tsx bench/mpi-mumps.ts SCENARIO.json --frequency HZ [--ranks 2] [--ordering pord] [--out DIR] [--hosts FILE]');
  process.exit(2);
}
const ranks = Number(values.ranks);
if (!(Number.isInteger(ranks) && ranks >= 1)) {
  console.error(`--ranks must be a whole number, 1 or more (got ${values.ranks})`);
  process.exit(2);
}
const driver = buildMumps('mpi');
if ('missing' in driver) {
  console.error(`MPI MUMPS is not available here: ${driver.missing} (${MUMPS_MPI_INSTALL})`);
  process.exit(3);
}
const out = resolve(values.out ?? join('results', 'mpi-mumps'));
mkdirSync(out, { recursive: true });
const A = join(out, 'A.mtx'), x = join(out, 'x.mtx');

run(process.execPath, [BIN, 'export-system', scenario, '--frequency', values.frequency, '--out', A]);
// root in a container: Open MPI refuses to start without being told; one OpenBLAS thread per rank
const env = { ...process.env, OMPI_ALLOW_RUN_AS_ROOT: '1', OMPI_ALLOW_RUN_AS_ROOT_CONFIRM: '1', OPENBLAS_NUM_THREADS: '1', OMP_NUM_THREADS: '1' };
const mpiArgs = ['-np', String(ranks), '--oversubscribe', ...(values.hosts ? ['--hostfile', values.hosts] : []), driver.path, A, join(out, 'A.rhs.mtx'), values.ordering, x];
const started = performance.now();
const mumps = JSON.parse(run('mpirun', mpiArgs, env).trim().split('\n').pop()!) as MumpsRun;
const mpiSeconds = (performance.now() - started) / 1000;
const imported = run(process.execPath, [BIN, 'import-solution', scenario, '--frequency', values.frequency, '--solution', x, '--out', join(out, 'report')]);
const residual = Number(/relative residual[^=]*= ([0-9.e+-]+)/.exec(imported)?.[1]);
console.log(JSON.stringify({ scenario, frequencyHz: Number(values.frequency), ranks: mumps.ranks, ordering: mumps.orderingUsed, n: mumps.n, mpirunSeconds: mpiSeconds, mumps, importResidual: residual, report: join(out, 'report') }));

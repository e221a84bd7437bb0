/**
 * MUMPS as the bench's reference: bench/mumps/mumps_solve.c built here (never committed as a binary)
 * against Debian's libmumps-seq-dev with gcc, or against libmumps-dev with mpicc for the MPI build,
 * and run on the Matrix Market system a case exported. Absent compiler or library: null, and the
 * bench says how to install them.
 */
import { spawnSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import { existsSync, mkdirSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';

export const MUMPS_SOURCE = fileURLToPath(new URL('./mumps/mumps_solve.c', import.meta.url));
export const MUMPS_INSTALL = 'apt-get install -y libmumps-seq-dev gfortran';
export const MUMPS_MPI_INSTALL = 'apt-get install -y libmumps-dev openmpi-bin';

/** One run of the driver (its JSON line; flops as MUMPS counts them, one per complex operation). */
export interface MumpsRun {
  ordering: string; orderingUsed: string; ranks: number; n: number; nnz: number;
  analysisSeconds: number; factorSeconds: number; solveSeconds: number; analysisCpuSeconds: number; factorCpuSeconds: number; solveCpuSeconds: number;
  factorEntries: number; flops: number; estimatedFlops: number; maxFront: number; memoryMB: number; residual: number;
}

/** MUMPS counts a complex multiply-add as 2 operations (RINFOG(3)); our flop counts are real flops, 8 a complex multiply-add. */
export const REAL_FLOPS_PER_MUMPS_FLOP = 4;

/** The orderings tried for "MUMPS's best" (ICNTL(7)); METIS where the library was built with it (Debian's is not: MUMPS then reports SCOTCH and the run is dropped). */
export const MUMPS_ORDERINGS = ['amd', 'amf', 'scotch', 'pord', 'metis'] as const;

function which(cmd: string): boolean {
  return spawnSync('sh', ['-c', `command -v ${cmd}`], { encoding: 'utf8' }).status === 0;
}

/**
 * Compiles the driver once per source version into the temporary folder; returns its path, or a reason
 * why it cannot be built here.
 */
export function buildMumps(kind: 'seq' | 'mpi'): { path: string } | { missing: string } {
  const cc = kind === 'seq' ? 'gcc' : 'mpicc';
  if (!which(cc)) return { missing: `${cc} not found (${kind === 'seq' ? MUMPS_INSTALL : MUMPS_MPI_INSTALL})` };
  const header = kind === 'seq' ? '/usr/include/mumps_seq/mpi.h' : '/usr/include/zmumps_c.h';
  if (!existsSync(header) || !existsSync('/usr/include/zmumps_c.h')) return { missing: `MUMPS headers not found (${kind === 'seq' ? MUMPS_INSTALL : MUMPS_MPI_INSTALL})` };
  const hash = createHash('sha256').update(readFileSync(MUMPS_SOURCE)).update(kind).digest('hex').slice(0, 12);
  const dir = join(tmpdir(), 'quietgrid-mumps');
  mkdirSync(dir, { recursive: true });
  const path = join(dir, `mumps_solve_${kind}_${hash}`);
  if (existsSync(path)) return { path };
  const args = kind === 'seq'
    ? ['-O2', '-I/usr/include/mumps_seq', MUMPS_SOURCE, '-o', path, '-lzmumps_seq', '-lmumps_common_seq', '-lmpiseq_seq', '-lm']
    : ['-O2', '-DWITH_MPI', MUMPS_SOURCE, '-o', path, '-lzmumps', '-lmumps_common', '-lm'];
  const r = spawnSync(cc, args, { encoding: 'utf8' });
  if (r.status !== 0) return { missing: `${cc} could not build the MUMPS driver: ${r.stderr.trim().split('\n').slice(-2).join(' ')} (${kind === 'seq' ? MUMPS_INSTALL : MUMPS_MPI_INSTALL})` };
  return { path };
}

/** One sequential run, one thread of OpenBLAS like ours; null if the run failed (its message on stderr). */
export function runMumps(driver: string, dir: string, ordering: string, timeoutSeconds = 1800): MumpsRun | { failed: string } {
  const args = [join(dir, 'A.mtx'), join(dir, 'b.mtx'), ordering, ...(ordering === 'given' ? [join(dir, 'perm.txt')] : [])];
  const r = spawnSync(driver, args, {
    encoding: 'utf8', timeout: timeoutSeconds * 1000, killSignal: 'SIGKILL', maxBuffer: 1 << 20,
    env: { ...process.env, OPENBLAS_NUM_THREADS: '1', OMP_NUM_THREADS: '1' },
  });
  if (r.status !== 0) return { failed: `${r.signal ?? `exit ${r.status}`}: ${r.stderr.trim().split('\n').pop() ?? ''}` };
  return JSON.parse(r.stdout.trim().split('\n').pop()!) as MumpsRun;
}

export const mumpsTotal = (m: MumpsRun): number => m.analysisSeconds + m.factorSeconds + m.solveSeconds;
export const mumpsCpu = (m: MumpsRun): number => m.analysisCpuSeconds + m.factorCpuSeconds + m.solveCpuSeconds;

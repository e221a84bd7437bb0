/**
 * npm run bench — speed and scale of one machine, measured side by side in one run, written to
 * bench/RESULTS.md (and printed):
 *   0. the dense kernel's GFlop/s (SIMD and plain JS) and the machine's peak for the same operation (OpenBLAS zgemm, one thread);
 *   1. factorisation of assembled 3D duct systems at four sizes and orders: ours against MUMPS (sequential, each of its
 *      orderings and ours), SciPy's SuperLU and Octave's backslash on the same matrix exported as Matrix Market;
 *      flop and fill ratios against MUMPS's analysis; one against two threads in one factorisation;
 *   2. assembly time as a fraction of factor time;
 *   3. the symbolic memory estimate against the measured peak of the factorisation (one child process per size);
 *   4. a 24-frequency sweep with 1 and 2 workers through the command line;
 *   5. start-up: the smallest demo scenario end to end;
 *   6. the longest elongated duct whose solve fits in 8 GiB: found by the estimate, then solved and its peak measured;
 *   7. a splitter silencer by waveguide sections over octave bands 63 Hz – 8 kHz (bench/waveguide-splitter.ts).
 * Options: --only=small,medium (factor cases), --skip=factor,sweep,startup,largest,waveguide,reference (factor: sections 1–3), --scipy-timeout=SECONDS (per ordering, default 1800),
 * --sweep-rounds=N (alternating 1- and 2-worker runs of the sweep, default 3), --out=FILE (default bench/RESULTS.md: a partial run
 * with --only or --skip should write elsewhere).
 * External references are used when present and never installed here: MUMPS from Debian (apt-get install -y
 * libmumps-seq-dev gfortran; bench/mumps.ts builds the driver), SciPy (apt-get install -y python3-scipy, run as
 * /usr/bin/python3), Octave (apt-get install -y octave).
 * Timings are printed and recorded, never asserted.
 */
import { execFileSync, spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync, existsSync, readdirSync } from 'node:fs';
import { cpus, freemem, loadavg, totalmem, tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { readScenario } from '../engine/scenario/index.ts';
import { prepareProblem } from '../engine/solve/prepare.ts';
import { chamberScenario, FACTOR_CASES, type DuctCase } from './scenarios.ts';
import { buildMumps, runMumps, mumpsTotal, mumpsCpu, MUMPS_ORDERINGS, REAL_FLOPS_PER_MUMPS_FLOP, type MumpsRun } from './mumps.ts';
import { splitterBench } from './waveguide-splitter.ts';

const root = fileURLToPath(new URL('..', import.meta.url));
/** This process's resident set before any case: Node, tsx and the engine's modules, what every child process also carries. */
const runtimeBytes = process.memoryUsage().rss;
const args = process.argv.slice(2);
const flag = (name: string): string[] => args.find((a) => a.startsWith(`--${name}=`))?.split('=')[1].split(',') ?? [];
const only = flag('only'), skip = new Set(flag('skip'));
const md: string[] = [];
const say = (line = '') => { console.log(line); md.push(line); };
const fmt = (v: number, d = 2) => (Number.isFinite(v) ? v.toFixed(d) : '—');
const mb = (b: number) => (b / 2 ** 20).toFixed(0);
const GIB = 2 ** 30;

function table(header: string[], rows: string[][]): void {
  say(`| ${header.join(' | ')} |`);
  say(`|${header.map(() => '---').join('|')}|`);
  for (const r of rows) say(`| ${r.join(' | ')} |`);
  say();
}

// ---- machine ----
function machine(): string[] {
  const cpuinfo = existsSync('/proc/cpuinfo') ? readFileSync('/proc/cpuinfo', 'utf8') : '';
  const model = /model name\s*:\s*(.+)/.exec(cpuinfo)?.[1] ?? cpus()[0]?.model ?? 'unknown';
  let nproc = String(cpus().length);
  try { nproc = execFileSync('nproc', { encoding: 'utf8' }).trim(); } catch { /* keep os.cpus() */ }
  return [`- date: ${new Date().toISOString()}`, `- nproc: ${nproc}`, `- CPU: ${model}`,
    `- memory: ${(totalmem() / GIB).toFixed(1)} GiB total, ${(freemem() / GIB).toFixed(1)} GiB free at start`, `- node: ${process.version}`, `- load average at start: ${loadavg().map((x) => x.toFixed(2)).join(', ')} (1, 5, 15 min; above 0 means other work shared the cores: compare the CPU-second columns too)`];
}

// ---- external references ----
function scipyVersion(): string | null {
  const r = spawnSync('/usr/bin/python3', ['-c', 'import scipy; print(scipy.__version__)'], { encoding: 'utf8' });
  return r.status === 0 ? r.stdout.trim() : null;
}
function octaveVersion(): string | null {
  const r = spawnSync('octave', ['--version'], { encoding: 'utf8' });
  return r.status === 0 ? (r.stdout.split('\n')[0] ?? 'octave') : null;
}

interface Ours {
  name: string; order: number; topHz: number; chamberLength: number; dofs: number; nnzA: number; nnzL: number; storedEntries: number; flops: number;
  memoryBytes: number; peakBytes: number; peakReset: boolean; analyseSeconds: number; assembleSeconds: number; factorSeconds: number; factorCpuSeconds: number; solveSeconds: number; residual: number;
  maxFront: number; kernel: string; keptOneThreadSeconds: number; keptTwoThreadsSeconds: number; firstTwoThreadsSeconds: number; planSpeedup: number;
}
interface Splu { ordering: string; factorSeconds: number; factorCpuSeconds: number; solveSeconds: number; nnzL: number; nnzU: number; residual: number }
interface OctaveRun { seconds: number; residual: number }
/** A SciPy run that gave no figures: stopped at --scipy-timeout, or (why) killed or failed. */
interface Stopped { ordering: string; stoppedAfter: number; why?: string }
const isStopped = (s: Splu | Stopped): s is Stopped => 'stoppedAfter' in s;

function runCase(c: DuctCase, dir: string): Ours {
  const r = spawnSync(process.execPath, ['--expose-gc', '--import', 'tsx', join(root, 'bench/factor-case.ts'), c.name, dir], { cwd: root, encoding: 'utf8', maxBuffer: 1 << 24 });
  if (r.status !== 0) throw new Error(`factor case ${c.name} failed:\n${r.stderr}`);
  return JSON.parse(r.stdout.trim().split('\n').pop()!) as Ours;
}

/** One Python process per ordering, so that a slow one can be stopped (--scipy-timeout=SECONDS, default 1800) without losing the other. */
const SCIPY_TIMEOUT_S = Number(flag('scipy-timeout')[0] ?? 1800);
function runScipy(dir: string): (Splu | Stopped)[] {
  return ['MMD_AT_PLUS_A', 'COLAMD'].map((ordering) => {
    const r = spawnSync('/usr/bin/python3', [join(root, 'bench/scipy_splu.py'), join(dir, 'A.mtx'), join(dir, 'b.mtx'), ordering], {
      encoding: 'utf8', maxBuffer: 1 << 24, timeout: SCIPY_TIMEOUT_S * 1000, killSignal: 'SIGKILL',
      env: { ...process.env, OPENBLAS_NUM_THREADS: '1', OMP_NUM_THREADS: '1' }, // one thread, as ours
    });
    if (r.status === 0) return JSON.parse(r.stdout.trim()) as Splu;
    if ((r.error as { code?: string } | undefined)?.code === 'ETIMEDOUT') return { ordering, stoppedAfter: SCIPY_TIMEOUT_S };
    // SIGKILL without our timeout: the kernel's out-of-memory killer (SuperLU's fill outgrew the machine)
    return { ordering, stoppedAfter: NaN, why: r.signal === 'SIGKILL' ? 'killed by the system, most likely out of memory' : `failed (${r.status}): ${r.stderr.trim().split('\n').pop() ?? ''}` };
  });
}

/** Octave has no Matrix Market reader: the triplets are read with fscanf, the lower triangle mirrored. */
function runOctave(dir: string): OctaveRun | null {
  const script = `
function [A] = readmm(p)
  f = fopen(p); l = fgetl(f); sym = ~isempty(strfind(lower(l), 'symmetric')); l = fgetl(f);
  while l(1) == '%', l = fgetl(f); end
  s = sscanf(l, '%d'); T = fscanf(f, '%f', [4, Inf]); fclose(f);
  A = sparse(T(1,:), T(2,:), T(3,:) + 1i*T(4,:), s(1), s(2));
  if sym, A = A + tril(A, -1).'; end
end
function [v] = readvec(p)
  f = fopen(p); l = fgetl(f); l = fgetl(f); s = sscanf(l, '%d'); T = fscanf(f, '%f', [2, Inf]); fclose(f);
  v = (T(1,:) + 1i*T(2,:)).';
end
A = readmm('${join(dir, 'A.mtx')}'); b = readvec('${join(dir, 'b.mtx')}');
tic; x = A \\ b; t = toc;
printf('%.6f %.6e\\n', t, norm(A*x - b) / norm(b));
`;
  const file = join(dir, 'run.m');
  writeFileSync(file, `1;\n${script}`);
  const r = spawnSync('octave', ['--no-gui', '--quiet', file], { encoding: 'utf8', env: { ...process.env, OPENBLAS_NUM_THREADS: '1', OMP_NUM_THREADS: '1' } });
  if (r.status !== 0) return null;
  const [t, res] = r.stdout.trim().split(/\s+/).map(Number);
  return { seconds: t, residual: res };
}

// ---- 1–3: factorisation, assembly, memory ----
type CaseResult = { c: DuctCase; ours: Ours; mumps: MumpsRun[]; mumpsFailed: string[] };
const ourTotal = (o: Ours) => o.analyseSeconds + o.factorSeconds + o.solveSeconds;

/** MUMPS's best = its fastest ordering (analysis + factor + solve); flops are compared in MUMPS's own count, ours through its run on our ordering ('given'). */
function mumpsSection(rs: CaseResult[]): void {
  const have = rs.filter((r) => r.mumps.some((m) => m.ordering !== 'given'));
  if (have.length === 0) {
    if (rs.some((r) => r.mumpsFailed.length > 0)) for (const r of rs) for (const f of r.mumpsFailed) say(`- ${f}`);
    say(`MUMPS is absent: ${'missing' in mumpsDriver ? mumpsDriver.missing : 'no run finished'}.`);
    say();
    return;
  }
  say('### Against MUMPS (sequential, same matrix, OpenBLAS on one thread)');
  say();
  say(`Each of MUMPS's orderings present (ICNTL(7): ${MUMPS_ORDERINGS.join(', ')}) and ours handed to it ("given", ICNTL(7) = 1), bench/mumps/mumps_solve.c: analysis, factorisation and solve timed inside the driver, reading excluded. Flops are MUMPS's RINFOG(3) (one per complex operation; ×${REAL_FLOPS_PER_MUMPS_FLOP} for real flops), entries INFOG(29), largest front INFOG(11). "flop ratio" = MUMPS's flops on our ordering / on its least-flop ordering, both counted by MUMPS.`);
  say();
  const rows: string[][] = [];
  for (const r of have) {
    for (const m of r.mumps) rows.push([r.c.name, m.ordering, fmt(m.analysisSeconds), fmt(m.factorSeconds), fmt(m.solveSeconds, 3), fmt(mumpsTotal(m)), fmt(mumpsCpu(m)), String(m.factorEntries), fmt((REAL_FLOPS_PER_MUMPS_FLOP * m.flops) / 1e9, 1), String(m.maxFront), String(m.memoryMB), m.residual.toExponential(1)]);
    const o = r.ours;
    rows.push([r.c.name, `**ours** (${o.kernel})`, fmt(o.analyseSeconds), fmt(o.factorSeconds), fmt(o.solveSeconds, 3), fmt(ourTotal(o)), '—', `${o.storedEntries} (nnz(L) ${o.nnzL})`, fmt(o.flops / 1e9, 1), String(o.maxFront), mb(o.memoryBytes), o.residual.toExponential(1)]);
  }
  table(['case', 'ordering', 'analysis s', 'factor s', 'solve s', 'total s', 'total CPU s', 'factor entries', 'GFlop (real)', 'largest front', 'memory MB', 'residual'], rows);
  const summary: string[][] = [];
  for (const r of have) {
    const theirs = r.mumps.filter((m) => m.ordering !== 'given'), given = r.mumps.find((m) => m.ordering === 'given');
    const best = theirs.reduce((a, m) => (mumpsTotal(m) < mumpsTotal(a) ? m : a)), lean = theirs.reduce((a, m) => (m.flops < a.flops ? m : a));
    const tr = ourTotal(r.ours) / mumpsTotal(best), fr = given ? given.flops / lean.flops : NaN;
    summary.push([r.c.name, String(r.ours.dofs), best.ordering, fmt(tr), tr <= 0.8 ? 'met' : 'NOT met', lean.ordering, fmt(fr), Number.isFinite(fr) ? (fr <= 1.05 ? 'met' : 'NOT met') : '—',
      given ? fmt(given.factorEntries / lean.factorEntries) : '—', `${r.ours.maxFront} / ${lean.maxFront}`, fmt(r.ours.flops / 1e9 / r.ours.factorSeconds)]);
  }
  say('Targets: our analyse + factor + solve ≤ 0.8 × MUMPS\'s best ordering\'s analysis + factor + solve (wall time); flops of our ordering ≤ 1.05 × MUMPS\'s least-flop ordering (MUMPS\'s count); the factorisation ≥ 10 GFlop/s effective (our exact flop count / factor wall time).');
  say();
  table(['case', 'dofs', 'MUMPS best', 'time ours / MUMPS', 'target ≤ 0.8', 'least-flop ordering', 'flop ratio', 'target ≤ 1.05', 'entry ratio', 'largest front ours / MUMPS', 'factor GFlop/s', ], summary.map((row) => [...row.slice(0, 10), `${row[10]} (target ≥ 10: ${Number(row[10]) >= 10 ? 'met' : 'NOT met'})`]));
  for (const r of rs) for (const f of r.mumpsFailed) say(`- ${f}`);
  if (rs.some((r) => r.mumpsFailed.length > 0)) say();
}

/** One factorisation on one and on two threads, kept workspaces (the second factorisation in each). */
function threadSection(rs: CaseResult[]): void {
  say('### Two threads in one factorisation');
  say();
  say('The factorisation again in a kept workspace (memory already touched), alternately on one thread and on two (the caller and one helper thread, subtrees of the assembly tree shared out, parallelFactor.ts), best of two each; "first" is the first two-thread factorisation of a fresh workspace, the helper thread\'s start included; "plan" is the speed-up the work split predicts (flops of the fuller thread plus the fronts above the split).');
  say();
  table(['case', 'dofs', '1 thread s', '2 threads s', 'speed-up', 'target ≥ 1.6', '2 threads first s', 'plan'],
    rs.map(({ c, ours: o }) => { const sp = o.keptOneThreadSeconds / o.keptTwoThreadsSeconds; return [c.name, String(o.dofs), fmt(o.keptOneThreadSeconds), fmt(o.keptTwoThreadsSeconds), fmt(sp), sp >= 1.6 ? 'met' : 'NOT met', fmt(o.firstTwoThreadsSeconds), fmt(o.planSpeedup)]; }));
}
const scipy = skip.has('reference') ? null : scipyVersion(), octave = skip.has('reference') ? null : octaveVersion();
const mumpsDriver = skip.has('reference') ? { missing: 'skipped (--skip=reference)' } : buildMumps('seq');
const cases = skip.has('factor') ? [] : FACTOR_CASES.filter((c) => only.length === 0 || only.includes(c.name));
say('# quietgrid bench results');
say();
say('Generated by `npm run bench` (bench/run.ts); every figure below comes from one run of that command on this machine.');
say();
for (const l of machine()) say(l);
say(`- SciPy: ${scipy ? `${scipy} (Debian python3-scipy, /usr/bin/python3)` : 'absent — install with `apt-get install -y python3-scipy` to get the SciPy columns'}`);
say(`- Octave: ${octave ?? 'absent — install with `apt-get install -y octave` to get the Octave column'}`);
say(`- MUMPS: ${'path' in mumpsDriver ? 'Debian libmumps-seq 5.5 (bench/mumps/mumps_solve.c built with gcc; OpenBLAS on one thread)' : `absent: ${mumpsDriver.missing}`}`);
say();

// ---- 0: kernel and peak ----
if (!skip.has('factor')) {
  const r = spawnSync(process.execPath, ['--import', 'tsx', join(root, 'bench/kernel.ts')], { cwd: root, encoding: 'utf8' });
  if (r.status === 0) {
    const k = JSON.parse(r.stdout.trim().split('\n').pop()!) as { simd: number | null; js: number; zgemm: number | null; shapes: number[][] };
    say('## 0. The dense kernel and the machine\'s peak');
    say();
    say(`The frontal update T −= X·Wᵀ alone (\`subtractProducts\`, bench/kernel.ts), complex, 8 real flops a multiply-add, best of several runs on ${k.shapes.map((x) => x.join(' × ')).join(' and ')} (rows × columns × terms); the peak is OpenBLAS zgemm on 1000 × 1000 matrices through NumPy, one thread, measured in the same run.`);
    say();
    table(['kernel', 'GFlop/s', 'of zgemm', 'target'], [
      ['WebAssembly SIMD (f64x2)', fmt(k.simd ?? NaN), k.zgemm && k.simd ? `${fmt((100 * k.simd) / k.zgemm, 0)} %` : '—', k.simd === null ? 'no SIMD here' : `≥ 15: ${k.simd >= 15 ? 'met' : 'NOT met'}`],
      ['plain JavaScript', fmt(k.js), k.zgemm ? `${fmt((100 * k.js) / k.zgemm, 0)} %` : '—', ''],
      ['OpenBLAS zgemm (peak)', fmt(k.zgemm ?? NaN), k.zgemm ? '100 %' : 'NumPy absent', ''],
    ]);
  }
}

const results: { c: DuctCase; ours: Ours; splu: Splu[]; oct: OctaveRun | null; mmdTimedOut: number | null; mumps: MumpsRun[]; mumpsFailed: string[] }[] = [];
const stopped: string[] = [];
for (const c of cases) {
  const dir = mkdtempSync(join(tmpdir(), `quietgrid-bench-${c.name}-`));
  try {
    console.error(`factor case ${c.name} (order ${c.order}, ${c.topHz} Hz, chamber ${c.chamberLength} m) …`);
    const ours = runCase(c, dir);
    console.error(`  ours: ${ours.dofs} dofs, factor ${fmt(ours.factorSeconds)} s`);
    const all = scipy ? runScipy(dir) : [];
    const splu = all.filter((s): s is Splu => !isStopped(s)), stops = all.filter(isStopped);
    for (const s of stops) {
      stopped.push(s.why ? `${c.name}: SciPy ${s.ordering} ${s.why} (machine memory ${(totalmem() / GIB).toFixed(1)} GiB); no figures.` : `${c.name}: SciPy ${s.ordering} was stopped after ${s.stoppedAfter} s (--scipy-timeout); the time ratio is below ours / ${s.stoppedAfter} s.`);
    }
    for (const s of splu) console.error(`  SciPy ${s.ordering}: factor ${fmt(s.factorSeconds)} s`);
    const oct = octave ? runOctave(dir) : null;
    const mumps: MumpsRun[] = [], mumpsFailed: string[] = [];
    if ('path' in mumpsDriver) {
      for (const ordering of [...MUMPS_ORDERINGS, 'given']) {
        const m = runMumps(mumpsDriver.path, dir, ordering, SCIPY_TIMEOUT_S);
        if ('failed' in m) mumpsFailed.push(`${c.name}: MUMPS ${ordering} ${m.failed}`);
        else if (m.orderingUsed === m.ordering) mumps.push(m); // an ordering the library lacks falls back to another: not reported twice
        else mumpsFailed.push(`${c.name}: MUMPS has no ${ordering} here (it used ${m.orderingUsed})`);
        if (!('failed' in m)) console.error(`  MUMPS ${ordering}: factor ${fmt(m.factorSeconds)} s`);
      }
    }
    results.push({ c, ours, splu, oct, mmdTimedOut: stops.find((s) => s.ordering === 'MMD_AT_PLUS_A' && !s.why)?.stoppedAfter ?? null, mumps, mumpsFailed });
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

if (results.length > 0) {
  say('## 1. Factorisation of assembled duct systems');
  say();
  say('Scenario: an elongated expansion chamber (0.25 × 0.2 m runs of 0.5 m, a 0.5 × 0.4 m chamber of the length given), 8 points per wavelength at the top frequency, assembled with `prepareProblem` + `problem.system` at that frequency (bench/scenarios.ts).');
  say('Ours = lattice nested dissection + symbolic analysis (`analyzeMesh`), multifrontal LDLᵀ (`factor`, WebAssembly SIMD kernels unless noted), one `solve`, single thread; GFlop/s = our exact flop count / factor wall time. SciPy = `scipy.sparse.linalg.splu` (SuperLU, partial pivoting with its default threshold) on the same matrix read from the Matrix Market file, factor + solve timed inside Python, reading excluded, with OPENBLAS_NUM_THREADS=OMP_NUM_THREADS=1 so that both run on one thread. CPU seconds are process CPU time (Node `process.cpuUsage`, Python `time.process_time`): steadier than wall time when the machine is shared.');
  say();
  table(['case', 'order', 'dofs', 'nnz(A)', 'nnz(L) ours', 'GFlop', 'analyse s', 'factor s', 'factor CPU s', 'solve s', 'ours total s', 'GFlop/s', 'residual'],
    results.map(({ c, ours: o }) => [c.name, String(o.order), String(o.dofs), String(o.nnzA), String(o.nnzL), fmt(o.flops / 1e9, 1), fmt(o.analyseSeconds), fmt(o.factorSeconds), fmt(o.factorCpuSeconds), fmt(o.solveSeconds, 3),
      fmt(o.analyseSeconds + o.factorSeconds + o.solveSeconds), fmt(o.flops / 1e9 / o.factorSeconds), o.residual.toExponential(1)]));
  mumpsSection(results);
  threadSection(results);
  if (scipy) {
    say('Fill is compared like with like: SuperLU stores L (unit diagonal included) and U (diagonal included) for both triangles, so its factor has nnz(L) + nnz(U) − n distinct entries; our LDLᵀ stores one triangle, the same factorisation written out in full would have 2·nnz(L) − n. "fill ratio" = (2·nnz(L) − n) / (nnz(L)+nnz(U) − n) of SuperLU; "stored ratio" = our nnz(L) / SuperLU\'s nnz(L)+nnz(U) − n (what each keeps in memory, in complex entries). Time ratio = ours (analyse + factor + solve) / SuperLU (factor + solve; its ordering is inside splu).');
    say();
    const rows: string[][] = [];
    for (const { c, ours: o, splu, oct } of results) {
      const ourT = o.analyseSeconds + o.factorSeconds + o.solveSeconds;
      for (const s of splu) {
        const theirs = s.nnzL + s.nnzU - o.dofs;
        rows.push([c.name, s.ordering, fmt(s.factorSeconds), fmt(s.factorCpuSeconds), fmt(s.solveSeconds, 3), String(theirs), fmt(ourT / (s.factorSeconds + s.solveSeconds)), fmt(o.factorCpuSeconds / s.factorCpuSeconds), fmt((2 * o.nnzL - o.dofs) / theirs), fmt(o.nnzL / theirs), s.residual.toExponential(1)]);
      }
      if (oct) rows.push([c.name, 'Octave A\\b', fmt(oct.seconds), '—', '(in total)', '—', fmt(ourT / oct.seconds), '—', '—', '—', oct.residual.toExponential(1)]);
    }
    table(['case', 'reference', 'factor s', 'factor CPU s', 'solve s', 'nnz(L)+nnz(U)−n', 'time ours/ref', 'factor CPU ours/ref', 'fill ratio', 'stored ratio', 'residual'], rows);
    for (const line of stopped) say(`- ${line}`);
    if (stopped.length > 0) say();
    const largest = results[results.length - 1], mmdOf = (x: (typeof results)[number]) => x.splu.find((s) => s.ordering === 'MMD_AT_PLUS_A');
    const targets = (x: (typeof results)[number]): string => {
      const o = x.ours, mmd = mmdOf(x)!, tr = (o.analyseSeconds + o.factorSeconds + o.solveSeconds) / (mmd.factorSeconds + mmd.solveSeconds), fr = (2 * o.nnzL - o.dofs) / (mmd.nnzL + mmd.nnzU - o.dofs);
      return `time ratio ${fmt(tr)} (target ≤ 0.5: ${tr <= 0.5 ? 'met' : 'NOT met'}), fill ratio ${fmt(fr)} (target ≤ 0.7: ${fr <= 0.7 ? 'met' : 'NOT met'})`;
    };
    if (mmdOf(largest)) {
      say(`Targets at the largest size (${largest.c.name}, ${largest.ours.dofs} dofs) against SciPy MMD_AT_PLUS_A: ${targets(largest)}.`);
    } else {
      const o = largest.ours, both = results.filter((x) => mmdOf(x)).pop();
      const ourT = o.analyseSeconds + o.factorSeconds + o.solveSeconds, stop = largest.mmdTimedOut;
      // a stopped run bounds the time ratio from above; its fill was never counted
      const bound = stop ? `the time ratio is below ${fmt(ourT / stop)} (ours ${fmt(ourT)} s against more than ${stop} s; target ≤ 0.5: ${ourT / stop <= 0.5 ? 'met' : 'NOT met'}), the fill ratio cannot be counted` : 'no ratio can be formed';
      say(`Targets at the largest size (${largest.c.name}, ${o.dofs} dofs): SciPy MMD_AT_PLUS_A did not finish there (see above), where ours took ${fmt(ourT)} s and ${mb(o.peakBytes)} MiB; ${bound}.${both ? ` At the largest size where both finished (${both.c.name}, ${both.ours.dofs} dofs): ${targets(both)}.` : ''}`);
    }
    say();
  } else {
    say('SciPy is absent: `apt-get install -y python3-scipy` and run the bench again for the reference columns.');
    say();
  }
  say('## 2. Assembly against factorisation');
  say();
  table(['case', 'dofs', 'assemble s', 'factor s', 'assemble / factor', 'target < 10 %'],
    results.map(({ c, ours: o }) => [c.name, String(o.dofs), fmt(o.assembleSeconds, 3), fmt(o.factorSeconds), `${fmt((100 * o.assembleSeconds) / o.factorSeconds, 1)} %`, o.assembleSeconds < 0.1 * o.factorSeconds ? 'met' : 'NOT met']));
  say('## 3. Memory: symbolic estimate against the measured peak');
  say();
  say('Measured = peak resident set during `factor` minus the resident set just before it (Linux VmHWM reset through /proc/self/clear_refs; maxRSS delta where that is not available), in a child process per size after a garbage collection.');
  say();
  table(['case', 'dofs', 'estimate MiB', 'measured MiB', 'estimate / measured', 'within 20 %'],
    results.map(({ c, ours: o }) => [c.name, String(o.dofs), mb(o.memoryBytes), mb(o.peakBytes), fmt(o.memoryBytes / o.peakBytes), Math.abs(o.memoryBytes / o.peakBytes - 1) <= 0.2 ? 'yes' : 'no']));
}

// ---- 4: sweeps ----
function cli(argv: string[]): number {
  const t0 = performance.now();
  const r = spawnSync(process.execPath, [join(root, 'bin/quietgrid.mjs'), ...argv], { cwd: root, encoding: 'utf8', maxBuffer: 1 << 24 });
  if (r.status !== 0) throw new Error(`quietgrid ${argv.join(' ')} failed (${r.status}):\n${r.stderr}`);
  return (performance.now() - t0) / 1000;
}

if (!skip.has('sweep')) {
  const dir = mkdtempSync(join(tmpdir(), 'quietgrid-bench-sweep-'));
  try {
    const c: DuctCase = { name: 'sweep', order: 2, topHz: 1000, chamberLength: 2 };
    const freqs = Array.from({ length: 24 }, (_, i) => Math.round(100 * Math.pow(10, i / 23)));
    const file = join(dir, 'sweep.json');
    writeFileSync(file, chamberScenario(c, freqs));
    const dofs = prepareProblem(readScenario(chamberScenario(c, freqs)).scenario, { maxDofs: Infinity }).info.dofs;
    console.error('sweep with 1 and 2 workers …');
    const perFrequency = (out: string) => {
      const t = (JSON.parse(readFileSync(join(out, 'summary.json'), 'utf8')) as { timing: { assemble_s: number; factor_s: number; solve_s: number } }).timing;
      return t.assemble_s + t.factor_s + t.solve_s;
    };
    // Alternate 1 and 2 workers, several rounds: a shared machine drifts by several per cent over a minute,
    // and alternation spreads that drift over both arms instead of loading it onto one.
    const rounds = Number(flag('sweep-rounds')[0] ?? 3);
    if (!(Number.isInteger(rounds) && rounds >= 1)) throw new Error(`--sweep-rounds must be a whole number of rounds, 1 or more (got ${flag('sweep-rounds')[0]})`);
    const runs: { workers: number; wall: number; sum: number }[] = [];
    for (let r = 0; r < rounds; r++) {
      for (const w of [1, 2]) {
        const out = join(dir, `w${w}-${r}`);
        runs.push({ workers: w, wall: cli(['solve', file, '--workers', String(w), '--no-check-order', '--out', out]), sum: perFrequency(out) });
      }
    }
    const ratios = Array.from({ length: rounds }, (_, r) => runs[2 * r].wall / runs[2 * r + 1].wall);
    const median = [...ratios].sort((a, b) => a - b)[Math.floor(rounds / 2)];
    say('## 4. Sweep: 24 frequencies, 1 worker against 2');
    say();
    say(`\`node bin/quietgrid.mjs solve SWEEP.json --workers N --no-check-order\`, wall time of the whole command (start-up, mesh and analysis included); scenario: the chamber of 2 m at order 2, ${dofs} dofs, 24 frequencies 100–1000 Hz. ${rounds} rounds, each a run with 1 worker followed by one with 2. "Σ per frequency" = assembly + factor + solve summed over the frequencies (summary.json timing): when it grows with 2 workers, the two solves slowed each other (shared caches and memory bandwidth, or other work on the cores), not the pool.`);
    say();
    table(['round', 'workers', 'wall s', 'Σ per frequency s', 'speed-up'], runs.map((x, i) => [String(Math.floor(i / 2) + 1), String(x.workers), fmt(x.wall), fmt(x.sum), x.workers === 2 ? fmt(ratios[Math.floor(i / 2)]) : '']));
    say(`Speed-up, median of the ${rounds} rounds: ${fmt(median)} (target ≥ 1.7×: ${median >= 1.7 ? 'met' : 'NOT met'}).`);
    say();
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

// ---- 5: start-up ----
if (!skip.has('startup')) {
  const dir = mkdtempSync(join(tmpdir(), 'quietgrid-bench-start-'));
  try {
    const demos = readdirSync(join(root, 'scenarios')).filter((f) => f.endsWith('.json') && f !== 'schema.json').map((f) => {
      const s = readScenario(readFileSync(join(root, 'scenarios', f), 'utf8')).scenario;
      return { f, work: prepareProblem(s, { maxDofs: Infinity }).info.dofs * s.sweep.frequenciesHz.length };
    }).sort((a, b) => a.work - b.work);
    const demo = demos[0].f;
    const s = readScenario(readFileSync(join(root, 'scenarios', demo), 'utf8')).scenario;
    const f0 = s.sweep.frequenciesHz[0];
    const tOne = cli(['solve', join('scenarios', demo), '--frequencies', String(f0), '--no-check-order', '--workers', '1', '--out', join(dir, 'one')]);
    const tAll = cli(['solve', join('scenarios', demo), '--out', join(dir, 'all')]);
    say('## 5. Start-up');
    say();
    say(`The smallest demo (by dofs × frequencies): scenarios/${demo}. Wall time of \`node bin/quietgrid.mjs solve\`, start to exit, results written.`);
    say();
    table(['run', 'wall s', 'target < 2 s'], [[`one frequency (${f0} Hz), --no-check-order`, fmt(tOne), tOne < 2 ? 'met' : 'NOT met'], [`whole sweep (${s.sweep.frequenciesHz.length} frequencies, defaults)`, fmt(tAll), '']]);
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

// ---- 6: the largest duct in 8 GiB ----
interface SolvedCase { L: number; dofs: number; prepareSeconds: number; assembleSeconds: number; factorSeconds: number; solveSeconds: number; tlDb: number; energyBalance: number; residual: number; peakBytes: number }

function solveCase(order: number, topHz: number, L: number): SolvedCase | string {
  const r = spawnSync(process.execPath, ['--import', 'tsx', join(root, 'bench/solve-case.ts'), String(order), String(topHz), String(L)], { cwd: root, encoding: 'utf8', maxBuffer: 1 << 24 });
  if (r.status !== 0) return `${r.signal ?? `exit ${r.status}`}: ${r.stderr.trim().split('\n').pop() ?? ''}`;
  return { L, ...(JSON.parse(r.stdout.trim().split('\n').pop()!) as Omit<SolvedCase, 'L'>) };
}

if (!skip.has('largest')) {
  const base = FACTOR_CASES[FACTOR_CASES.length - 1];
  /** What one solve holds at its peak: the worker's own estimate (prepared problem, matrix, factor, vectors) and the runtime (this process's resident set before any case: the same Node and modules). */
  const estimate = (L: number) => {
    const i = prepareProblem(readScenario(chamberScenario({ ...base, chamberLength: L })).scenario, { maxDofs: Infinity }).info;
    return { L, dofs: i.dofs, factor: i.memoryEstimateBytes, total: i.workerMemoryBytes + runtimeBytes };
  };
  console.error('largest duct in 8 GiB …');
  const budget = 8 * GIB, tried = [estimate(base.chamberLength), estimate(2 * base.chamberLength)];
  // the duct is elongated, so memory grows linearly with its length: interpolate, then check and step back
  for (let k = 0; k < 3; k++) {
    const [a, b] = tried.slice(-2);
    const L = Math.floor(a.L + ((budget - a.total) * (b.L - a.L)) / (b.total - a.total));
    tried.push(estimate(L * (k === 0 ? 1 : 0.98)));
    if (tried[tried.length - 1].total <= budget) break;
  }
  const fit = tried.filter((t) => t.total <= budget).sort((x, y) => y.L - x.L)[0];
  say('## 6. The longest duct in 8 GiB');
  say();
  say(`Case "${base.name}" (order ${base.order}, ${base.topHz} Hz, 0.5 × 0.4 m chamber) with a longer chamber. Searched with an estimate (\`workerMemoryBytes\` of the summary: the prepared problem's arrays, the matrix values, the factor's symbolic estimate and the solve's vectors; and the runtime's own ${mb(runtimeBytes)} MiB), then the longest that fits solved at ${base.topHz} Hz the way \`quietgrid solve\` does (bench/solve-case.ts, a process of its own), its peak resident set measured from the start of that process; if the peak is over 8 GiB the chamber is shortened by the overshoot and solved again.`);
  say();
  table(['chamber m', 'dofs', 'factor estimate MiB', 'total estimate MiB'], tried.map((t) => [fmt(t.L, 1), String(t.dofs), mb(t.factor), mb(t.total)]));
  const solved: SolvedCase[] = [];
  let L = fit?.L, failure = '';
  for (let attempt = 0; L !== undefined && attempt < 3; attempt++) {
    console.error(`  solving the ${fmt(L, 1)} m chamber …`);
    const s = solveCase(base.order, base.topHz, L);
    if (typeof s === 'string') { failure = s; break; }
    solved.push(s);
    if (s.peakBytes <= budget) break;
    L = Math.floor(10 * L * (budget / s.peakBytes) * 0.99) / 10;
  }
  if (solved.length > 0) {
    table(['chamber m', 'dofs', 'prepare s', 'assemble s', 'factor s', 'solve s', 'TL dB', 'energy balance', 'residual', 'peak resident MiB', 'within 8 GiB'],
      solved.map((s) => [fmt(s.L, 1), String(s.dofs), fmt(s.prepareSeconds), fmt(s.assembleSeconds), fmt(s.factorSeconds), fmt(s.solveSeconds), fmt(s.tlDb), s.energyBalance.toExponential(1), s.residual.toExponential(1), mb(s.peakBytes), s.peakBytes <= budget ? 'yes' : 'no']));
  }
  const best = solved.filter((s) => s.peakBytes <= budget).pop();
  if (best) say(`Largest solved within 8 GiB: a ${fmt(best.L, 1)} m chamber, ${best.dofs} dofs, peak ${mb(best.peakBytes)} MiB.`);
  else say(`No chamber was solved within 8 GiB here${failure ? ` (the solve failed: ${failure})` : ''}.`);
  say();
}

// ---- 7: a splitter silencer by waveguide sections, no 3D mesh ----
if (!skip.has('waveguide')) {
  say('## 7. A splitter silencer by waveguide sections (octave bands 63 Hz – 8 kHz, no 3D mesh)');
  say();
  for (const line of await splitterBench(2, 3)) say(line);
}

say(`Load average at the end: ${loadavg().map((x) => x.toFixed(2)).join(', ')}.`);
const outFile = flag('out')[0] ?? join(root, 'bench/RESULTS.md');
writeFileSync(outFile, `${md.join('\n')}\n`);
console.error(`wrote ${outFile}`);

/**
 * Speed of the sparse direct solver on 3D lattice Helmholtz problems (trilinear hexahedra,
 * 27-point coupling) ordered by lattice nested dissection, and by minimum degree for comparison.
 * Run: npx tsx bench/solver.ts [--amd] [--only=<name>] [--leaf=<size>] [--leafOrder=lattice|minimumDegree]
 * Factor time is printed as wall and CPU seconds: on a shared machine the CPU figure is the stable one.
 */
import { analyze, factor, solve, latticeDissection, minimumDegree, relativeResidual } from '../engine/linalg/index.ts';
import { latticeHelmholtz, randomVector } from '../tests/linalg/problems.ts';

interface Case {
  name: string;
  elements: [number, number, number];
  order: number;
}

const cases: Case[] = [
  { name: 'slab 60×60×14 nodes', elements: [59, 59, 13], order: 1 },
  { name: 'duct 250×25×24 nodes', elements: [249, 24, 23], order: 1 },
  { name: 'order-4 duct 97×25×21 nodes', elements: [24, 6, 5], order: 4 },
];

const args = process.argv.slice(2);
const flag = (name: string): string | undefined => args.find((a) => a.startsWith(`--${name}=`))?.split('=')[1];
const withAmd = args.includes('--amd');
const only = flag('only');
const leafSize = flag('leaf') ? Number(flag('leaf')) : undefined;
const leaf = flag('leafOrder') as 'lattice' | 'minimumDegree' | undefined;

const seconds = (t0: number): number => (performance.now() - t0) / 1000;

function run(c: Case, ordering: 'dissection' | 'minimum degree'): void {
  const P = latticeHelmholtz({ elements: c.elements, order: c.order, h: 0.05 * c.order, k2: { re: 40, im: -0.4 } });
  const nnzA = P.A.rowPtr[P.ndofs];
  let t0 = performance.now();
  const perm = ordering === 'dissection' ? latticeDissection(P.lattice, P.ndofs, { leafSize, leaf }) : minimumDegree(P.A);
  const tOrder = seconds(t0);
  t0 = performance.now();
  const S = analyze(P.A, perm);
  const tAnalyze = seconds(t0);
  t0 = performance.now();
  const cpu0 = process.cpuUsage();
  const N = factor(P.A, S);
  const tFactor = seconds(t0);
  const cpu = process.cpuUsage(cpu0);
  const cpuFactor = (cpu.user + cpu.system) / 1e6;
  const b = randomVector(P.ndofs, 7);
  t0 = performance.now();
  const x = solve(N, b);
  const tSolve = seconds(t0);
  const res = relativeResidual(P.A, x, b);
  console.log(
    [
      `${c.name}, ${ordering}: n = ${P.ndofs}, nnz(A) = ${nnzA}, nnz(L) = ${S.nnzL} (fill ${(S.nnzL / ((nnzA + P.ndofs) / 2)).toFixed(1)}×, stored ${S.storedEntries}),`,
      `  supernodes ${S.nSuper}, largest front ${S.maxFront}, flops ${S.flops.toExponential(3)} (kernels ${S.frontFlops.toExponential(3)}), memory estimate ${(S.memoryBytes / 2 ** 20).toFixed(0)} MiB`,
      `  order ${tOrder.toFixed(2)} s, analyze ${tAnalyze.toFixed(2)} s, factor ${tFactor.toFixed(2)} s wall, ${cpuFactor.toFixed(2)} s cpu (${(S.flops / tFactor / 1e9).toFixed(2)} GFlop/s wall, ${(S.flops / cpuFactor / 1e9).toFixed(2)} cpu), solve ${tSolve.toFixed(3)} s, residual ${res.toExponential(2)}`,
    ].join('\n'),
  );
}

for (const c of cases) {
  if (only && !c.name.startsWith(only)) continue;
  run(c, 'dissection');
  if (withAmd) run(c, 'minimum degree');
}

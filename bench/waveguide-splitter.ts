/**
 * The splitter silencer of our own invention, solved with no 3D mesh (engine/waveguide): a 600 × 600 mm
 * duct, four parallel baffles of 100 mm mineral wool (σ = 20 kPa·s/m², Miki's model) spanning its height,
 * 1.2 m long, with 300 mm of plain duct before and after, anechoic outlet; octave bands 63 Hz – 8 kHz,
 * three points per band, equal-power incidence of every propagating inlet mode.
 *
 *   npx tsx bench/waveguide-splitter.ts [--workers=2] [--points=3]
 *
 * The frequencies are shared among child processes (costliest first, each to the least loaded), so the
 * wall-clock time is the end-to-end figure on this machine: start-up, grids, modes, matching, bands.
 * Prints a markdown section (also returned to bench/run.ts). Timings are recorded, never asserted.
 */
import { spawn } from 'node:child_process';
import { loadavg } from 'node:os';
import { fileURLToPath } from 'node:url';
import { bandTransmissionLoss, sweepFrequencies } from '../engine/acoustics/index.ts';
import type { WaveguideDuct } from '../engine/waveguide/index.ts';

export const SPLITTER_WIDTH = 0.6;

export function splitterDuct(): WaveguideDuct {
  const W = SPLITTER_WIDTH, wool = { model: 'miki' as const, flowResistivity: 20_000 }, outer = { y0: 0, y1: W, z0: 0, z1: W };
  // baffles at a 150 mm pitch: 50 mm airways between them, 25 mm against the walls
  const baffles = [0, 1, 2, 3].map((i) => ({ rect: { y0: 0.025 + 0.15 * i, y1: 0.125 + 0.15 * i, z0: 0, z1: W }, material: wool }));
  return {
    sections: [{ name: 'inlet', length: 0.3, outer, fills: [] }, { name: 'splitters', length: 1.2, outer, fills: baffles }, { name: 'outlet', length: 0.3, outer, fills: [] }],
    air: { density: 1.204, soundSpeed: 343.2 }, termination: 'anechoic', order: 4, pointsPerWavelength: 10, maxFrequencyHz: 11_300,
    incidence: { kind: 'equal-power' },
  };
}

export interface SplitterPoint { frequencyHz: number; tlDb: number; incidentModes: number; channels: number; modes: number[]; truncatedModes: number[]; truncationDb: number; seconds: number; cpuSeconds: number }

function runChild(freqs: number[]): Promise<SplitterPoint[]> {
  const worker = fileURLToPath(new URL('./waveguide-worker.ts', import.meta.url));
  return new Promise((resolve, reject) => {
    const child = spawn(process.execPath, ['--import', 'tsx', worker, freqs.join(',')], { stdio: ['ignore', 'pipe', 'inherit'] });
    let out = '';
    child.stdout.on('data', (d) => { out += d; });
    child.on('exit', (code) => (code === 0 ? resolve(out.trim().split('\n').filter(Boolean).map((l) => JSON.parse(l) as SplitterPoint)) : reject(new Error(`worker exited with ${code}`))));
  });
}

export async function splitterBench(workers: number, pointsPerBand: number): Promise<string[]> {
  const t0 = performance.now();
  const sweep = sweepFrequencies({ fromHz: 63, toHz: 8000, spacing: 'octave', pointsPerBand });
  // cost grows about as f²: hand out the top frequencies first, each to the least loaded process
  const shares: number[][] = Array.from({ length: workers }, () => []), load = new Array(workers).fill(0);
  for (const f of [...sweep.frequenciesHz].sort((a, b) => b - a)) {
    const w = load.indexOf(Math.min(...load));
    shares[w].push(f);
    load[w] += f * f;
  }
  const perProcess = await Promise.all(shares.filter((s) => s.length > 0).map(runChild));
  const points = perProcess.flat().sort((a, b) => a.frequencyHz - b.frequencyHz);
  const cpu = perProcess.map((ps) => ps.reduce((s, p) => s + p.cpuSeconds, 0));
  const wall = (performance.now() - t0) / 1000;
  const bands = bandTransmissionLoss(points.map((p) => p.frequencyHz), points.map((p) => p.tlDb), 1, sweep.bands);
  const md: string[] = [];
  md.push(`Splitter silencer (600 × 600 mm, four 100 mm baffles of σ = 20 kPa·s/m² mineral wool, 1.2 m, 300 mm plain runs), octave bands 63 Hz – 8 kHz, ${pointsPerBand} points per band, equal-power incidence, ${workers} processes: **${wall.toFixed(1)} s end to end** (target: under 300 s on 2 cores); CPU seconds per process ${cpu.map((c) => c.toFixed(1)).join(' and ')} (on an idle machine the end-to-end time is about the larger of them plus start-up; load average at the end ${loadavg()[0].toFixed(2)}).`, '');
  md.push('| band Hz | TL dB | incident modes (top point) | z-orders | modes kept inlet/splitters/outlet (top point) | truncation check modes | worst truncation ΔTL dB | wall s in band | CPU s in band |', '|---|---|---|---|---|---|---|---|---|');
  (sweep.bands ?? []).forEach((band, b) => {
    const mine = points.filter((_, i) => sweep.bandOfPoint![sweep.frequenciesHz.indexOf(points[i].frequencyHz)] === b), top = mine[mine.length - 1];
    md.push(`| ${band.nominalHz} | ${bands[b].valueDb.toFixed(1)} | ${top.incidentModes} | ${top.channels} | ${top.modes.join('/')} | ${top.truncatedModes.join('/')} | ${Math.max(...mine.map((p) => p.truncationDb)).toFixed(3)} | ${mine.reduce((s, p) => s + p.seconds, 0).toFixed(1)} | ${mine.reduce((s, p) => s + p.cpuSeconds, 0).toFixed(1)} |`);
  });
  md.push('', 'The model has no flanking path (casing radiation, regenerated flow noise): a TL far above 50 dB is what the acoustic path alone allows, not what a silencer delivers on site.', '');
  return md;
}

if (process.argv[1] === fileURLToPath(import.meta.url)) {
  const arg = (name: string, d: number) => Number(process.argv.find((a) => a.startsWith(`--${name}=`))?.split('=')[1] ?? d);
  splitterBench(arg('workers', 2), arg('points', 3)).then((md) => console.log(md.join('\n')));
}

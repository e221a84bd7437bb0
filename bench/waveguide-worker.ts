/** Child process of bench/waveguide-splitter.ts: solves the splitter at the frequencies given, one JSON line per point. */
import { prepareWaveguide, solveWaveguideAt } from '../engine/waveguide/index.ts';
import { splitterDuct, type SplitterPoint } from './waveguide-splitter.ts';

const prep = prepareWaveguide(splitterDuct());
for (const f of process.argv[2].split(',').map(Number)) {
  const t0 = performance.now(), c0 = process.cpuUsage(), r = solveWaveguideAt(prep, f, () => performance.now()), cpu = process.cpuUsage(c0);
  const point: SplitterPoint = {
    frequencyHz: f, tlDb: r.tlDb!, incidentModes: r.incidentModes, channels: r.channels, modes: r.sections.map((s) => s.modes),
    truncatedModes: r.sections.map((s) => s.truncatedModes), truncationDb: r.truncationDb, seconds: (performance.now() - t0) / 1000, cpuSeconds: (cpu.user + cpu.system) / 1e6,
  };
  console.log(JSON.stringify(point));
}

// Invalid input: exit status 2 and a message that names what to change.
import { describe, expect, it, beforeAll, afterAll } from 'vitest';
import { mkdtempSync, readFileSync, rmSync, writeFileSync, existsSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { ROOT, quietgrid } from './helpers.ts';

const PLANT = 'scenarios/plant-room-supply-silencer.json';
let tmp: string;
beforeAll(() => { tmp = mkdtempSync(join(tmpdir(), 'quietgrid-err-')); });
afterAll(() => rmSync(tmp, { recursive: true, force: true }));

function variant(name: string, edit: (s: { duct: { sections: { length: number }[] } }) => void): string {
  const s = JSON.parse(readFileSync(join(ROOT, PLANT), 'utf8'));
  edit(s);
  const path = join(tmp, name);
  writeFileSync(path, JSON.stringify(s));
  return path;
}

describe('quietgrid, invalid input', () => {
  it('a missing scenario file: exit 2, the path named', async () => {
    const run = await quietgrid('solve', join(tmp, 'absent.json'), '--out', join(tmp, 'x'));
    expect(run.code).toBe(2);
    expect(run.stderr).toMatch(/absent\.json: no such file/);
    expect(existsSync(join(tmp, 'x'))).toBe(false);
  });

  it('text that is not JSON: exit 2 with line and column', async () => {
    const path = join(tmp, 'text.json');
    writeFileSync(path, '{"format": "quietgrid/1",\n  sweep: 3}');
    const run = await quietgrid('solve', path);
    expect(run.code).toBe(2);
    expect(run.stderr).toMatch(/line 2, column 3/);
  });

  it('a negative section length: exit 2, the field path and the fix', async () => {
    const path = variant('negative.json', (s) => { s.duct.sections[0].length = -0.4; });
    for (const command of ['solve', 'validate']) {
      const run = await quietgrid(command, path);
      expect(run.code).toBe(2);
      expect(run.stderr).toContain('duct.sections[0].length = -0.4');
      expect(run.stderr).toMatch(/fix: /);
    }
  });

  it('an unknown option, a missing value, a bad frequency list: exit 2', async () => {
    const cases: [string[], RegExp][] = [
      [['solve', PLANT, '--bogus'], /unknown option --bogus/],
      [['solve', PLANT, '--out'], /option --out needs a value/],
      [['solve', PLANT, '--frequencies', '100,abc'], /"abc" is not a number/],
      [['solve', PLANT, '--frequencies', '100,,200'], /empty entry/],
      [['solve', PLANT, '--frequencies=-5'], /-5 is not a frequency/],
      [['solve', PLANT, '--frequencies', '-5'], /write --frequencies=VALUE/],
      [['solve', PLANT, '--help=yes'], /option --help takes no value/],
      [['solve', PLANT, '--workers', '0'], /--workers/],
      [['solve'], /needs a scenario file/],
      [['frobnicate'], /unknown command "frobnicate"/],
      [['export-system', PLANT, '--out', join(tmp, 'A.mtx')], /--frequency HZ is required/],
      [['import-solution', PLANT, '--frequency', '100'], /--solution X\.mtx is required/],
    ];
    for (const [args, message] of cases) {
      const run = await quietgrid(...args);
      expect(run.code, args.join(' ')).toBe(2);
      expect(run.stderr, args.join(' ')).toMatch(message);
    }
  });

  it('a frequency above the top of the sweep is refused, naming that top', async () => {
    const run = await quietgrid('solve', PLANT, '--frequencies', '100,2000', '--out', join(tmp, 'y'));
    expect(run.code).toBe(2);
    expect(run.stderr).toMatch(/2000 Hz is above 630\.957 Hz, the top of the scenario's sweep/);
  });
});

describe('quietgrid validate and help', () => {
  it('validate prints ok and the defaults used', async () => {
    const run = await quietgrid('validate', PLANT);
    expect(run.code).toBe(0);
    expect(run.stdout).toMatch(/^ok: /);
    expect(run.stdout).toMatch(/air\.soundSpeed = /);
  });

  it('--help for the program and each command; exit 0', async () => {
    const top = await quietgrid('--help');
    expect(top.code).toBe(0);
    for (const command of ['solve', 'validate', 'export-system', 'import-solution', 'verify']) {
      expect(top.stdout).toContain(command);
      const run = await quietgrid(command, '--help');
      expect(run.code).toBe(0);
      expect(run.stdout).toMatch(new RegExp(`^Usage: quietgrid ${command} `));
    }
    expect((await quietgrid('solve', '--help')).stdout).toMatch(/graded for the top of the scenario's own sweep/);
  });
});

describe('quietgrid solve, a frequency that fails', () => {
  it('exits 1 naming the frequency, and still writes the frequencies that finished', async () => {
    // A (1, 0) mode sent into a 0.5 m wide inlet carries nothing below its cut-on, 343 Hz: 200 Hz cannot be solved, 450 Hz can.
    const path = join(tmp, 'cross-mode.json'), dir = join(tmp, 'cross-mode');
    writeFileSync(path, JSON.stringify({
      format: 'quietgrid/1', sweep: { frequenciesHz: [200, 450] }, mesh: { order: 3, pointsPerWavelength: 5 },
      duct: { sections: [{ name: 'a', length: 0.3, width: 0.5, height: 0.1 }, { name: 'b', length: 0.3, width: 0.5, height: 0.1 }], incident: { mode: [1, 0] } },
    }));
    const run = await quietgrid('solve', path, '--out', dir);
    expect(run.code).toBe(1);
    expect(run.stderr).toMatch(/the solve failed at 200 Hz: .*does not propagate/);
    const rows = readFileSync(join(dir, 'spectrum.csv'), 'utf8').trim().split('\r\n');
    expect(rows).toHaveLength(2);
    expect(rows[1]).toMatch(/^450,/);
    const summary = JSON.parse(readFileSync(join(dir, 'summary.json'), 'utf8'));
    expect(summary.failures.map((f: { frequencyHz: number }) => f.frequencyHz)).toEqual([200]);
    expect(summary.frequenciesHz).toEqual([200, 450]);
  });
});

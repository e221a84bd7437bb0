// The layer rules live in eslint.config.js: each engine folder imports only the folders before it, the app's
// renderer thread only the engine's light modules, Electron's main and preload never the renderer. Here ESLint
// is run on deliberately wrong imports (they must fail, with a message that says what to use instead) and on
// right ones (they must pass); DEVELOPERS.md's layout table must say what the config enforces; and the
// engine's imports must form no circle.
import { describe, expect, it } from 'vitest';
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { dirname, join, relative, resolve } from 'node:path';
import { ESLint } from 'eslint';
import { ENGINE_LAYERS } from '../../eslint.config.js';
import { ROOT } from '../cli/helpers.ts';

const eslint = new ESLint({ cwd: ROOT });

/** The layer rule's messages for `code` as if it were the file at `path` (the file need not exist). */
async function layerMessages(code: string, path: string): Promise<string[]> {
  const [result] = await eslint.lintText(code, { filePath: join(ROOT, path) });
  return result.messages.filter((m) => m.ruleId === '@typescript-eslint/no-restricted-imports').map((m) => m.message);
}

describe('layer rules', () => {
  it('refuse an engine folder importing one after it, and say what to use instead', async () => {
    const wrong = await layerMessages("import { prepareProblem } from '../solve/prepare.ts';\nexport const p = prepareProblem;\n", 'engine/report/wrong.ts');
    expect(wrong).toHaveLength(1);
    expect(wrong[0]).toMatch(/engine\/report may import core, acoustics \(DEVELOPERS\.md, Layout\), not engine\/solve: declare the shape you read structurally/);
    expect(await layerMessages("import { solveAndAssess } from '../sweep/job.ts';\nexport const s = solveAndAssess;\n", 'engine/solve/wrong.ts')).toEqual([expect.stringMatching(/not engine\/sweep: a problem does not know who schedules it/)]);
    expect(await layerMessages("import { readFile } from 'node:fs/promises';\nexport const r = readFile;\n", 'engine/sweep/wrong.ts')).toEqual([expect.stringMatching(/Node APIs belong in engine\/node/)]);
    expect(await layerMessages("import type { Grid } from '../grid/grid.ts';\nexport type G = Grid;\n", 'engine/core/wrong.ts')).toEqual([expect.stringMatching(/engine\/core may import nothing of the engine/)]);
  });

  it('let an engine folder import the folders before it', async () => {
    expect(await layerMessages("import { splDb } from '../core/levels.ts';\nimport { prepareProblem } from '../solve/prepare.ts';\nexport const x = [splDb, prepareProblem];\n", 'engine/sweep/right.ts')).toEqual([]);
    expect(await layerMessages("import { readFile } from 'node:fs/promises';\nimport { runSweep } from '../sweep/scheduler.ts';\nexport const x = [readFile, runSweep];\n", 'engine/node/right.ts')).toEqual([]);
  });

  it('keep the renderer thread light: the numerics only as types, the worker only through new Worker()', async () => {
    const heavy = "import { DuctProblem } from '../../../engine/solve/duct.ts';\nexport const d = DuctProblem;\n";
    expect(await layerMessages(heavy, 'app/renderer/model/wrong.ts')).toEqual([expect.stringMatching(/the renderer thread does not prepare or solve problems: the engine worker does/)]);
    expect(await layerMessages("import type { DuctProblem } from '../../../engine/solve/duct.ts';\nexport type D = DuctProblem;\n", 'app/renderer/model/right.ts')).toEqual([]);
    expect(await layerMessages("import { estimateSize } from '../../../engine/solve/size.ts';\nimport { runSweep } from '../../../engine/sweep/scheduler.ts';\nexport const x = [estimateSize, runSweep];\n", 'app/renderer/model/right.ts')).toEqual([]);
    expect(await layerMessages("import { createWorkerJob } from '../../../engine/sweep/job.ts';\nexport const j = createWorkerJob;\n", 'app/renderer/services/wrong.ts')).toEqual([expect.stringMatching(/runs in the engine worker/)]);
    expect(await layerMessages("import '../engine.worker.ts';\n", 'app/renderer/services/wrong.ts')).toEqual([expect.stringMatching(/reached only through new Worker/)]);
    // the engine worker itself is the one place the job runs
    expect(await layerMessages("import { createWorkerJob } from '../../engine/sweep/job.ts';\nexport const j = createWorkerJob;\n", 'app/renderer/engine.worker.ts')).toEqual([]);
    expect(readFileSync(join(ROOT, 'app/renderer/main.tsx'), 'utf8')).toContain("new Worker(new URL('./engine.worker.ts', import.meta.url), { type: 'module'");
  });

  it('keep Electron\'s main and preload away from the renderer', async () => {
    expect(await layerMessages("import { App } from '../renderer/components/App.tsx';\nexport const a = App;\n", 'app/main/wrong.ts')).toEqual([expect.stringMatching(/over the IPC channels of app\/shared\/bridge\.ts/)]);
    expect(await layerMessages("import { readFileSync } from 'node:fs';\nexport const r = readFileSync;\n", 'app/preload/wrong.ts')).toEqual([expect.stringMatching(/imports nothing but electron and \.\.\/shared\/bridge\.ts/)]);
    expect(await layerMessages("import { contextBridge } from 'electron';\nimport { CHANNELS } from '../shared/bridge.ts';\nexport const x = [contextBridge, CHANNELS];\n", 'app/preload/right.ts')).toEqual([]);
  });
});

describe('DEVELOPERS.md', () => {
  it('lists every engine folder with what it may import, as the lint config enforces it', () => {
    const text = readFileSync(join(ROOT, 'DEVELOPERS.md'), 'utf8');
    const rows = [...text.matchAll(/^\| `engine\/(\w+)` \| [^|]+ \| ([^|]+) \|$/gm)].map((m) => [m[1], m[2].trim()]);
    const table = Object.fromEntries(rows.map(([folder, may]) => [folder, may === 'nothing' ? [] : may.split(',').map((s) => s.trim())]));
    expect(table).toEqual(ENGINE_LAYERS);
    // and the folders on disk are those of the table
    const folders = readdirSync(join(ROOT, 'engine')).filter((f) => statSync(join(ROOT, 'engine', f)).isDirectory()).sort();
    expect(folders).toEqual(Object.keys(ENGINE_LAYERS).sort());
  });
});

describe('the engine\'s imports', () => {
  it('form no circle', () => {
    const files: string[] = [];
    const walk = (d: string) => { for (const n of readdirSync(d)) { const p = join(d, n); if (statSync(p).isDirectory()) walk(p); else if (p.endsWith('.ts')) files.push(p); } };
    walk(join(ROOT, 'engine'));
    const graph = new Map(files.map((f) => [f, [...readFileSync(f, 'utf8').matchAll(/(?:import|export)\s[^'"]*?from\s+'(\.[^']+)'/g)].map((m) => resolve(dirname(f), m[1]))]));
    const state = new Map<string, 1 | 2>(), stack: string[] = [], circles: string[] = [];
    const visit = (n: string) => {
      state.set(n, 1);
      stack.push(n);
      for (const d of graph.get(n) ?? []) {
        if (state.get(d) === 1) circles.push(stack.slice(stack.indexOf(d)).concat(d).map((x) => relative(ROOT, x)).join(' → '));
        else if (!state.has(d)) visit(d);
      }
      stack.pop();
      state.set(n, 2);
    };
    for (const n of graph.keys()) if (!state.has(n)) visit(n);
    expect(graph.size).toBeGreaterThan(80);
    expect(circles).toEqual([]);
  });
});

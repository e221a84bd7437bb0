// Layer rules of the app (as the engine's are in eslint.config.js): the renderer's own thread uses the
// engine's light, pure parts only (validation, geometry, report tables, acoustics); the numerics (mesh,
// assembly, factorisation, solves) run in the engine worker alone. Main and preload never import the renderer.
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';

const APP = fileURLToPath(new URL('../../app/', import.meta.url));

function files(dir: string): string[] {
  return readdirSync(dir).flatMap((n) => {
    const p = join(dir, n);
    return statSync(p).isDirectory() ? files(p) : /\.tsx?$/.test(n) && !n.endsWith('.d.ts') ? [p] : [];
  });
}

/** Value imports (not `import type`) of a file: the module specifiers. */
function valueImports(file: string): string[] {
  const text = readFileSync(file, 'utf8');
  return [...text.matchAll(/^import\s+(?!type\s)[^'"]*?from\s+'([^']+)'/gm), ...text.matchAll(/import\('([^']+)'\)/g)].map((m) => m[1]);
}

const WORKER_SIDE = ['renderer/engine.worker.ts'];
const LIGHT_ENGINE = [/engine\/core\//, /engine\/scenario\//, /engine\/report\//, /engine\/acoustics\//, /engine\/solve\/size\.ts$/, /engine\/sweep\/(protocol|scheduler|record|plan)\.ts$/];

describe('app layers', () => {
  it('the renderer thread imports only the engine\'s pure light modules', () => {
    const offending: string[] = [];
    for (const f of files(join(APP, 'renderer'))) {
      const rel = relative(APP, f).split('\\').join('/');
      if (WORKER_SIDE.some((w) => rel.startsWith(w))) continue;
      for (const spec of valueImports(f)) if (spec.includes('engine/') && !LIGHT_ENGINE.some((r) => r.test(spec))) offending.push(`${rel} → ${spec}`);
    }
    expect(offending).toEqual([]);
  });
  it('the worker side is reached only through new Worker(), never imported by the renderer thread', () => {
    const importers = files(join(APP, 'renderer')).filter((f) => valueImports(f).some((s) => /engine\.worker|sweep\/job/.test(s)));
    expect(importers.map((f) => relative(APP, f))).toEqual([join('renderer', 'engine.worker.ts')]);
    expect(readFileSync(join(APP, 'renderer/main.tsx'), 'utf8')).toContain("new Worker(new URL('./engine.worker.ts', import.meta.url), { type: 'module'");
  });
  it('main and preload do not import the renderer; the preload imports nothing but electron and the bridge', () => {
    for (const f of [...files(join(APP, 'main')), ...files(join(APP, 'preload'))]) {
      for (const spec of valueImports(f)) expect(spec, relative(APP, f)).not.toMatch(/renderer|react/);
    }
    expect(valueImports(join(APP, 'preload/preload.ts')).sort()).toEqual(['../shared/bridge.ts', 'electron']);
  });
});

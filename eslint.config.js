// Layer rules. The engine's folders form one order (ENGINE_LAYERS, the "may import" column of DEVELOPERS.md's
// layout table, which tests/lint/layers.test.ts holds to this file): each may import only the folders listed
// for it. The engine is a library that the app and the CLI call; it calls neither. The app's renderer thread
// stays light (the numerics run in its engine worker), and Electron's main and preload never reach the renderer.
// Every message says what to use instead.
import tseslint from 'typescript-eslint';

/** Each engine folder and the engine folders it may import, in dependency order. */
export const ENGINE_LAYERS = {
  core: [],
  fe: ['core'],
  linalg: ['core'],
  grid: ['core', 'fe'],
  assembly: ['core', 'fe', 'grid', 'linalg'],
  acoustics: ['core'],
  spectrum: ['core', 'acoustics'],
  waveguide: ['core', 'fe', 'linalg', 'grid', 'acoustics'],
  scenario: ['core', 'acoustics'],
  report: ['core', 'acoustics'],
  solve: ['core', 'fe', 'linalg', 'grid', 'assembly', 'acoustics', 'spectrum', 'waveguide', 'scenario', 'report'],
  sweep: ['core', 'fe', 'linalg', 'grid', 'assembly', 'acoustics', 'spectrum', 'waveguide', 'scenario', 'report', 'solve'],
  node: ['core', 'fe', 'linalg', 'grid', 'assembly', 'acoustics', 'spectrum', 'waveguide', 'scenario', 'report', 'solve', 'sweep'],
};

/** What a folder that may not import `target` should do instead. */
const INSTEAD = {
  core: 'core is imported by every folder: if this fails, the folder is misnamed',
  fe: 'take the element matrices or basis values as data from the caller',
  linalg: 'take the matrix or vector as data (engine/core ComplexVector); factor and solve in engine/solve',
  grid: 'take the mesh as data, or build the grid in engine/solve',
  assembly: 'assemble in engine/solve, which owns a problem\'s decisions, and pass the result in',
  acoustics: 'put the closed form or the shared shape in engine/acoustics or engine/core, or take the value as an argument',
  spectrum: 'hand the solved points to engine/spectrum from the sweep (engine/sweep) or a host, and take its band values back as data',
  waveguide: 'build waveguide sections in engine/solve, where a problem composes them, and pass their results in as data',
  scenario: 'take the few values needed as arguments or declare a structural type (as engine/report does); engine/solve/prepare.ts is the one reader of a scenario for the solver',
  report: 'return plain data and let the host build the report (engine/sweep/record.ts reportInput)',
  solve: 'declare the shape you read structurally (as ReportMeshInfo) or take plain data; problems are used by engine/sweep, engine/node and the hosts',
  sweep: 'a problem does not know who schedules it: return values, and let engine/sweep (job.ts, scheduler.ts) call you',
  node: 'Node APIs stay in engine/node: take what you need (a clock, a file\'s text, a worker port) as an argument',
};

const FOLDERS = Object.keys(ENGINE_LAYERS);

/** Matches an import of engine folder `f` from anywhere (../f/x.ts, ../../engine/f/x.ts). */
const folderImport = (f) => `(^|/)${f}/`;

const ENGINE_FOREIGN = [
  { regex: '(^|/)app/', message: 'engine/ must not import from app/: move the shared type into engine/ and let the app import it.' },
  { group: ['electron', 'electron/*'], message: 'engine/ must not use Electron: the app reaches the engine through its Web Worker (app/renderer/engine.worker.ts).' },
  { group: ['react', 'react-dom', 'plotly.js-dist-min'], message: 'engine/ is UI-free: return plain data and let app/renderer draw it.' },
];
const NODE_BUILTINS = { group: ['node:*', 'fs', 'path', 'os', 'worker_threads', 'child_process'], message: 'Node APIs belong in engine/node/ adapters; keep the rest of engine/ portable (it also runs in a Web Worker).' };

function engineRules(folder) {
  const forbidden = FOLDERS.filter((f) => f !== folder && !ENGINE_LAYERS[folder].includes(f));
  const patterns = [
    ...ENGINE_FOREIGN,
    ...(folder === 'node' ? [] : [NODE_BUILTINS]),
    ...forbidden.map((f) => ({
      regex: folderImport(f),
      message: `engine/${folder} may import ${ENGINE_LAYERS[folder].length ? ENGINE_LAYERS[folder].join(', ') : 'nothing of the engine'} (DEVELOPERS.md, Layout), not engine/${f}: ${INSTEAD[f]}.`,
    })),
  ];
  return { files: [`engine/${folder}/**/*.ts`], rules: { '@typescript-eslint/no-restricted-imports': ['error', { patterns }] } };
}

/** The engine modules the renderer's own thread may run: light, without meshes, matrices or factors. */
const RENDERER_HEAVY = [
  { regex: 'engine/(fe|grid|linalg|assembly|node)/', message: 'the renderer thread stays light: the numerics run in the engine worker; send it a message (engine/sweep/protocol.ts) or import only a type (import type).' },
  { regex: 'engine/solve/(?!size\\.ts$)', message: 'the renderer thread does not prepare or solve problems: the engine worker does (engine/sweep/protocol.ts); import only a type (import type), or engine/solve/size.ts for the quick size estimate.' },
  { regex: 'engine/sweep/job\\.ts$', message: 'the worker side of the sweep runs in the engine worker (app/renderer/engine.worker.ts), never in the renderer thread: use engine/sweep/scheduler.ts with workers from new Worker().' },
  { regex: '(^|/)engine\\.worker(\\.ts)?$', message: 'the engine worker is reached only through new Worker(new URL(\'./engine.worker.ts\', import.meta.url), { type: \'module\' }), never imported.' },
];

export default tseslint.config(
  { ignores: ['node_modules/**', 'dist/**', 'out/**', 'tests/e2e/screens/**', 'coverage/**'] },
  ...tseslint.configs.recommended,
  {
    rules: {
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_' }],
      '@typescript-eslint/no-non-null-assertion': 'off',
    },
  },
  ...FOLDERS.map(engineRules),
  {
    files: ['engine/**/*.ts'],
    ignores: ['engine/node/**'],
    rules: {
      'no-restricted-globals': ['error',
        { name: 'window', message: 'engine/ has no DOM: pass what you need in as data.' },
        { name: 'document', message: 'engine/ has no DOM: pass what you need in as data.' },
        { name: 'process', message: 'engine/ has no Node process: take options as arguments; Node adapters go in engine/node/.' },
        { name: 'require', message: 'Use ES module imports.' },
      ],
    },
  },
  {
    files: ['app/renderer/**/*.{ts,tsx}'],
    ignores: ['app/renderer/engine.worker.ts'],
    rules: { '@typescript-eslint/no-restricted-imports': ['error', { patterns: RENDERER_HEAVY.map((p) => ({ ...p, allowTypeImports: true })) }] },
  },
  {
    files: ['app/main/**/*.ts'],
    rules: {
      '@typescript-eslint/no-restricted-imports': ['error', { patterns: [
        { regex: '(^|/)renderer/|^react', message: 'Electron\'s main process does not import the renderer: talk to it over the IPC channels of app/shared/bridge.ts.' },
      ] }],
    },
  },
  {
    files: ['app/preload/**/*.ts'],
    rules: {
      '@typescript-eslint/no-restricted-imports': ['error', { patterns: [
        { regex: '^(?!electron$|\\.\\./shared/bridge\\.ts$)', message: 'the preload imports nothing but electron and ../shared/bridge.ts: it only exposes the bridge\'s channels (contextBridge).' },
      ] }],
    },
  },
);

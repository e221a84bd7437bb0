// Layer rules: the engine is a library that the app and the CLI call; it calls neither.
import tseslint from 'typescript-eslint';

const engineRestrictions = {
  patterns: [
    { group: ['**/app/**', '../app/*', '../../app/*'], message: 'engine/ must not import from app/: move the shared type into engine/ and let the app import it.' },
    { group: ['electron', 'electron/*'], message: 'engine/ must not use Electron: the app reaches the engine through its Web Worker (app/renderer/worker).' },
    { group: ['react', 'react-dom', 'plotly.js-dist-min'], message: 'engine/ is UI-free: return plain data and let app/renderer draw it.' },
    { group: ['node:*', 'fs', 'path', 'os', 'worker_threads', 'child_process'], message: 'Node APIs belong in engine/node/ adapters; keep the rest of engine/ portable (it also runs in a Web Worker).' },
  ],
};

export default tseslint.config(
  { ignores: ['node_modules/**', 'dist/**', 'out/**', 'tests/e2e/screens/**', 'coverage/**'] },
  ...tseslint.configs.recommended,
  {
    rules: {
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_' }],
      '@typescript-eslint/no-non-null-assertion': 'off',
    },
  },
  {
    files: ['engine/**/*.ts'],
    ignores: ['engine/node/**'],
    rules: {
      'no-restricted-imports': ['error', engineRestrictions],
      'no-restricted-globals': ['error',
        { name: 'window', message: 'engine/ has no DOM: pass what you need in as data.' },
        { name: 'document', message: 'engine/ has no DOM: pass what you need in as data.' },
        { name: 'process', message: 'engine/ has no Node process: take options as arguments; Node adapters go in engine/node/.' },
        { name: 'require', message: 'Use ES module imports.' },
      ],
    },
  },
);

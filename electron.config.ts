/**
 * The Electron build and packaging settings.
 *
 * Build: plain `vite build` in SSR mode (electron-vite needs the electron package even to build), once
 * per entry because a sandboxed preload must be a single CommonJS file that requires nothing but
 * 'electron':
 *   vite build -c electron.config.ts --mode main      → dist/electron/main.cjs
 *   vite build -c electron.config.ts --mode preload   → dist/electron/preload.cjs
 * Electron and Node's built-ins stay external; everything else (app/shared, engine/node/files) is bundled.
 * The renderer is built separately by app/vite.config.ts into dist/renderer.
 *
 * Packaging: `packaging` below is the configuration for a packager such as electron-builder (not
 * installed here; add it as a dev dependency to produce installers).
 */
import { builtinModules } from 'node:module';
import { fileURLToPath } from 'node:url';
import { defineConfig } from 'vite';

const here = (p: string) => fileURLToPath(new URL(p, import.meta.url));

const ENTRIES = {
  main: here('./app/main/main.ts'),
  preload: here('./app/preload/preload.ts'),
} as const;

export const EXTERNAL = ['electron', /^electron\/.*/, ...builtinModules, ...builtinModules.map((m) => `node:${m}`)];

export const packaging = {
  appId: 'org.quietgrid.desktop',
  productName: 'quietgrid',
  copyright: 'quietgrid authors',
  directories: { output: 'out/packages', buildResources: 'assets' },
  files: ['dist/electron/**', 'dist/renderer/**', 'assets/icon.png', 'assets/icon.svg', 'package.json'],
  extraMetadata: { main: 'dist/electron/main.cjs' },
  asar: true,
  linux: { target: ['AppImage', 'deb'], category: 'Science', icon: 'assets/icon.png' },
  win: { target: ['nsis'], icon: 'assets/icon.png' },
  mac: { target: ['dmg'], category: 'public.app-category.developer-tools', icon: 'assets/icon.png', hardenedRuntime: true },
  fileAssociations: [{ ext: 'json', name: 'quietgrid scenario', role: 'Editor' }],
} as const;

export default defineConfig(({ mode }) => {
  const entry = mode === 'preload' ? 'preload' : 'main';
  return {
    publicDir: false,
    build: {
      ssr: ENTRIES[entry],
      outDir: here('./dist/electron'),
      // The two builds share the folder: the second must not delete the first.
      emptyOutDir: false,
      target: 'node20',
      minify: false,
      sourcemap: false,
      rollupOptions: {
        external: EXTERNAL,
        output: { format: 'cjs', entryFileNames: `${entry}.cjs`, inlineDynamicImports: true },
      },
    },
    ssr: { noExternal: true, external: ['electron'] },
  };
});

/**
 * The renderer build: app/renderer → dist/renderer, relative asset paths (it is loaded from the Electron
 * app's own scheme or from a local server), module workers. `vite` in dev mode drops the page's CSP
 * meta, since the dev server's client injects inline scripts; the built page keeps it. Both servers send the
 * cross-origin isolation headers the app's scheme sends (app/main/security.ts), so that workers may share memory.
 */
import { fileURLToPath } from 'node:url';
import { defineConfig, type Plugin } from 'vite';
import react from '@vitejs/plugin-react';
import { ISOLATION_HEADERS } from './main/security.ts';

const here = (p: string) => fileURLToPath(new URL(p, import.meta.url));

function devWithoutCsp(): Plugin {
  return {
    name: 'quietgrid-dev-csp',
    apply: 'serve',
    transformIndexHtml: (html) => html.replace(/\s*<meta http-equiv="Content-Security-Policy"[^>]*>/, ''),
  };
}

export default defineConfig({
  root: here('./renderer'),
  base: './',
  publicDir: false,
  plugins: [react(), devWithoutCsp()],
  worker: { format: 'es' },
  build: {
    outDir: here('../dist/renderer'),
    emptyOutDir: true,
    target: 'es2022',
    sourcemap: false,
    // plotly.js is one large module, loaded on demand.
    chunkSizeWarningLimit: 5000,
  },
  server: { fs: { allow: [here('..')] }, headers: { ...ISOLATION_HEADERS } },
  preview: { strictPort: false, headers: { ...ISOLATION_HEADERS } },
});

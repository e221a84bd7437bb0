/**
 * What the end-to-end tests need: the renderer built by vite into a temporary folder, a tiny static
 * server for it on localhost, and Debian's Chromium driven by playwright-core (never a downloaded browser).
 */
import { createServer, type Server } from 'node:http';
import { readFile, stat } from 'node:fs/promises';
import { extname, join, normalize, sep } from 'node:path';
import { fileURLToPath } from 'node:url';
import { chromium, type Browser } from 'playwright-core';
import { ISOLATION_HEADERS } from '../../app/main/security.ts';

export const REPO = fileURLToPath(new URL('../../', import.meta.url));
export const CHROMIUM = '/usr/bin/chromium';
export const CHROMIUM_ARGS = ['--headless', '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'];

/** Builds the renderer with the app's own vite config into outDir. */
export async function buildRenderer(outDir: string): Promise<void> {
  const { build } = await import('vite');
  await build({ configFile: join(REPO, 'app/vite.config.ts'), logLevel: 'warn', build: { outDir, emptyOutDir: true } });
}

const TYPES: Record<string, string> = {
  '.html': 'text/html; charset=utf-8', '.js': 'text/javascript; charset=utf-8', '.css': 'text/css; charset=utf-8',
  '.svg': 'image/svg+xml', '.png': 'image/png', '.json': 'application/json', '.woff2': 'font/woff2',
};

/** Serves the folder on 127.0.0.1 at a free port; only files inside it, GET only; with the app's cross-origin isolation headers, as vite preview and the app's scheme send them. */
export async function serveFolder(root: string): Promise<{ url: string; close(): Promise<void> }> {
  const base = normalize(root + sep);
  const server: Server = createServer((req, res) => {
    void (async () => {
      const path = decodeURIComponent(new URL(req.url ?? '/', 'http://localhost').pathname);
      const file = normalize(join(base, path.endsWith('/') ? `${path}index.html` : path));
      if (req.method !== 'GET' || !file.startsWith(base)) { res.writeHead(404).end(); return; }
      try {
        if (!(await stat(file)).isFile()) throw new Error('not a file');
        res.writeHead(200, { 'content-type': TYPES[extname(file)] ?? 'application/octet-stream', 'cache-control': 'no-store', ...ISOLATION_HEADERS });
        res.end(await readFile(file));
      } catch {
        res.writeHead(404).end();
      }
    })();
  });
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  const address = server.address();
  const port = typeof address === 'object' && address ? address.port : 0;
  return { url: `http://127.0.0.1:${port}/`, close: () => new Promise((resolve) => server.close(() => resolve())) };
}

export function launchChromium(): Promise<Browser> {
  return chromium.launch({ executablePath: CHROMIUM, args: CHROMIUM_ARGS, headless: true });
}

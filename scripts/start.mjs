#!/usr/bin/env node
/**
 * npm start: the desktop app.
 *
 * With Electron installed (require.resolve('electron') succeeds): builds the renderer and the main and
 * preload bundles, then opens the Electron window. Without it: builds the renderer and serves it on
 * localhost (vite preview), prints the address and opens the default browser when there is one.
 *
 *   npm start              build and run
 *   npm start -- --dev     browser mode with the vite dev server (hot reload) instead of a build
 *   npm start -- --port N  serve on port N (default 5178, or the next free one)
 *   npm start -- --no-open do not open a browser
 */
import { spawn } from 'node:child_process';
import { createRequire } from 'node:module';
import { fileURLToPath } from 'node:url';

const root = fileURLToPath(new URL('..', import.meta.url));
const require = createRequire(import.meta.url);
const args = process.argv.slice(2);
const dev = args.includes('--dev');
const noOpen = args.includes('--no-open');
const portArg = args.indexOf('--port');
const port = portArg >= 0 ? Number(args[portArg + 1]) : 5178;

function electronBinary() {
  try {
    require.resolve('electron');
    // In Node, the electron package exports the path of its binary.
    const bin = require('electron');
    return typeof bin === 'string' ? bin : null;
  } catch {
    return null;
  }
}

/** Opens the address in the default browser if the system has an opener; never fails. */
function openBrowser(url) {
  if (noOpen) return;
  const [cmd, cmdArgs] = process.platform === 'darwin' ? ['open', [url]] : process.platform === 'win32' ? ['cmd', ['/c', 'start', '', url]] : ['xdg-open', [url]];
  try {
    const child = spawn(cmd, cmdArgs, { stdio: 'ignore', detached: true });
    child.on('error', () => console.log('(No browser could be opened from here; open the address yourself.)'));
    child.unref();
  } catch {
    console.log('(No browser could be opened from here; open the address yourself.)');
  }
}

async function buildRenderer(vite) {
  console.log('Building the app…');
  await vite.build({ configFile: `${root}app/vite.config.ts`, logLevel: 'warn' });
}

async function main() {
  const vite = await import('vite');
  const bin = electronBinary();
  if (bin && !dev) {
    await buildRenderer(vite);
    for (const mode of ['main', 'preload']) await vite.build({ configFile: `${root}electron.config.ts`, mode, logLevel: 'warn' });
    const child = spawn(bin, [`${root}dist/electron/main.cjs`], { stdio: 'inherit', cwd: root });
    child.on('exit', (code) => process.exit(code ?? 0));
    return;
  }
  let server;
  if (dev) {
    server = await vite.createServer({ configFile: `${root}app/vite.config.ts`, server: { port, host: '127.0.0.1' } });
    await server.listen();
  } else {
    await buildRenderer(vite);
    server = await vite.preview({ configFile: `${root}app/vite.config.ts`, preview: { port, host: '127.0.0.1' } });
  }
  const url = server.resolvedUrls?.local?.[0] ?? `http://localhost:${port}/`;
  console.log(`${bin ? 'Dev mode' : 'Electron is not installed here'}; serving the app at ${url} — open it in a browser`);
  console.log('Press Ctrl-C to stop.');
  openBrowser(url);
}

main().catch((e) => {
  console.error(`quietgrid: the app could not start: ${e instanceof Error ? e.message : String(e)}`);
  process.exit(1);
});

/**
 * The Electron main process: one hardened window showing the renderer from the app's own scheme,
 * the menu, native file dialogs, and saves that write a temporary file and rename it over the target
 * (engine/node/files.ts), so a file on disk is always whole.
 */
import { app, BrowserWindow, dialog, ipcMain, Menu, protocol, session, type WebContents } from 'electron';
import { readFile } from 'node:fs/promises';
import { basename, extname, join, normalize, sep } from 'node:path';
import { describeFileError, readTextFile, writeFileAtomic } from '../../engine/node/files.ts';
import { CHANNELS, MAX_SCENARIO_BYTES, type ExportKind, type ExportRequest, type MenuCommand, type OpenedFile, type SaveRequest } from '../shared/bridge.ts';
import { registerIpc } from './ipc.ts';
import { menuTemplate } from './menu.ts';
import { RecentList } from './recent.ts';
import { APP_ENTRY, APP_HOST, APP_SCHEME, denyPermission, guardContents, isAppUrl, RESPONSE_HEADERS, windowOptions } from './security.ts';

// The bundle is dist/electron/main.cjs; the renderer is built to dist/renderer.
const RENDERER_DIR = normalize(join(__dirname, '..', 'renderer'));
const PRELOAD = join(__dirname, 'preload.cjs');
const ICON = join(__dirname, '..', '..', 'assets', 'icon.png');

const MIME: Record<string, string> = {
  '.html': 'text/html; charset=utf-8', '.js': 'text/javascript; charset=utf-8', '.css': 'text/css; charset=utf-8',
  '.svg': 'image/svg+xml', '.png': 'image/png', '.json': 'application/json', '.woff2': 'font/woff2',
};
const FILTERS: Record<ExportKind, { name: string; extensions: string[] }> = {
  csv: { name: 'CSV table', extensions: ['csv'] }, png: { name: 'PNG image', extensions: ['png'] }, json: { name: 'JSON', extensions: ['json'] },
};

protocol.registerSchemesAsPrivileged([{ scheme: APP_SCHEME, privileges: { standard: true, secure: true, supportFetchAPI: true, codeCache: true } }]);

/** Files of the built renderer only; anything outside its folder is 404. */
async function serve(request: Request): Promise<Response> {
  const url = new URL(request.url);
  const path = normalize(join(RENDERER_DIR, decodeURIComponent(url.pathname)));
  if (url.host !== APP_HOST || !path.startsWith(RENDERER_DIR + sep)) return new Response('not found', { status: 404 });
  try {
    const body = await readFile(path);
    return new Response(body, { status: 200, headers: { 'Content-Type': MIME[extname(path)] ?? 'application/octet-stream', ...RESPONSE_HEADERS } });
  } catch {
    return new Response('not found', { status: 404 });
  }
}

let window: BrowserWindow | null = null;
let recent: RecentList;

function currentWindow(): BrowserWindow {
  if (!window || window.isDestroyed()) throw new Error('no window');
  return window;
}

function send(command: MenuCommand): void {
  if (window && !window.isDestroyed()) window.webContents.send(CHANNELS.menu, command);
}

async function readScenario(path: string): Promise<OpenedFile> {
  try {
    const text = await readTextFile(path, MAX_SCENARIO_BYTES);
    await recent.add(path);
    return { name: basename(path), path, text };
  } catch (e) {
    throw new Error(describeFileError(e, path));
  }
}

function withExtension(path: string, ext: string): string {
  return extname(path).toLowerCase() === `.${ext}` ? path : `${path}.${ext}`;
}

const handlers = {
  [CHANNELS.openDialog]: async (): Promise<OpenedFile | null> => {
    const r = await dialog.showOpenDialog(currentWindow(), { title: 'Open a scenario', properties: ['openFile'], filters: [{ name: 'quietgrid scenario', extensions: ['json'] }] });
    return r.canceled || r.filePaths.length === 0 ? null : readScenario(r.filePaths[0]);
  },
  [CHANNELS.openRecent]: async (path: string): Promise<OpenedFile | null> => {
    // Only a file the user chose in a dialog before: the page cannot name any other.
    if (!recent.has(path)) return null;
    return readScenario(path);
  },
  [CHANNELS.recentFiles]: async () => recent.list(),
  [CHANNELS.saveScenario]: async (req: SaveRequest) => {
    let target = !req.saveAs && req.path !== null && recent.has(req.path) ? req.path : null;
    if (target === null) {
      const r = await dialog.showSaveDialog(currentWindow(), { title: 'Save the scenario', defaultPath: join(app.getPath('documents'), req.suggestedName), filters: [FILTERS.json] });
      if (r.canceled || !r.filePath) return null;
      target = withExtension(r.filePath, 'json');
    }
    await writeFileAtomic(target, req.text);
    return recent.add(target);
  },
  [CHANNELS.exportFile]: async (req: ExportRequest) => {
    const r = await dialog.showSaveDialog(currentWindow(), { title: 'Export', defaultPath: join(app.getPath('documents'), req.suggestedName), filters: [FILTERS[req.kind]] });
    if (r.canceled || !r.filePath) return null;
    const target = withExtension(r.filePath, req.kind);
    await writeFileAtomic(target, req.data);
    return { path: target };
  },
};

function createWindow(): void {
  window = new BrowserWindow(windowOptions(PRELOAD, ICON));
  window.once('ready-to-show', () => window?.show());
  window.on('closed', () => { window = null; });
  void window.loadURL(APP_ENTRY);
}

app.setName('quietgrid');
app.on('web-contents-created', (_event, contents: WebContents) => guardContents(contents));
app.on('window-all-closed', () => { if (process.platform !== 'darwin') app.quit(); });
app.on('activate', () => { if (BrowserWindow.getAllWindows().length === 0) createWindow(); });

void app.whenReady().then(async () => {
  recent = new RecentList(join(app.getPath('userData'), 'recent-files.json'));
  await recent.load();
  protocol.handle(APP_SCHEME, serve);
  session.defaultSession.setPermissionRequestHandler(denyPermission);
  // No remote content: every request leaving the app's own scheme is cancelled.
  session.defaultSession.webRequest.onBeforeRequest({ urls: ['http://*/*', 'https://*/*', 'ws://*/*', 'wss://*/*', 'file://*/*'] }, (details, callback) => {
    callback({ cancel: !isAppUrl(details.url) });
  });
  registerIpc(ipcMain, handlers);
  Menu.setApplicationMenu(Menu.buildFromTemplate(menuTemplate(send, process.platform === 'darwin')));
  createWindow();
});

/**
 * The Electron window's hardening, as plain data and small functions so that tests can read them
 * without Electron: web preferences, the Content-Security-Policy (the same string the page carries as a
 * <meta> for the browser mode), and the handlers that refuse navigation, new windows, webviews and
 * permission requests. The renderer is served from our own scheme; nothing remote is ever loaded.
 */

/** The scheme and host the renderer is served from (registered as standard and secure in main.ts). */
export const APP_SCHEME = 'app';
export const APP_HOST = 'quietgrid';
export const APP_ORIGIN = `${APP_SCHEME}://${APP_HOST}`;
export const APP_ENTRY = `${APP_ORIGIN}/index.html`;

/**
 * Scripts and workers from the app's own origin only (workers also as blob: URLs, which plotly's image
 * export and bundlers may use); inline styles allowed for React's style props and plotly's injected CSS;
 * images also as data:/blob: (plotly renders heatmaps and exports through them); nothing else.
 */
export const CONTENT_SECURITY_POLICY = [
  "default-src 'self'",
  "script-src 'self'",
  "worker-src 'self' blob:",
  "style-src 'self' 'unsafe-inline'",
  "img-src 'self' data: blob:",
  "font-src 'self'",
  "connect-src 'self'",
  "object-src 'none'",
  "base-uri 'none'",
  "form-action 'none'",
].join('; ');

export interface HardenedWebPreferences {
  preload: string;
  contextIsolation: true;
  sandbox: true;
  nodeIntegration: false;
  nodeIntegrationInWorker: false;
  nodeIntegrationInSubFrames: false;
  webSecurity: true;
  allowRunningInsecureContent: false;
  webviewTag: false;
  navigateOnDragDrop: false;
  spellcheck: false;
  safeDialogs: true;
}

export function webPreferences(preloadPath: string): HardenedWebPreferences {
  return {
    preload: preloadPath,
    contextIsolation: true,
    sandbox: true,
    nodeIntegration: false,
    nodeIntegrationInWorker: false,
    nodeIntegrationInSubFrames: false,
    webSecurity: true,
    allowRunningInsecureContent: false,
    webviewTag: false,
    // A file dropped on the window is read by the page (to open a scenario), never navigated to.
    navigateOnDragDrop: false,
    spellcheck: false,
    safeDialogs: true,
  };
}

export function windowOptions(preloadPath: string, iconPath: string) {
  return {
    width: 1440,
    height: 940,
    minWidth: 900,
    minHeight: 600,
    title: 'quietgrid',
    icon: iconPath,
    backgroundColor: '#f3f5f7',
    show: false,
    webPreferences: webPreferences(preloadPath),
  };
}

/** Whether a URL belongs to the app itself (the only origin allowed to load or call IPC). */
export function isAppUrl(url: string): boolean {
  try {
    const u = new URL(url);
    return u.protocol === `${APP_SCHEME}:` && u.host === APP_HOST;
  } catch {
    return false;
  }
}

/** What the guards need of Electron's WebContents. */
export interface GuardedContents {
  on(event: 'will-navigate' | 'will-redirect', listener: (event: { preventDefault(): void; url?: string }, url: string) => void): unknown;
  on(event: 'will-attach-webview', listener: (event: { preventDefault(): void }) => void): unknown;
  setWindowOpenHandler(handler: (details: { url: string }) => { action: 'deny' }): void;
}

/**
 * Refuses every navigation away from the app's entry page (links, drops, redirects), every new
 * window, and every webview. Returns what it refused, for the tests.
 */
export function guardContents(contents: GuardedContents, refused: (what: string, url: string) => void = () => undefined): void {
  const block = (what: string) => (event: { preventDefault(): void }, url: string) => {
    if (url === APP_ENTRY) return; // the app reloading itself
    event.preventDefault();
    refused(what, url);
  };
  contents.on('will-navigate', block('navigation'));
  contents.on('will-redirect', block('redirect'));
  contents.on('will-attach-webview', (event) => { event.preventDefault(); refused('webview', ''); });
  contents.setWindowOpenHandler(({ url }) => { refused('new window', url); return { action: 'deny' }; });
}

/** Permission requests (camera, notifications, …): the app needs none. */
export function denyPermission(_contents: unknown, _permission: string, callback: (granted: boolean) => void): void {
  callback(false);
}

/**
 * Cross-origin isolation: with these the page and its workers may share memory (SharedArrayBuffer, shared
 * WebAssembly memory), which threads in one factorisation need. Safe here because the app loads nothing from
 * another origin (the CSP above already refuses it). Sent by the app's scheme and by vite's dev and preview servers.
 */
export const ISOLATION_HEADERS: Readonly<Record<string, string>> = {
  'Cross-Origin-Opener-Policy': 'same-origin',
  'Cross-Origin-Embedder-Policy': 'require-corp',
};

/** Response headers added to every file the app's scheme serves. */
export const RESPONSE_HEADERS: Readonly<Record<string, string>> = {
  'Content-Security-Policy': CONTENT_SECURITY_POLICY,
  'X-Content-Type-Options': 'nosniff',
  ...ISOLATION_HEADERS,
};

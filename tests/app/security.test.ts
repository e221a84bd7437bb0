// The Electron window's hardening: web preferences, the Content-Security-Policy (also the page's <meta>),
// the navigation / new-window / webview guards and the IPC allowlist with its argument checks.
// Source: Electron documentation, "Security" (the recommendations list: context isolation, sandbox, no Node integration, a CSP, no navigation or new windows, validated IPC senders) — from memory for its numbering;
// W3C, Content Security Policy Level 3 (Working Draft) for the directive names checked below.
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import {
  APP_ENTRY, CONTENT_SECURITY_POLICY, denyPermission, guardContents, isAppUrl, RESPONSE_HEADERS, webPreferences, windowOptions,
  type GuardedContents,
} from '../../app/main/security.ts';
import { IpcRefused, registerIpc, type Handlers, type InvokeEvent } from '../../app/main/ipc.ts';
import { CHANNELS, INVOKE_CHANNELS } from '../../app/shared/bridge.ts';

const directives = (csp: string) => new Map(csp.split(';').map((d) => d.trim()).filter(Boolean).map((d) => {
  const [name, ...values] = d.split(/\s+/);
  return [name, values] as const;
}));

describe('web preferences', () => {
  it('isolate the page: context isolation, sandbox, no Node anywhere, web security on', () => {
    const w = webPreferences('/x/preload.cjs');
    expect(w.preload).toBe('/x/preload.cjs');
    expect(w.contextIsolation).toBe(true);
    expect(w.sandbox).toBe(true);
    expect(w.nodeIntegration).toBe(false);
    expect(w.nodeIntegrationInWorker).toBe(false);
    expect(w.nodeIntegrationInSubFrames).toBe(false);
    expect(w.webSecurity).toBe(true);
    expect(w.allowRunningInsecureContent).toBe(false);
    expect(w.webviewTag).toBe(false);
    expect(w.navigateOnDragDrop).toBe(false);
  });
  it('are what the window is created with', () => {
    expect(windowOptions('/p.cjs', '/i.png').webPreferences).toEqual(webPreferences('/p.cjs'));
  });
});

describe('content security policy', () => {
  const csp = directives(CONTENT_SECURITY_POLICY);
  it('allows scripts from the app only, never eval or inline', () => {
    expect(csp.get('script-src')).toEqual(["'self'"]);
    expect(CONTENT_SECURITY_POLICY).not.toContain('unsafe-eval');
    expect(csp.get('default-src')).toEqual(["'self'"]);
    expect(csp.get('object-src')).toEqual(["'none'"]);
    expect(csp.get('base-uri')).toEqual(["'none'"]);
  });
  it('lets the engine workers run from the app or blob: URLs, and no remote host anywhere', () => {
    expect(csp.get('worker-src')).toEqual(["'self'", 'blob:']);
    expect(CONTENT_SECURITY_POLICY).not.toMatch(/https?:|\*/);
    expect(csp.get('connect-src')).toEqual(["'self'"]);
  });
  it('is the same string the page carries as a <meta> (browser mode)', () => {
    const html = readFileSync(new URL('../../app/renderer/index.html', import.meta.url), 'utf8');
    const meta = /<meta http-equiv="Content-Security-Policy" content="([^"]+)"/.exec(html);
    expect(meta?.[1]).toBe(CONTENT_SECURITY_POLICY);
  });
  it('is sent as a header with every file the app scheme serves', () => {
    expect(RESPONSE_HEADERS['Content-Security-Policy']).toBe(CONTENT_SECURITY_POLICY);
    expect(RESPONSE_HEADERS['X-Content-Type-Options']).toBe('nosniff');
    // Source: WHATWG HTML Living Standard, §7.1.3 "Cross-origin opener policies" and §7.1.4 "Cross-origin embedder policies" (from memory for the numbering): both make the page cross-origin isolated
    expect([RESPONSE_HEADERS['Cross-Origin-Opener-Policy'], RESPONSE_HEADERS['Cross-Origin-Embedder-Policy']]).toEqual(['same-origin', 'require-corp']);
  });
});

function fakeContents() {
  const listeners = new Map<string, (event: { preventDefault(): void }, url: string) => void>();
  let openHandler: ((d: { url: string }) => { action: 'deny' }) | null = null;
  const contents: GuardedContents = {
    on(event: string, listener: (event: { preventDefault(): void }, url: string) => void) { listeners.set(event, listener); return contents; },
    setWindowOpenHandler(h) { openHandler = h; },
  } as GuardedContents;
  const fire = (event: string, url: string) => {
    let prevented = false;
    listeners.get(event)!({ preventDefault: () => { prevented = true; } }, url);
    return prevented;
  };
  return { contents, listeners, fire, open: (url: string) => openHandler!({ url }) };
}

describe('navigation guards', () => {
  it('set handlers for navigation, redirects, webviews and new windows', () => {
    const f = fakeContents();
    guardContents(f.contents);
    expect([...f.listeners.keys()].sort()).toEqual(['will-attach-webview', 'will-navigate', 'will-redirect']);
    expect(f.open('https://example.org/')).toEqual({ action: 'deny' });
  });
  it('refuse every navigation away from the app, allow the app reloading itself', () => {
    const f = fakeContents(), refused: string[] = [];
    guardContents(f.contents, (what, url) => refused.push(`${what} ${url}`));
    expect(f.fire('will-navigate', 'https://example.org/')).toBe(true);
    expect(f.fire('will-navigate', 'file:///etc/passwd')).toBe(true);
    expect(f.fire('will-redirect', 'http://localhost:1/')).toBe(true);
    expect(f.fire('will-navigate', APP_ENTRY)).toBe(false);
    expect(f.fire('will-attach-webview', '')).toBe(true);
    expect(refused).toEqual(['navigation https://example.org/', 'navigation file:///etc/passwd', 'redirect http://localhost:1/', 'webview ']);
  });
  it('deny every permission request', () => {
    let granted: boolean | null = null;
    denyPermission(null, 'media', (g) => { granted = g; });
    expect(granted).toBe(false);
  });
  it('know the app origin from look-alikes', () => {
    expect(isAppUrl(APP_ENTRY)).toBe(true);
    expect(isAppUrl('app://quietgrid/assets/x.js')).toBe(true);
    expect(isAppUrl('app://other/index.html')).toBe(false);
    expect(isAppUrl('https://quietgrid/index.html')).toBe(false);
    expect(isAppUrl('not a url')).toBe(false);
  });
});

describe('IPC allowlist', () => {
  function setup() {
    const registered = new Map<string, (event: InvokeEvent, ...args: unknown[]) => unknown>();
    const calls: string[] = [];
    const handler = (name: string) => async (...args: unknown[]) => { calls.push(`${name}:${JSON.stringify(args)}`); return name; };
    const handlers = Object.fromEntries(INVOKE_CHANNELS.map((c) => [c, handler(c)])) as unknown as Handlers;
    registerIpc({ handle: (channel, listener) => registered.set(channel, listener) }, handlers);
    return { registered, calls };
  }
  const fromApp = { senderFrame: { url: APP_ENTRY } };
  it('registers exactly the allowlisted channels', () => {
    const { registered } = setup();
    expect([...registered.keys()].sort()).toEqual([...INVOKE_CHANNELS].sort());
    expect(registered.has(CHANNELS.menu)).toBe(false);
  });
  it('refuses calls from any other page', () => {
    const { registered, calls } = setup();
    expect(() => registered.get(CHANNELS.recentFiles)!({ senderFrame: { url: 'https://evil.example/' } })).toThrow(IpcRefused);
    expect(() => registered.get(CHANNELS.recentFiles)!({ senderFrame: null })).toThrow(IpcRefused);
    expect(calls).toEqual([]);
  });
  it('checks the arguments before the handler sees them', async () => {
    const { registered, calls } = setup();
    const save = registered.get(CHANNELS.saveScenario)!;
    expect(() => save(fromApp, { text: '{}', suggestedName: '../../etc/x', path: null, saveAs: false })).toThrow(IpcRefused);
    expect(() => save(fromApp, { text: '{}', suggestedName: 'a.json', path: null, saveAs: 'yes' })).toThrow(IpcRefused);
    expect(() => save(fromApp, { text: '{}', suggestedName: 'a.json', path: null, saveAs: false, extra: 1 })).toThrow(IpcRefused);
    expect(() => registered.get(CHANNELS.openRecent)!(fromApp, 42)).toThrow(IpcRefused);
    expect(() => registered.get(CHANNELS.exportFile)!(fromApp, { suggestedName: 'a.png', kind: 'png', data: 'text is not a png' })).toThrow(IpcRefused);
    expect(() => registered.get(CHANNELS.openDialog)!(fromApp, 'unexpected')).toThrow(IpcRefused);
    expect(calls).toEqual([]);
    await save(fromApp, { text: '{}', suggestedName: 'a.json', path: null, saveAs: true });
    await registered.get(CHANNELS.exportFile)!(fromApp, { suggestedName: 'p.png', kind: 'png', data: new Uint8Array([137, 80]) });
    expect(calls.map((c) => c.split(':[')[0])).toEqual([CHANNELS.saveScenario, CHANNELS.exportFile]);
  });
});

describe('main process wiring', () => {
  const main = readFileSync(new URL('../../app/main/main.ts', import.meta.url), 'utf8');
  it('creates its window with the hardened options and guards every web contents', () => {
    expect(main).toMatch(/new BrowserWindow\(windowOptions\(PRELOAD, ICON\)\)/);
    expect(main).toMatch(/app\.on\('web-contents-created', \(_event, contents: WebContents\) => guardContents\(contents\)\)/);
    expect(main).toMatch(/setPermissionRequestHandler\(denyPermission\)/);
    expect(main).toMatch(/registerIpc\(ipcMain, handlers\)/);
    expect(main).not.toMatch(/ipcMain\.(on|handle)\(/);
  });
});

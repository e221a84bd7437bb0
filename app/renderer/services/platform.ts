/**
 * Files, as the platform allows: through the Electron bridge (native dialogs, atomic writes by main,
 * recent files kept by main) or, in a plain browser, file inputs and downloads with the recent files
 * (name and text) kept in localStorage. A browser download is a new file, never a half-overwritten one.
 */
import type { ExportKind, MenuCommand, OpenedFile, QuietgridBridge } from '../../shared/bridge.ts';
import type { KeyValueStorage } from '../store/editor.ts';

export interface RecentEntry { name: string; path: string | null; at: number }

export interface Platform {
  kind: 'electron' | 'browser';
  /** Native open dialog; null when the platform has none (the page's file input is used instead). */
  openDialog: (() => Promise<OpenedFile | null>) | null;
  recent(): Promise<RecentEntry[]>;
  openRecent(entry: RecentEntry): Promise<{ name: string; path: string | null; text: string } | null>;
  /** Remembers a file opened from the page (browser only; main remembers its own). */
  remember(name: string, text: string): void;
  /** Saves the scenario; the file reference it now has, or null if the user cancelled. */
  saveScenario(text: string, suggestedName: string, path: string | null, saveAs: boolean): Promise<{ name: string; path: string | null } | null>;
  exportFile(name: string, kind: ExportKind, data: string | Uint8Array): Promise<boolean>;
  onMenuCommand(listener: (c: MenuCommand) => void): () => void;
}

const MIME: Record<ExportKind, string> = { csv: 'text/csv', png: 'image/png', json: 'application/json' };

export function electronPlatform(bridge: QuietgridBridge): Platform {
  return {
    kind: 'electron',
    openDialog: () => bridge.openDialog(),
    recent: async () => (await bridge.recentFiles()).map((r, i) => ({ name: r.name, path: r.path, at: -i })),
    openRecent: async (e) => (e.path ? bridge.openRecent(e.path) : null),
    remember: () => undefined,
    saveScenario: async (text, suggestedName, path, saveAs) => bridge.saveScenario({ text, suggestedName, path, saveAs }),
    exportFile: async (suggestedName, kind, data) => (await bridge.exportFile({ suggestedName, kind, data })) !== null,
    onMenuCommand: (l) => bridge.onMenuCommand(l),
  };
}

export const RECENT_KEY = 'quietgrid.recent.v1';
const MAX_RECENT = 8;
const MAX_RECENT_TEXT = 256 * 1024;

interface StoredRecent { name: string; text: string; at: number }

function readRecent(storage: KeyValueStorage): StoredRecent[] {
  try {
    const v = JSON.parse(storage.getItem(RECENT_KEY) ?? '[]') as unknown;
    return Array.isArray(v) ? v.filter((r): r is StoredRecent => !!r && typeof r.name === 'string' && typeof r.text === 'string' && typeof r.at === 'number') : [];
  } catch {
    return [];
  }
}

/** The browser's recent list: newest first, one entry per name, at most eight, texts up to 256 kB. */
export function rememberRecent(storage: KeyValueStorage, name: string, text: string, at: number): void {
  if (text.length > MAX_RECENT_TEXT) return;
  const list = [{ name, text, at }, ...readRecent(storage).filter((r) => r.name !== name)].slice(0, MAX_RECENT);
  try {
    storage.setItem(RECENT_KEY, JSON.stringify(list));
  } catch {
    // Full storage: the list stays as it was.
  }
}

export function browserPlatform(storage: KeyValueStorage, download: (name: string, blob: Blob) => void, now: () => number = Date.now): Platform {
  return {
    kind: 'browser',
    openDialog: null,
    recent: async () => readRecent(storage).map((r) => ({ name: r.name, path: null, at: r.at })),
    openRecent: async (e) => {
      const hit = readRecent(storage).find((r) => r.name === e.name);
      return hit ? { name: hit.name, path: null, text: hit.text } : null;
    },
    remember: (name, text) => rememberRecent(storage, name, text, now()),
    saveScenario: async (text, suggestedName) => {
      download(suggestedName, new Blob([text], { type: MIME.json }));
      rememberRecent(storage, suggestedName, text, now());
      return { name: suggestedName, path: null };
    },
    exportFile: async (name, kind, data) => {
      download(name, new Blob([typeof data === 'string' ? data : new Uint8Array(data)], { type: MIME[kind] }));
      return true;
    },
    onMenuCommand: () => () => undefined,
  };
}

/** Starts a download of the blob under the name (an anchor with `download`, clicked and removed). */
export function downloadBlob(name: string, blob: Blob): void {
  const url = URL.createObjectURL(blob), a = document.createElement('a');
  a.href = url;
  a.download = name;
  a.style.display = 'none';
  document.body.appendChild(a);
  a.click();
  a.remove();
  setTimeout(() => URL.revokeObjectURL(url), 10_000);
}

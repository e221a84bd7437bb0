/**
 * The bridge between the Electron main process and the renderer: the channel allowlist, the shapes
 * that cross it, and the checks main applies to every argument (the renderer is not trusted). The
 * preload exposes exactly `QuietgridBridge` as window.quietgrid; in a plain browser it is absent.
 */

/** Every IPC channel the app uses; main handles these and no others. */
export const CHANNELS = {
  openDialog: 'quietgrid:open-dialog',
  openRecent: 'quietgrid:open-recent',
  recentFiles: 'quietgrid:recent-files',
  saveScenario: 'quietgrid:save-scenario',
  exportFile: 'quietgrid:export-file',
  /** main → renderer: a menu command. */
  menu: 'quietgrid:menu',
} as const;

export type InvokeChannel = Exclude<(typeof CHANNELS)[keyof typeof CHANNELS], typeof CHANNELS.menu>;
export const INVOKE_CHANNELS: readonly InvokeChannel[] = [CHANNELS.openDialog, CHANNELS.openRecent, CHANNELS.recentFiles, CHANNELS.saveScenario, CHANNELS.exportFile];

export const MENU_COMMANDS = ['open', 'save', 'save-as', 'run', 'cancel', 'export-spectrum', 'export-bands', 'tab-sketch', 'tab-sweep', 'tab-results', 'tab-field'] as const;
export type MenuCommand = (typeof MENU_COMMANDS)[number];

export interface OpenedFile { name: string; path: string; text: string }
export interface RecentFile { name: string; path: string }
export interface SaveRequest { text: string; suggestedName: string; path: string | null; saveAs: boolean }
export type ExportKind = 'csv' | 'png' | 'json';
export interface ExportRequest { suggestedName: string; kind: ExportKind; data: string | Uint8Array }

export interface QuietgridBridge {
  openDialog(): Promise<OpenedFile | null>;
  openRecent(path: string): Promise<OpenedFile | null>;
  recentFiles(): Promise<RecentFile[]>;
  /** Writes to a temporary file and renames it over the target: the file is whole or untouched. */
  saveScenario(request: SaveRequest): Promise<RecentFile | null>;
  exportFile(request: ExportRequest): Promise<{ path: string } | null>;
  onMenuCommand(listener: (command: MenuCommand) => void): () => void;
}

/** Largest scenario text main accepts to write (the engine reads no more than this either). */
export const MAX_SCENARIO_BYTES = 4 * 1024 * 1024;
/** Largest exported file (a PNG of a big plot, a long CSV). */
export const MAX_EXPORT_BYTES = 64 * 1024 * 1024;
const MAX_NAME = 200;
const MAX_PATH = 4096;

const isRecord = (v: unknown): v is Record<string, unknown> => v !== null && typeof v === 'object' && !Array.isArray(v);

/** A file name without folders or control characters. */
export function isPlainFileName(v: unknown): v is string {
  return typeof v === 'string' && v.length > 0 && v.length <= MAX_NAME && !/[/\\\u0000-\u001f]/.test(v) && v !== '.' && v !== '..';
}

export function isPathArgument(v: unknown): v is string {
  return typeof v === 'string' && v.length > 0 && v.length <= MAX_PATH && !v.includes('\u0000');
}

export function isSaveRequest(v: unknown): v is SaveRequest {
  return isRecord(v) && typeof v.text === 'string' && v.text.length <= MAX_SCENARIO_BYTES && isPlainFileName(v.suggestedName)
    && (v.path === null || isPathArgument(v.path)) && typeof v.saveAs === 'boolean' && Object.keys(v).length === 4;
}

export function isExportRequest(v: unknown): v is ExportRequest {
  if (!isRecord(v) || Object.keys(v).length !== 3 || !isPlainFileName(v.suggestedName)) return false;
  if (v.kind !== 'csv' && v.kind !== 'png' && v.kind !== 'json') return false;
  if (typeof v.data === 'string') return v.kind !== 'png' && v.data.length <= MAX_EXPORT_BYTES;
  return v.data instanceof Uint8Array && v.data.byteLength <= MAX_EXPORT_BYTES;
}

export function isMenuCommand(v: unknown): v is MenuCommand {
  return typeof v === 'string' && (MENU_COMMANDS as readonly string[]).includes(v);
}

/** Argument checks per channel: main refuses a call whose arguments fail them. */
export const ARGUMENT_CHECKS: Record<InvokeChannel, (args: unknown[]) => boolean> = {
  [CHANNELS.openDialog]: (args) => args.length === 0,
  [CHANNELS.openRecent]: (args) => args.length === 1 && isPathArgument(args[0]),
  [CHANNELS.recentFiles]: (args) => args.length === 0,
  [CHANNELS.saveScenario]: (args) => args.length === 1 && isSaveRequest(args[0]),
  [CHANNELS.exportFile]: (args) => args.length === 1 && isExportRequest(args[0]),
};

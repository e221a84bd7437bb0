/**
 * Minimal declarations of the Electron APIs the app uses. Electron is an optional dependency that
 * cannot be installed on every machine (its binary download may fail), so its own types are not
 * always present; these keep the root typecheck independent of it. Shapes follow Electron 38.
 */
declare module 'electron' {
  export interface WebPreferences {
    preload?: string;
    contextIsolation?: boolean;
    sandbox?: boolean;
    nodeIntegration?: boolean;
    nodeIntegrationInWorker?: boolean;
    nodeIntegrationInSubFrames?: boolean;
    webSecurity?: boolean;
    allowRunningInsecureContent?: boolean;
    webviewTag?: boolean;
    navigateOnDragDrop?: boolean;
    spellcheck?: boolean;
    safeDialogs?: boolean;
  }
  export interface BrowserWindowConstructorOptions {
    width?: number; height?: number; minWidth?: number; minHeight?: number; title?: string; icon?: string;
    backgroundColor?: string; show?: boolean; webPreferences?: WebPreferences;
  }
  export interface Event { preventDefault(): void }
  export interface WebContents {
    on(event: 'will-navigate' | 'will-redirect', listener: (event: Event, url: string) => void): this;
    on(event: 'will-attach-webview', listener: (event: Event) => void): this;
    on(event: 'did-finish-load', listener: () => void): this;
    setWindowOpenHandler(handler: (details: { url: string }) => { action: 'deny' | 'allow' }): void;
    send(channel: string, ...args: unknown[]): void;
    getURL(): string;
  }
  export class BrowserWindow {
    constructor(options?: BrowserWindowConstructorOptions);
    webContents: WebContents;
    loadURL(url: string): Promise<void>;
    once(event: 'ready-to-show', listener: () => void): this;
    on(event: 'closed', listener: () => void): this;
    show(): void;
    focus(): void;
    isDestroyed(): boolean;
    static getAllWindows(): BrowserWindow[];
    static getFocusedWindow(): BrowserWindow | null;
  }
  export interface MenuItemConstructorOptions {
    label?: string; role?: string; type?: 'normal' | 'separator' | 'submenu'; accelerator?: string;
    click?: () => void; submenu?: MenuItemConstructorOptions[]; enabled?: boolean;
  }
  export class Menu {
    static buildFromTemplate(template: MenuItemConstructorOptions[]): Menu;
    static setApplicationMenu(menu: Menu | null): void;
  }
  export interface FileFilter { name: string; extensions: string[] }
  export interface OpenDialogReturnValue { canceled: boolean; filePaths: string[] }
  export interface SaveDialogReturnValue { canceled: boolean; filePath?: string }
  export const dialog: {
    showOpenDialog(window: BrowserWindow, options: { title?: string; properties?: string[]; filters?: FileFilter[] }): Promise<OpenDialogReturnValue>;
    showSaveDialog(window: BrowserWindow, options: { title?: string; defaultPath?: string; filters?: FileFilter[] }): Promise<SaveDialogReturnValue>;
    showErrorBox(title: string, content: string): void;
  };
  export interface IpcMainInvokeEvent { senderFrame: { url: string } | null; sender: WebContents }
  export const ipcMain: {
    handle(channel: string, listener: (event: IpcMainInvokeEvent, ...args: unknown[]) => unknown): void;
  };
  export interface IpcRendererEvent { sender: unknown }
  export const ipcRenderer: {
    invoke(channel: string, ...args: unknown[]): Promise<unknown>;
    on(channel: string, listener: (event: IpcRendererEvent, ...args: unknown[]) => void): void;
    removeListener(channel: string, listener: (event: IpcRendererEvent, ...args: unknown[]) => void): void;
  };
  export const contextBridge: { exposeInMainWorld(key: string, api: unknown): void };
  export interface CustomScheme { scheme: string; privileges?: { standard?: boolean; secure?: boolean; supportFetchAPI?: boolean; stream?: boolean; codeCache?: boolean } }
  export const protocol: {
    registerSchemesAsPrivileged(schemes: CustomScheme[]): void;
    handle(scheme: string, handler: (request: Request) => Response | Promise<Response>): void;
  };
  export const net: { fetch(url: string): Promise<Response> };
  export interface Session {
    setPermissionRequestHandler(handler: (contents: WebContents, permission: string, callback: (granted: boolean) => void) => void): void;
    webRequest: { onBeforeRequest(filter: { urls: string[] }, listener: (details: { url: string }, callback: (response: { cancel?: boolean }) => void) => void): void };
  }
  export const session: { defaultSession: Session };
  export const app: {
    whenReady(): Promise<void>;
    on(event: 'window-all-closed' | 'activate', listener: () => void): void;
    on(event: 'web-contents-created', listener: (event: Event, contents: WebContents) => void): void;
    quit(): void;
    getPath(name: 'userData' | 'documents'): string;
    setName(name: string): void;
    readonly isPackaged: boolean;
  };
}

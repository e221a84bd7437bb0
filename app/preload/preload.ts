/**
 * The preload: the one bridge between the sandboxed page and main. It exposes exactly the typed calls
 * of QuietgridBridge, each an invoke on an allowlisted channel; the page never sees ipcRenderer.
 */
import { contextBridge, ipcRenderer, type IpcRendererEvent } from 'electron';
import { CHANNELS, isMenuCommand, type ExportRequest, type MenuCommand, type OpenedFile, type QuietgridBridge, type RecentFile, type SaveRequest } from '../shared/bridge.ts';

const bridge: QuietgridBridge = {
  openDialog: () => ipcRenderer.invoke(CHANNELS.openDialog) as Promise<OpenedFile | null>,
  openRecent: (path: string) => ipcRenderer.invoke(CHANNELS.openRecent, path) as Promise<OpenedFile | null>,
  recentFiles: () => ipcRenderer.invoke(CHANNELS.recentFiles) as Promise<RecentFile[]>,
  saveScenario: (request: SaveRequest) => ipcRenderer.invoke(CHANNELS.saveScenario, request) as Promise<RecentFile | null>,
  exportFile: (request: ExportRequest) => ipcRenderer.invoke(CHANNELS.exportFile, request) as Promise<{ path: string } | null>,
  onMenuCommand(listener: (command: MenuCommand) => void) {
    const wrapped = (_event: IpcRendererEvent, command: unknown) => { if (isMenuCommand(command)) listener(command); };
    ipcRenderer.on(CHANNELS.menu, wrapped as (event: IpcRendererEvent, ...args: unknown[]) => void);
    return () => ipcRenderer.removeListener(CHANNELS.menu, wrapped as (event: IpcRendererEvent, ...args: unknown[]) => void);
  },
};

contextBridge.exposeInMainWorld('quietgrid', bridge);

/**
 * IPC in main: only the channels of the allowlist (app/shared/bridge.ts) are handled, only calls from
 * the app's own page are answered, and every argument is checked before a handler sees it.
 */
import { ARGUMENT_CHECKS, INVOKE_CHANNELS, type InvokeChannel } from '../shared/bridge.ts';
import { isAppUrl } from './security.ts';

export interface InvokeEvent { senderFrame?: { url: string } | null }

/** What registration needs of Electron's ipcMain. */
export interface IpcMainLike {
  handle(channel: string, listener: (event: InvokeEvent, ...args: unknown[]) => unknown): void;
}

export type Handlers = Record<InvokeChannel, (...args: never[]) => Promise<unknown>>;

export class IpcRefused extends Error {
  constructor(message: string) { super(message); this.name = 'IpcRefused'; }
}

/** Wraps each handler in the sender and argument checks, and registers exactly the allowlisted channels. */
export function registerIpc(ipc: IpcMainLike, handlers: Handlers): InvokeChannel[] {
  for (const channel of INVOKE_CHANNELS) {
    const handler = handlers[channel] as (...args: unknown[]) => Promise<unknown>;
    ipc.handle(channel, (event, ...args) => {
      const url = event.senderFrame?.url ?? '';
      if (!isAppUrl(url)) throw new IpcRefused(`${channel}: refused a call from ${url || 'an unknown frame'}`);
      if (!ARGUMENT_CHECKS[channel](args)) throw new IpcRefused(`${channel}: refused malformed arguments`);
      return handler(...args);
    });
  }
  return [...INVOKE_CHANNELS];
}

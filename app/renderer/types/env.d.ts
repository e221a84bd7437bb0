/// <reference types="vite/client" />
import type { QuietgridBridge } from '../../shared/bridge.ts';

declare global {
  interface Window {
    /** Present in the Electron app only (app/preload). */
    quietgrid?: QuietgridBridge;
  }
}

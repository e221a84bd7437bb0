/** The renderer's entry: picks the platform (Electron bridge or plain browser), builds the controller, renders. */
import { StrictMode } from 'react';
import { createRoot } from 'react-dom/client';
import { App } from './components/App.tsx';
import { createController } from './controller.ts';
import type { WorkerPort } from '../../engine/sweep/protocol.ts';
import { browserPlatform, downloadBlob, electronPlatform } from './services/platform.ts';
import './styles.css';

function engineWorker(): WorkerPort {
  return new Worker(new URL('./engine.worker.ts', import.meta.url), { type: 'module', name: 'quietgrid-engine' }) as unknown as WorkerPort;
}

const platform = window.quietgrid ? electronPlatform(window.quietgrid) : browserPlatform(window.localStorage, downloadBlob);
const controller = createController({
  storage: window.localStorage,
  platform,
  createWorker: engineWorker,
  cores: Math.max(1, navigator.hardwareConcurrency || 1),
  deviceMemoryGb: (navigator as Navigator & { deviceMemory?: number }).deviceMemory,
  now: () => performance.now(),
});

// For the end-to-end tests and for curious users: the stores, read-only by convention.
(window as unknown as { quietgridApp?: unknown }).quietgridApp = { run: controller.run, editor: controller.editor.store, field: controller.field };

createRoot(document.getElementById('root')!).render(<StrictMode><App controller={controller} /></StrictMode>);
document.documentElement.dataset.ready = 'true';

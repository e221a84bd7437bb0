/**
 * The app's composition root: the stores, the workers and the files, and every action the screens can
 * take. Components receive state and these actions as props; nothing here renders.
 */
import { buildGeometry, parseScenarioText, ScenarioError, type Geometry } from '../../engine/scenario/index.ts';
import { tableCsv } from '../../engine/report/results.ts';
import type { MenuCommand } from '../shared/bridge.ts';
import { DEFAULT_DEMO, demoById } from './model/demos.ts';
import { isObject, type Draft, type Json } from './model/draft.ts';
import { recalibrate, runWorkers } from './model/estimate.ts';
import { sliceCsv, type Quantity } from './model/field.ts';
import { bandTable, runReport } from './model/report.ts';
import { IDLE_RUN, isActive, type RunState } from './model/run.ts';
import { runBlocker } from './model/scenario.ts';
import type { LengthUnit } from './model/units.ts';
import type { AxisIndex } from '../../engine/core/space.ts';
import type { Slice, WorkerPort } from '../../engine/sweep/protocol.ts';
import { createEditor, draftText, type Editor, type KeyValueStorage } from './store/editor.ts';
import { createStore, type Store } from './store/store.ts';
import { createEstimator, type Estimator } from './services/estimator.ts';
import { createFieldService, SupersededError, type FieldService } from './services/fields.ts';
import type { Platform, RecentEntry } from './services/platform.ts';
import { plotPng, type PlotName } from './services/plots.ts';
import { createRunner, type Runner } from './services/runner.ts';

export type Tab = 'sketch' | 'sweep' | 'results' | 'field';

export interface Notice { kind: 'info' | 'error'; text: string }

export interface UiState {
  tab: Tab;
  bandFraction: 1 | 3;
  /** Workers chosen by the user; null: one per core. */
  workers: number | null;
  /** The user confirmed a run above the engine's size limit. */
  allowLarge: boolean;
  /** Re-solve a few frequencies at element order p + 1 after the sweep (the engine's order check). */
  orderCheck: boolean;
  notice: Notice | null;
  recent: RecentEntry[];
  /** A field to bring into view (from the problem list), with a counter so the same one can be asked twice. */
  focus: { path: string; n: number } | null;
}

export interface FieldViewState {
  frequencyHz: number | null;
  axis: AxisIndex;
  /** m along the axis; null: the middle of the geometry. */
  position: number | null;
  quantity: Quantity;
  animate: boolean;
  status: 'idle' | 'loading' | 'ready' | 'error';
  slice: Slice | null;
  message: string | null;
  /** The run's geometry (bounds and parts), for the slider and the outline. */
  geometry: Geometry | null;
}

export const CALIBRATION_KEY = 'quietgrid.calibration';
const SLICE_SAMPLES = 160;

export interface Environment {
  storage: KeyValueStorage;
  platform: Platform;
  createWorker: () => WorkerPort;
  cores: number;
  deviceMemoryGb?: number;
  now: () => number;
}

export interface Controller {
  editor: Editor;
  ui: Store<UiState>;
  run: Store<RunState>;
  field: Store<FieldViewState>;
  estimate: Estimator['store'];
  env: Environment;
  calibration(): number;
  actions: Actions;
}

export interface Actions {
  set(path: string, value: Json | undefined): void;
  apply(change: (d: Draft) => Draft): void;
  setUnits(u: LengthUnit): void;
  setTab(t: Tab): void;
  setBandFraction(f: 1 | 3): void;
  setWorkers(n: number | null): void;
  setAllowLarge(on: boolean): void;
  setOrderCheck(on: boolean): void;
  focusField(path: string): void;
  dismissNotice(): void;
  dismissRestored(): void;
  loadDemo(id: string): void;
  openFile(file: File): Promise<void>;
  openDialog(): Promise<void>;
  openRecent(entry: RecentEntry): Promise<void>;
  save(saveAs: boolean): Promise<void>;
  run(): void;
  cancel(): void;
  setField(change: Partial<Pick<FieldViewState, 'frequencyHz' | 'axis' | 'position' | 'quantity' | 'animate'>>): void;
  exportSpectrum(): Promise<void>;
  exportBands(): Promise<void>;
  exportSummary(): Promise<void>;
  exportSlice(): Promise<void>;
  exportPlot(name: PlotName): Promise<void>;
}

function baseName(name: string): string {
  return name.replace(/\.json$/i, '') || 'scenario';
}

export function createController(env: Environment): Controller {
  const editor = createEditor(env.storage, { draft: DEFAULT_DEMO.draft, file: { name: DEFAULT_DEMO.fileName, path: null } });
  const ui = createStore<UiState>({ tab: 'sketch', bandFraction: 3, workers: null, allowLarge: false, orderCheck: true, notice: null, recent: [], focus: null });
  const run = createStore<RunState>(IDLE_RUN);
  const field = createStore<FieldViewState>({ frequencyHz: null, axis: 2, position: null, quantity: 'spl', animate: false, status: 'idle', slice: null, message: null, geometry: null });
  const estimator = createEstimator(env.createWorker);
  const fields: FieldService = createFieldService(env.createWorker);
  let calibration = Number(env.storage.getItem(CALIBRATION_KEY)) || 1;

  const notify = (kind: Notice['kind'], text: string) => ui.set((s) => ({ ...s, notice: { kind, text } }));
  const refreshRecent = async () => {
    const recent = await env.platform.recent();
    ui.set((s) => ({ ...s, recent }));
  };

  const runner: Runner = createRunner({
    store: run, fields, createWorker: env.createWorker, now: env.now,
    onFinished: (r) => {
      const times = r.record.frequencies.flatMap((s) => (s.status === 'done' && s.seconds !== undefined ? [s.seconds] : []));
      const info = r.record.description?.problem.info;
      if (info && times.length > 0) {
        // Per worker, one frequency's wall time is what the estimate predicts.
        calibration = recalibrate(calibration, info, times.reduce((a, b) => a + b, 0) / times.length);
        env.storage.setItem(CALIBRATION_KEY, String(calibration));
      }
      if (r.message) notify(r.status === 'done' && !r.message.includes('failed') ? 'info' : r.status === 'cancelled' ? 'info' : 'error', r.message);
    },
  });

  // ---- estimates follow the draft ----
  const meshKey = (d: Draft) => {
    const { title: _t, notes: _n, sourcePower: _p, ...rest } = d;
    return rest;
  };
  const requestEstimate = () => {
    const s = editor.store.get();
    if (s.derived.validation.ok && s.derived.geometry) estimator.request(meshKey(s.draft), ui.get().allowLarge);
    else estimator.clear();
  };
  editor.store.subscribe(requestEstimate);
  requestEstimate();

  // ---- field slices follow the run and the controls ----
  let sliceKey = '';
  const requestSlice = () => {
    const f = field.get(), r = run.get();
    if (f.frequencyHz === null || !r.fieldsHz.includes(f.frequencyHz) || !f.geometry) return;
    const b = f.geometry.bounds, lo = [b.x0, b.y0, b.z0][f.axis], hi = [b.x1, b.y1, b.z1][f.axis];
    const position = f.position ?? (lo + hi) / 2;
    const key = `${r.id}:${f.frequencyHz}:${f.axis}:${position}`;
    if (key === sliceKey && (f.status === 'ready' || f.status === 'loading')) return;
    sliceKey = key;
    field.set((s) => ({ ...s, status: 'loading', message: null }));
    fields.slice(f.frequencyHz, { axis: f.axis, position, maxSamples: SLICE_SAMPLES }).then(
      (slice) => { if (sliceKey === key) field.set((s) => ({ ...s, status: 'ready', slice, message: null })); },
      (e: unknown) => {
        if (e instanceof SupersededError || sliceKey !== key) return;
        field.set((s) => ({ ...s, status: 'error', message: e instanceof Error ? e.message : String(e) }));
      },
    );
  };
  run.subscribe(() => {
    const r = run.get(), f = field.get();
    if (r.scenario && f.geometry === null) {
      field.set((s) => ({ ...s, geometry: buildGeometry(r.scenario!) }));
    }
    if (r.fieldsHz.length > 0 && (f.frequencyHz === null || !r.record.frequencies.some((s) => s.frequencyHz === f.frequencyHz))) {
      field.set((s) => ({ ...s, frequencyHz: r.fieldsHz[0] }));
    }
    requestSlice();
  });

  const loadText = (text: string, name: string, path: string | null) => {
    let value: unknown;
    try {
      value = parseScenarioText(text);
    } catch (e) {
      notify('error', `${name}: ${e instanceof ScenarioError ? e.message : e instanceof Error ? e.message : String(e)}`);
      return false;
    }
    if (!isObject(value as Json)) {
      notify('error', `${name}: a scenario file holds one JSON object {…}`);
      return false;
    }
    editor.load(value as Draft, { name, path });
    const v = editor.store.get().derived.validation;
    notify(v.ok ? 'info' : 'error', v.ok ? `Opened ${name}.` : `Opened ${name}: ${v.errors.length} problem${v.errors.length === 1 ? '' : 's'} to fix before it can run (shown at the fields).`);
    ui.set((s) => ({ ...s, tab: 'sketch' }));
    return true;
  };

  const exportText = async (name: string, kind: 'csv' | 'json', text: string) => {
    try {
      if (await env.platform.exportFile(name, kind, text)) notify('info', `Exported ${name}.`);
    } catch (e) {
      notify('error', `Cannot export ${name}: ${e instanceof Error ? e.message : String(e)}`);
    }
  };
  const stem = () => baseName(editor.store.get().file.name);

  const actions: Actions = {
    set: (path, value) => editor.set(path, value),
    apply: (change) => editor.apply(change),
    setUnits: (u) => editor.setUnits(u),
    setTab: (tab) => { ui.set((s) => ({ ...s, tab })); if (tab === 'field') requestSlice(); },
    setBandFraction: (bandFraction) => ui.set((s) => ({ ...s, bandFraction })),
    setWorkers: (workers) => ui.set((s) => ({ ...s, workers })),
    setOrderCheck: (orderCheck) => ui.set((s) => ({ ...s, orderCheck })),
    setAllowLarge: (allowLarge) => { ui.set((s) => ({ ...s, allowLarge })); requestEstimate(); },
    focusField: (path) => ui.set((s) => ({ ...s, tab: path.startsWith('sweep') || path.startsWith('mesh') || path.startsWith('absorber') ? 'sweep' : 'sketch', focus: { path, n: (s.focus?.n ?? 0) + 1 } })),
    dismissNotice: () => ui.set((s) => ({ ...s, notice: null })),
    dismissRestored: () => editor.dismissRestored(),
    loadDemo(id) {
      const demo = demoById(id);
      if (!demo) return;
      editor.load(demo.draft, { name: demo.fileName, path: null });
      notify('info', `Loaded the demo “${demo.label}” (invented data).`);
    },
    async openFile(file) {
      if (file.size > 4 * 1024 * 1024) return notify('error', `${file.name} is larger than the 4 MB a scenario may be.`);
      const text = await file.text();
      if (loadText(text, file.name, null)) { env.platform.remember(file.name, text); await refreshRecent(); }
    },
    async openDialog() {
      if (!env.platform.openDialog) return;
      try {
        const opened = await env.platform.openDialog();
        if (opened && loadText(opened.text, opened.name, opened.path)) await refreshRecent();
      } catch (e) {
        notify('error', `Cannot open the file: ${e instanceof Error ? e.message : String(e)}`);
      }
    },
    async openRecent(entry) {
      try {
        const opened = await env.platform.openRecent(entry);
        if (!opened) return notify('error', `${entry.name} is no longer available.`);
        if (loadText(opened.text, opened.name, opened.path)) await refreshRecent();
      } catch (e) {
        notify('error', `Cannot open ${entry.name}: ${e instanceof Error ? e.message : String(e)}`);
      }
    },
    async save(saveAs) {
      const s = editor.store.get();
      try {
        const saved = await env.platform.saveScenario(draftText(s.draft), s.file.name, s.file.path, saveAs);
        if (!saved) return;
        editor.markSaved(saved);
        notify('info', env.platform.kind === 'browser' ? `Downloaded ${saved.name}.` : `Saved ${saved.path ?? saved.name}.`);
        await refreshRecent();
      } catch (e) {
        notify('error', `Cannot save: ${e instanceof Error ? e.message : String(e)}`);
      }
    },
    run() {
      const s = editor.store.get(), r = run.get();
      if (runBlocker(s.derived, isActive(r), estimator.store.get(), ui.get().allowLarge) !== null || !s.derived.validation.ok || !s.derived.geometry) return;
      const v = s.derived.validation, n = v.scenario.sweep.frequenciesHz.length;
      const workers = runWorkers(ui.get().workers, env.cores, n, estimator.store.get().info?.workerMemoryBytes ?? 0, env.deviceMemoryGb);
      field.set((f) => ({ ...f, frequencyHz: null, slice: null, status: 'idle', message: null, geometry: s.derived.geometry }));
      sliceKey = '';
      ui.set((u) => ({ ...u, notice: null }));
      runner.start(v.scenario, s.draft, v.warnings, workers, ui.get().allowLarge, ui.get().orderCheck);
    },
    cancel: () => runner.cancel(),
    setField(change) {
      field.set((s) => {
        const next = { ...s, ...change };
        if (change.axis !== undefined && change.axis !== s.axis && change.position === undefined) next.position = null;
        return next;
      });
      requestSlice();
    },
    async exportSpectrum() {
      const report = runReport(run.get(), env.now());
      if (report) await exportText(`${stem()}-spectrum.csv`, 'csv', tableCsv(report.spectrum));
    },
    async exportBands() {
      const r = run.get(), t = bandTable(r, ui.get().bandFraction, env.now());
      if (t) await exportText(`${stem()}-bands-${ui.get().bandFraction === 1 ? 'octave' : 'third-octave'}.csv`, 'csv', tableCsv(t));
    },
    async exportSummary() {
      const report = runReport(run.get(), env.now());
      if (report) await exportText(`${stem()}-summary.json`, 'json', `${JSON.stringify(report.summary, null, 2)}\n`);
    },
    async exportSlice() {
      const f = field.get();
      if (!f.slice) return;
      const axis = 'xyz'[f.slice.axis];
      await exportText(`${stem()}-slice-${Math.round(f.slice.frequencyHz)}Hz-${axis}${Number(f.slice.position.toPrecision(4))}m.csv`, 'csv', sliceCsv(f.slice));
    },
    async exportPlot(name) {
      try {
        const png = await plotPng(name);
        if (png && (await env.platform.exportFile(`${stem()}-${name}.png`, 'png', png))) notify('info', `Exported ${stem()}-${name}.png.`);
      } catch (e) {
        notify('error', `Cannot export the plot: ${e instanceof Error ? e.message : String(e)}`);
      }
    },
  };

  env.platform.onMenuCommand((c: MenuCommand) => {
    const table: Record<MenuCommand, () => void> = {
      open: () => void actions.openDialog(), save: () => void actions.save(false), 'save-as': () => void actions.save(true),
      run: () => actions.run(), cancel: () => actions.cancel(), 'export-spectrum': () => void actions.exportSpectrum(), 'export-bands': () => void actions.exportBands(),
      'tab-sketch': () => actions.setTab('sketch'), 'tab-sweep': () => actions.setTab('sweep'), 'tab-results': () => actions.setTab('results'), 'tab-field': () => actions.setTab('field'),
    };
    table[c]();
  });
  void refreshRecent();

  return { editor, ui, run, field, estimate: estimator.store, env, calibration: () => calibration, actions };
}

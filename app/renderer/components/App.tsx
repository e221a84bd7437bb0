/**
 * The window: header, run bar, tabs and the screen of the current tab. This is the one component that
 * reads the stores; everything below it gets plain props and callbacks.
 */
import { useEffect, useMemo, useState, type DragEvent } from 'react';
import { exposureCautions, modelAssumptions } from '../../../engine/report/cautions.ts';
import type { Issue } from '../../../engine/scenario/index.ts';
import type { Controller } from '../controller.ts';
import { DEMOS } from '../model/demos.ts';
import { indexIssues } from '../model/issues.ts';
import { bandTable, runReport } from '../model/report.ts';
import { isActive, progressOf } from '../model/run.ts';
import { runBlocker } from '../model/scenario.ts';
import { predictedSecondsPerFrequency } from '../model/estimate.ts';
import { estimateSize } from '../../../engine/solve/size.ts';
import { useStore } from '../store/store.ts';
import { changeSweepForm } from '../model/draft.ts';
import { Header } from './Header.tsx';
import { RunBar } from './RunBar.tsx';
import { Tabs } from './Tabs.tsx';
import { SketchView } from './SketchView.tsx';
import { SweepView } from './SweepView.tsx';
import { ResultsView } from './ResultsView.tsx';
import { FieldView } from './FieldView.tsx';
import type { Form } from './form.tsx';

/** The model's assumptions, then the exposure notes without repeating them (as the report does). */
const CAUTIONS = (() => {
  const model = modelAssumptions(), exposure = exposureCautions();
  return [{ ...exposure, lines: exposure.lines.filter((l) => !model.lines.includes(l)) }, model];
})();

const NO_ISSUES: readonly Issue[] = [];

/** Re-renders every half second while a run is active, for the clocks. */
function useTicker(active: boolean): number {
  const [t, setT] = useState(() => Date.now());
  useEffect(() => {
    if (!active) return undefined;
    const id = window.setInterval(() => setT(Date.now()), 500);
    return () => window.clearInterval(id);
  }, [active]);
  return t;
}

export function App({ controller: c }: { controller: Controller }) {
  const editor = useStore(c.editor.store), ui = useStore(c.ui), run = useStore(c.run), field = useStore(c.field), estimate = useStore(c.estimate);
  const a = c.actions, active = isActive(run);
  useTicker(active);
  const now = c.env.now();
  const v = editor.derived.validation;
  const errors = v.ok ? NO_ISSUES : v.errors;
  const form: Form = useMemo(() => ({
    draft: editor.draft, errors: indexIssues(errors), warnings: indexIssues(v.warnings), units: editor.units, onSet: a.set,
  }), [editor.draft, errors, v.warnings, editor.units, a.set]);
  const blocker = runBlocker(editor.derived, active, estimate, ui.allowLarge);
  const report = useMemo(() => runReport(run, now), [run]);
  const bands = useMemo(() => bandTable(run, ui.bandFraction, now), [run, ui.bandFraction]);
  const predicted = estimate.info ? predictedSecondsPerFrequency(estimate.info, c.calibration()) : null;
  const progress = progressOf(run, now, predicted);

  useEffect(() => {
    document.title = `${editor.dirty ? '• ' : ''}${typeof editor.draft.title === 'string' ? editor.draft.title : 'Untitled scenario'} – quietgrid`;
  }, [editor.draft.title, editor.dirty]);
  useEffect(() => {
    if (!ui.focus) return;
    const el = document.querySelector<HTMLElement>(`[data-path="${CSS.escape(ui.focus.path)}"]`);
    el?.scrollIntoView({ block: 'center', behavior: 'smooth' });
    el?.querySelector<HTMLElement>('input, select')?.focus({ preventScroll: true });
  }, [ui.focus]);

  const onDrop = (e: DragEvent) => {
    e.preventDefault();
    const f = e.dataTransfer.files[0];
    if (f) void a.openFile(f);
  };
  const badges = {
    sketch: errors.length > 0 ? String(errors.length) : undefined,
    results: run.record.points.length > 0 ? String(run.record.points.length) : undefined,
  };
  return (
    <div className="app" onDragOver={(e) => e.preventDefault()} onDrop={onDrop}>
      <Header
        title={typeof editor.draft.title === 'string' && editor.draft.title !== '' ? editor.draft.title : 'Untitled scenario'} fileName={editor.file.path ?? editor.file.name} dirty={editor.dirty}
        nativeDialogs={c.env.platform.openDialog !== null} demos={DEMOS} recent={ui.recent}
        onOpenFile={(f) => void a.openFile(f)} onOpenDialog={() => void a.openDialog()} onOpenRecent={(r) => void a.openRecent(r)}
        onLoadDemo={a.loadDemo} onSave={() => void a.save(false)} onSaveAs={() => void a.save(true)}
      />
      {editor.restoredAt !== null && (
        <div className="banner info" role="status">
          Restored the unsaved edits of {editor.file.name} from {new Date(editor.restoredAt).toLocaleString()}.
          <button type="button" className="link" onClick={a.dismissRestored}>OK</button>
        </div>
      )}
      {ui.notice && (
        <div className={`banner ${ui.notice.kind}`} role={ui.notice.kind === 'error' ? 'alert' : 'status'}>
          <span className="notice-text">{ui.notice.text}</span>
          <button type="button" className="link" onClick={a.dismissNotice} aria-label="Dismiss">✕</button>
        </div>
      )}
      <RunBar status={run.status} blocker={blocker} frequencies={run.record.frequencies} checks={run.record.checks} progress={progress} workers={run.workers} onRun={a.run} onCancel={a.cancel} />
      <Tabs active={ui.tab} onSelect={a.setTab} badges={badges} />
      <main id={`panel-${ui.tab}`} role="tabpanel" aria-labelledby={`tab-${ui.tab}`} className={`panel panel-${ui.tab}`}>
        {ui.tab === 'sketch' && (
          <SketchView form={form} errors={errors} geometry={editor.derived.geometry ?? editor.lastGeometry} stale={!editor.derived.geometry && editor.lastGeometry !== null}
            geometryError={editor.derived.geometryError} apply={a.apply} onUnits={a.setUnits} onJump={a.focusField} />
        )}
        {ui.tab === 'sweep' && (
          <SweepView form={form} frequenciesHz={v.ok ? v.scenario.sweep.frequenciesHz : null} estimate={estimate} calibration={c.calibration()}
            cores={c.env.cores} deviceMemoryGb={c.env.deviceMemoryGb} workers={ui.workers} allowLarge={ui.allowLarge} onAllowLarge={a.setAllowLarge}
            quickSize={v.ok && editor.derived.geometry ? estimateSize(v.scenario, editor.derived.geometry) : null}
            onSweepForm={(f) => a.apply((d) => changeSweepForm(d, f, v.ok ? v.scenario.sweep.frequenciesHz : []))} onWorkers={a.setWorkers} orderCheck={ui.orderCheck} onOrderCheck={a.setOrderCheck} />
        )}
        {ui.tab === 'results' && (
          <ResultsView run={run} report={report} bands={bands} bandFraction={ui.bandFraction} cautions={CAUTIONS} onBandFraction={a.setBandFraction}
            onExportSpectrum={() => void a.exportSpectrum()} onExportBands={() => void a.exportBands()} onExportSummary={() => void a.exportSummary()} onExportPlot={(n) => void a.exportPlot(n)} />
        )}
        {ui.tab === 'field' && (
          <FieldView frequenciesHz={run.fieldsHz} frequencyHz={field.frequencyHz} axis={field.axis} position={field.position} quantity={field.quantity} animate={field.animate}
            status={field.status} slice={field.slice} message={field.message} geometry={field.geometry} units={editor.units}
            onChange={a.setField} onExportSlice={() => void a.exportSlice()} onExportPlot={() => void a.exportPlot('slice')} />
        )}
      </main>
    </div>
  );
}

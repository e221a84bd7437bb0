/** Sweep and mesh: which frequencies, how fine a mesh, and what that costs before anything runs. */
import type { MeshInfo } from '../../../engine/solve/problem.ts';
import { getAt, parseFrequencyList, sweepForm, type SweepForm } from '../model/draft.ts';
import { estimateRun, runWorkers, type RunEstimate } from '../model/estimate.ts';
import { formatBytes, formatHz, formatNumber, formatSeconds } from '../model/units.ts';
import { NumberField, SelectField, type Form } from './form.tsx';
import { useId, useState } from 'react';
import { issuesAt, issueText } from '../model/issues.ts';

export interface EstimateView { status: 'idle' | 'working' | 'ready' | 'error'; info: MeshInfo | null; prepareSeconds: number; message: string | null; tooLarge: boolean }

export interface SweepProps {
  form: Form;
  /** The frequencies the sweep gives, when it is valid. */
  frequenciesHz: readonly number[] | null;
  estimate: EstimateView;
  calibration: number;
  cores: number;
  /** The device's memory as the browser reports it, GB (absent: unknown). */
  deviceMemoryGb?: number;
  workers: number | null;
  allowLarge: boolean;
  /** The engine's arithmetic estimate of the size (no grid built), available at once. */
  quickSize: { elements: number; dofs: number } | null;
  onAllowLarge(on: boolean): void;
  onSweepForm(form: SweepForm): void;
  onWorkers(n: number | null): void;
  orderCheck: boolean;
  onOrderCheck(on: boolean): void;
}

const FORMS: { value: SweepForm; label: string }[] = [
  { value: 'octave', label: 'Octave bands' },
  { value: 'third-octave', label: 'Third-octave bands' },
  { value: 'list', label: 'List of frequencies' },
  { value: 'log', label: 'Even steps in log frequency' },
  { value: 'linear', label: 'Even steps in frequency' },
];

function FrequencyListField({ form }: { form: Form }) {
  const id = useId(), v = getAt(form.draft, 'sweep.frequenciesHz'), shown = Array.isArray(v) ? v.join(', ') : '';
  const [typing, setTyping] = useState<string | null>(null);
  const errors = issuesAt(form.errors, 'sweep.frequenciesHz');
  return (
    <div className={`field wide${errors.length ? ' has-issue' : ''}`} data-path="sweep.frequenciesHz">
      <label htmlFor={id}>Frequencies, Hz (separated by commas or spaces)</label>
      <input id={id} type="text" value={typing ?? shown} aria-invalid={errors.length > 0 || undefined} aria-describedby={errors.length ? `${id}-n` : undefined}
        onFocus={() => setTyping(shown)} onBlur={() => setTyping(null)}
        onChange={(e) => { setTyping(e.target.value); form.onSet('sweep.frequenciesHz', parseFrequencyList(e.target.value)); }} />
      {errors.length > 0 && <div className="notes" id={`${id}-n`}>{errors.map((e, i) => <p key={i} className="issue" role="alert">{issueText(e)}</p>)}</div>}
    </div>
  );
}

interface EstimateCardProps { estimate: EstimateView; frequencies: number; workers: number; calibration: number; quickSize: SweepProps['quickSize']; allowLarge: boolean; onAllowLarge(on: boolean): void }

function EstimateCard({ estimate, frequencies, workers, calibration, quickSize, allowLarge, onAllowLarge }: EstimateCardProps) {
  const quick = quickSize && <p className="muted">About {Math.round(quickSize.dofs).toLocaleString('en')} unknowns in {Math.round(quickSize.elements).toLocaleString('en')} elements (estimated from the grading rule).</p>;
  const confirm = (estimate.tooLarge || allowLarge) && (
    <label className="check confirm"><input type="checkbox" checked={allowLarge} onChange={(e) => onAllowLarge(e.target.checked)} /> Run this large problem anyway (it may take long and need much memory)</label>
  );
  if (estimate.status === 'error') return <div className="estimate error" role="status"><h3>Mesh</h3>{quick}<p className="issue">{estimate.message}</p>{confirm}</div>;
  if (!estimate.info) {
    return <div className="estimate" role="status"><h3>Mesh</h3>{quick}<p className="muted">{estimate.status === 'working' ? 'Preparing the mesh in a worker…' : 'Fix the scenario to see the mesh it implies.'}</p>{confirm}</div>;
  }
  const i = estimate.info, e: RunEstimate = estimateRun(i, frequencies, workers, calibration, estimate.prepareSeconds);
  const rows: [string, string][] = [
    ['Element order', String(i.order)],
    ['Elements', formatNumber(i.elements)],
    ['Unknowns (dofs)', i.dofs.toLocaleString('en')],
    ['Matrix entries', i.nnz.toLocaleString('en')],
    ['Factor entries', i.factorNonzeros.toLocaleString('en')],
    ['Absorbing layers', `${i.layers} (${i.absorberKind})`],
    ['Graded for', `${formatHz(i.topFrequencyHz)} at ${formatNumber(i.pointsPerWavelength, 3)} points per wavelength`],
    ['Memory per worker', `about ${formatBytes(e.perWorkerBytes)}`],
    ['Workers', String(e.workers)],
    ['Memory in all', `about ${formatBytes(e.memoryBytes)}`],
    ['Time', `about ${formatSeconds(e.seconds)} for ${frequencies} frequenc${frequencies === 1 ? 'y' : 'ies'}`],
  ];
  return (
    <div className={`estimate${estimate.status === 'working' ? ' working' : ''}`} role="status" aria-live="polite">
      <h3>Mesh and cost {estimate.status === 'working' && <span className="muted">(updating…)</span>}</h3>
      <table className="kv"><tbody>{rows.map(([k, v]) => <tr key={k}><th scope="row">{k}</th><td data-key={k}>{v}</td></tr>)}</tbody></table>
      {(estimate.tooLarge || allowLarge) && <label className="check confirm"><input type="checkbox" checked={allowLarge} onChange={(e) => onAllowLarge(e.target.checked)} /> Run this large problem anyway</label>}
      <p className="hint">From preparing the mesh in a worker ({formatSeconds(estimate.prepareSeconds)}). Time {calibration === 1 ? 'from typical solver speed' : 'scaled by what this machine measured on its last run'}; the memory counts what each worker holds: its mesh and analysis, the matrix, the factor (the solver’s own estimate) and the solve’s vectors.</p>
    </div>
  );
}

export function SweepView({ form, frequenciesHz, estimate, calibration, cores, deviceMemoryGb, workers, allowLarge, quickSize, onAllowLarge, onSweepForm, onWorkers, orderCheck, onOrderCheck }: SweepProps) {
  const kind = sweepForm(form.draft), n = frequenciesHz?.length ?? 0;
  const usedWorkers = runWorkers(workers, cores, n, estimate.info?.workerMemoryBytes ?? 0, deviceMemoryGb);
  return (
    <div className="sweep">
      <div className="form-column">
        <fieldset className="group" data-path="sweep">
          <legend>Frequencies</legend>
          <div className="row">
            <SelectField form={form} path="sweep.spacing" label="Sweep" options={FORMS} value={kind} onChange={(v) => onSweepForm(v as SweepForm)} />
          </div>
          {kind === 'list' ? <div className="row"><FrequencyListField form={form} /></div> : (
            <div className="row">
              <NumberField form={form} path="sweep.fromHz" label={kind === 'octave' || kind === 'third-octave' ? 'Lowest band centre' : 'From'} unit="Hz" />
              <NumberField form={form} path="sweep.toHz" label={kind === 'octave' || kind === 'third-octave' ? 'Highest band centre' : 'To'} unit="Hz" />
              {(kind === 'octave' || kind === 'third-octave')
                ? <NumberField form={form} path="sweep.pointsPerBand" label="Points per band" unit="–" optional placeholder="1" className="narrow" />
                : <NumberField form={form} path="sweep.count" label="Count" unit="–" className="narrow" />}
            </div>
          )}
          {frequenciesHz && (
            <div className="freq-chips" aria-label="Frequencies to solve">
              <span className="muted">{n} frequenc{n === 1 ? 'y' : 'ies'}:</span>
              {frequenciesHz.map((f) => <span key={f} className="chip">{formatNumber(f, 4)}</span>)}
              <span className="muted">Hz</span>
            </div>
          )}
        </fieldset>
        <fieldset className="group" data-path="mesh">
          <legend>Mesh and absorbing layers</legend>
          <p className="hint">Elements are sized for the highest frequency of the sweep. Raise the order or the points per wavelength to check that a result has converged.</p>
          <div className="row">
            <SelectField form={form} path="mesh.order" label="Element order" value={String(getAt(form.draft, 'mesh.order') ?? 4)}
              options={[1, 2, 3, 4, 5, 6].map((p) => ({ value: String(p), label: `${p}${p === 4 ? ' (default)' : ''}` }))} onChange={(v) => form.onSet('mesh.order', Number(v))} />
            <NumberField form={form} path="mesh.pointsPerWavelength" label="Points per wavelength" unit="–" optional placeholder="8" className="narrow" />
          </div>
          <div className="row">
            <SelectField form={form} path="absorber.layers" label="Absorbing layers" value={String(getAt(form.draft, 'absorber.layers') ?? 3)}
              options={Array.from({ length: 12 }, (_, k) => k + 1).map((l) => ({ value: String(l), label: `${l}${l === 3 ? ' (default)' : ''}` }))} onChange={(v) => form.onSet('absorber.layers', Number(v))} />
            <SelectField form={form} path="absorber.kind" label="Layer stretching" value={String(getAt(form.draft, 'absorber.kind') ?? 'discrete')}
              options={[{ value: 'discrete', label: 'per layer (default)' }, { value: 'constant', label: 'constant' }, { value: 'smooth', label: 'smooth' }]} />
            <NumberField form={form} path="absorber.thickness" label="Stack thickness" unit="length" optional placeholder="auto" className="narrow" />
          </div>
          <label className="check order-check">
            <input type="checkbox" checked={orderCheck} onChange={(e) => onOrderCheck(e.target.checked)} />
            {' '}Order check: after the sweep, solve the top frequency and two more again at element order {Number(getAt(form.draft, 'mesh.order') ?? 4) + 1} and flag results that move by more than 0.5 dB
          </label>
        </fieldset>
        <fieldset className="group">
          <legend>Workers</legend>
          <div className="row">
            <div className="field narrow">
              <label htmlFor="qg-workers">Parallel workers</label>
              <div className="with-unit">
                <input id="qg-workers" type="number" min={1} max={64} value={workers ?? ''} placeholder={String(cores)}
                  onChange={(e) => { const v = Number(e.target.value); onWorkers(e.target.value === '' || !(v >= 1) ? null : Math.min(64, Math.round(v))); }} />
                <span className="unit">of {cores} cores</span>
              </div>
            </div>
          </div>
          <p className="hint">Each worker prepares the mesh once and solves its share of the frequencies; by default one per core.</p>
        </fieldset>
      </div>
      <div className="side-column">
        <EstimateCard estimate={estimate} frequencies={n} workers={usedWorkers} calibration={calibration} quickSize={quickSize} allowLarge={allowLarge} onAllowLarge={onAllowLarge} />
      </div>
    </div>
  );
}

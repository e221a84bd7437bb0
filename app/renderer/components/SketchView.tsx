/** Sketch: the scenario's parts as fields beside a to-scale plan and elevation that follow every edit. */
import type { Geometry, Issue } from '../../../engine/scenario/index.ts';
import { OCTAVE_BAND_KEYS } from '../../../engine/scenario/index.ts';
import { alignViews, ductViews, roomViews } from '../model/drawing.ts';
import { getAt, isObject, type Draft } from '../model/draft.ts';
import { issueText } from '../model/issues.ts';
import type { LengthUnit } from '../model/units.ts';
import { bandLabel } from '../model/ticks.ts';
import { BranchesFieldset, LiningsFieldset, OutletFieldset, SectionsFieldset } from './DuctForm.tsx';
import { commonScale, DrawingDefs, DrawingLegend, ViewDrawing } from './Drawing.tsx';
import { NumberField, TextField, type Form } from './form.tsx';
import { RoomFieldsets } from './RoomForm.tsx';

export interface SketchProps {
  form: Form;
  errors: readonly Issue[];
  /** The geometry to draw: the draft's, or the last valid one while the draft is invalid (then `stale`). */
  geometry: Geometry | null;
  stale: boolean;
  geometryError: string | null;
  apply(change: (d: Draft) => Draft): void;
  onUnits(u: LengthUnit): void;
  onJump(path: string): void;
}

export function ProblemList({ errors, onJump }: { errors: readonly Issue[]; onJump(path: string): void }) {
  if (errors.length === 0) return null;
  return (
    <section className="problems" aria-label="Problems to fix">
      <h3>{errors.length === 1 ? 'One problem to fix before running' : `${errors.length} problems to fix before running`}</h3>
      <ol>
        {errors.map((e, i) => (
          <li key={i}><button type="button" className="link" onClick={() => onJump(e.path)}>{e.path || 'scenario'}</button>: {issueText(e)}</li>
        ))}
      </ol>
    </section>
  );
}

function SourcePowerFieldset({ form, kind }: { form: Form; kind: 'duct' | 'room' }) {
  const given = isObject(getAt(form.draft, 'sourcePower'));
  return (
    <fieldset className="group" data-path="sourcePower">
      <legend>Source sound power <span className="optional">optional</span></legend>
      <label className="check">
        <input type="checkbox" checked={given} onChange={() => form.onSet('sourcePower', given ? undefined : { octaveBandsDb: { '125': 85, '250': 82, '500': 78 } })} />
        {kind === 'duct' ? ' Give the fan’s in-duct sound power per octave band (for outlet levels and the A-weighted total)' : ' Give the sources’ total sound power per octave band'}
      </label>
      {kind === 'room' && given && <p className="hint">The engine does not yet scale room levels by this power: receiver levels follow the volume velocities given.</p>}
      {given && (
        <div className="row bands">
          {OCTAVE_BAND_KEYS.map((k) => (
            <NumberField key={k} form={form} path={`sourcePower.octaveBandsDb.${k}`} label={`${bandLabel(Number(k))} Hz`} unit="dB" optional className="narrow" />
          ))}
        </div>
      )}
    </fieldset>
  );
}

export function SketchView({ form, errors, geometry, stale, geometryError, apply, onUnits, onJump }: SketchProps) {
  const isRoom = isObject(getAt(form.draft, 'room'));
  const views = geometry ? alignViews(geometry.kind === 'room' ? roomViews(geometry, form.units) : ductViews(geometry, form.units)) : null;
  const scale = views ? commonScale(views) : 1;
  return (
    <div className="sketch">
      <div className="form-column">
        <ProblemList errors={errors} onJump={onJump} />
        <fieldset className="group">
          <legend>Scenario</legend>
          <div className="row">
            <TextField form={form} path="title" label="Title" className="wide" />
          </div>
          <div className="row">
            <NumberField form={form} path="air.temperatureC" label="Air temperature" unit="°C" optional placeholder="20" className="narrow" />
            <div className="field units-field">
              <span className="label">Lengths in</span>
              <div className="segmented" role="radiogroup" aria-label="Length unit">
                {(['mm', 'm'] as const).map((u) => (
                  <button key={u} type="button" role="radio" aria-checked={form.units === u} className={form.units === u ? 'on' : ''} onClick={() => onUnits(u)}>{u}</button>
                ))}
              </div>
            </div>
          </div>
        </fieldset>
        {isRoom ? <RoomFieldsets form={form} apply={apply} /> : <>
          <SectionsFieldset form={form} actions={{ apply }} />
          <BranchesFieldset form={form} actions={{ apply }} />
          <LiningsFieldset form={form} actions={{ apply }} />
          <OutletFieldset form={form} />
        </>}
        <SourcePowerFieldset form={form} kind={isRoom ? 'room' : 'duct'} />
      </div>
      <div className="drawing-column">
        <DrawingDefs />
        {views ? <>
          {stale && <p className="stale">Showing the last valid sketch: fix the problems marked at the fields to update it.</p>}
          <ViewDrawing view={views[0]} pxPerM={scale} title="Plan" />
          <ViewDrawing view={views[1]} pxPerM={scale} title="Elevation" />
          <DrawingLegend room={geometry!.kind === 'room'} />
          <p className="hint">Drawn to scale, dimensions in {form.units}.</p>
        </> : <p className="empty">{geometryError ?? 'Nothing to draw yet: fix the problems marked at the fields.'}</p>}
      </div>
    </div>
  );
}

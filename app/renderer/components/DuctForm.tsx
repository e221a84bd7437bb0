/** The duct's parts as fields: sections in order, side branches, linings, outlet, incident wave. */
import { LINING_MATERIALS } from '../../../engine/acoustics/materials.ts';
import { DEFAULT_LINING_MODEL } from '../../../engine/scenario/validate-linings.ts';
import { addBranch, addLining, addSection, getAt, isObject, moveItem, removeItem, removeSection, renameSection, type Draft, type Json } from '../model/draft.ts';
import { BoundaryField, ItemButtons, NumberField, SelectField, TextField, type Form } from './form.tsx';

export interface ListActions { apply(change: (d: Draft) => Draft): void }

function list(d: Draft, path: string): Json[] {
  const v = getAt(d, path);
  return Array.isArray(v) ? v : [];
}

function nameAt(v: Json): string {
  return isObject(v) && typeof v.name === 'string' ? v.name : '';
}

const SIDE_OPTIONS = [
  { value: '+z', label: '+z (top)' }, { value: '-z', label: '−z (bottom)' }, { value: '+y', label: '+y (side)' }, { value: '-y', label: '−y (side)' },
];
const FACES = ['-y', '+y', '-z', '+z', '-x', '+x'] as const;
const FACE_WORDS: Record<(typeof FACES)[number], string> = { '-y': '−y side', '+y': '+y side', '-z': 'bottom', '+z': 'top', '-x': 'inlet end', '+x': 'outlet end' };

export function SectionsFieldset({ form, actions }: { form: Form; actions: ListActions }) {
  const sections = list(form.draft, 'duct.sections');
  return (
    <fieldset className="group" data-path="duct.sections">
      <legend>Sections, inlet to outlet</legend>
      <p className="hint">Each section starts where the one before ends; offsets move its cross-section off the duct axis.</p>
      {sections.map((s, i) => {
        const p = `duct.sections[${i}]`, name = nameAt(s) || `section ${i + 1}`;
        return (
          <div className="item" key={i} data-item={p}>
            <div className="item-head">
              <span className="badge">{i + 1}</span>
              <TextField form={form} path={`${p}.name`} label="Name" className="name" onChange={(t) => actions.apply((d) => renameSection(d, i, t))} />
              <ItemButtons label={name} index={i} count={sections.length} canRemove={sections.length > 1}
                onMove={(delta) => actions.apply((d) => moveItem(d, 'duct.sections', i, delta))} onRemove={() => actions.apply((d) => removeSection(d, i))} />
            </div>
            <div className="row">
              <NumberField form={form} path={`${p}.length`} label="Length (x)" unit="length" />
              <NumberField form={form} path={`${p}.width`} label="Width (y)" unit="length" />
              <NumberField form={form} path={`${p}.height`} label="Height (z)" unit="length" />
              <NumberField form={form} path={`${p}.offsetY`} label="Offset y" unit="length" optional placeholder="0" />
              <NumberField form={form} path={`${p}.offsetZ`} label="Offset z" unit="length" optional placeholder="0" />
            </div>
            <div className="item-foot">
              <button type="button" className="link" onClick={() => actions.apply((d) => addSection(d, i))}>+ section after</button>
              <button type="button" className="link" onClick={() => actions.apply((d) => addBranch(d, i))}>+ side branch here</button>
              <button type="button" className="link" onClick={() => actions.apply((d) => addLining(d, i))}>+ lining here</button>
            </div>
          </div>
        );
      })}
    </fieldset>
  );
}

export function BranchesFieldset({ form, actions }: { form: Form; actions: ListActions }) {
  const branches = list(form.draft, 'duct.branches'), sectionNames = list(form.draft, 'duct.sections').map(nameAt);
  if (branches.length === 0) return null;
  return (
    <fieldset className="group" data-path="duct.branches">
      <legend>Side branches</legend>
      <p className="hint">A box standing out of a section wall: a closed end makes a quarter-wave stub; an open end lets sound leave.</p>
      {branches.map((b, i) => {
        const p = `duct.branches[${i}]`, name = nameAt(b) || `branch ${i + 1}`;
        return (
          <div className="item" key={i} data-item={p}>
            <div className="item-head">
              <span className="badge branch">B{i + 1}</span>
              <TextField form={form} path={`${p}.name`} label="Name" className="name" />
              <ItemButtons label={name} index={i} count={branches.length}
                onMove={(delta) => actions.apply((d) => moveItem(d, 'duct.branches', i, delta))} onRemove={() => actions.apply((d) => removeItem(d, 'duct.branches', i))} />
            </div>
            <div className="row">
              <SelectField form={form} path={`${p}.section`} label="On section" options={sectionNames.map((n) => ({ value: n, label: n }))} />
              <SelectField form={form} path={`${p}.side`} label="Wall" options={SIDE_OPTIONS} />
              <NumberField form={form} path={`${p}.at`} label="Centre at (from section start)" unit="length" />
              <NumberField form={form} path={`${p}.length`} label="Depth" unit="length" />
              <NumberField form={form} path={`${p}.width`} label="Width (x)" unit="length" />
              <NumberField form={form} path={`${p}.height`} label="Height (across)" unit="length" />
              <SelectField form={form} path={`${p}.end`} label="End" options={[{ value: 'closed', label: 'closed' }, { value: 'open', label: 'open' }]} value={typeof getAt(form.draft, `${p}.end`) === 'string' ? undefined : 'closed'} />
            </div>
          </div>
        );
      })}
    </fieldset>
  );
}

export function LiningsFieldset({ form, actions }: { form: Form; actions: ListActions }) {
  const linings = list(form.draft, 'linings'), sectionNames = list(form.draft, 'duct.sections').map(nameAt);
  if (linings.length === 0) return null;
  return (
    <fieldset className="group" data-path="linings">
      <legend>Linings</legend>
      <p className="hint">Porous material on inside faces of a section, modelled as an equivalent fluid from its flow resistivity.</p>
      {linings.map((l, i) => {
        const p = `linings[${i}]`, faces = getAt(form.draft, `${p}.faces`), chosen = Array.isArray(faces) ? faces : [];
        const material = getAt(form.draft, `${p}.material`), library = isObject(material) && typeof material.library === 'string' ? material.library : null;
        const model = isObject(material) && typeof material.model === 'string' ? material.model : null;
        const toggle = (face: string) => form.onSet(`${p}.faces`, chosen.includes(face) ? chosen.filter((f) => f !== face) : [...chosen, face]);
        return (
          <div className="item" key={i} data-item={p}>
            <div className="item-head">
              <span className="badge lining">L{i + 1}</span>
              <SelectField form={form} path={`${p}.section`} label="Section" options={sectionNames.map((n) => ({ value: n, label: n }))} />
              <ItemButtons label={`lining ${i + 1}`} index={i} count={linings.length}
                onMove={(delta) => actions.apply((d) => moveItem(d, 'linings', i, delta))} onRemove={() => actions.apply((d) => removeItem(d, 'linings', i))} />
            </div>
            <div className="row">
              <div className="field faces" data-path={`${p}.faces`}>
                <span className="label">Lined faces</span>
                <div className="checks">
                  {FACES.map((f) => (
                    <label key={f}><input type="checkbox" checked={chosen.includes(f)} onChange={() => toggle(f)} /> {FACE_WORDS[f]}</label>
                  ))}
                </div>
              </div>
              <NumberField form={form} path={`${p}.thickness`} label="Thickness" unit="length" />
              <SelectField form={form} path={`${p}.material.library`} label="Material" value={library ?? 'custom'}
                options={[...LINING_MATERIALS.map((m) => ({ value: m.id, label: m.label })), { value: 'custom', label: 'Other: give flow resistivity' }]}
                onChange={(v) => form.onSet(`${p}.material`, v === 'custom' ? { model: model ?? DEFAULT_LINING_MODEL, flowResistivity: 20000 } : { ...(model ? { model } : {}), library: v })} />
              <SelectField form={form} path={`${p}.material.model`} label="Model" value={model ?? DEFAULT_LINING_MODEL}
                options={[{ value: 'delany-bazley', label: 'Delany & Bazley (1970)' }, { value: 'miki', label: 'Miki (1990)' }]} />
              {library === null && <NumberField form={form} path={`${p}.material.flowResistivity`} label="Flow resistivity σ" unit="Pa·s/m²" />}
            </div>
          </div>
        );
      })}
    </fieldset>
  );
}

export function OutletFieldset({ form }: { form: Form }) {
  // The mode is a pair: writing one index writes both, so the file never holds a one-element mode.
  const modeForm: Form = {
    ...form,
    onSet(path, value) {
      const m = /^duct\.incident\.mode\[(\d)\]$/.exec(path);
      if (!m) return form.onSet(path, value);
      const cur = getAt(form.draft, 'duct.incident.mode'), pair: Json[] = Array.isArray(cur) ? [...cur] : [0, 0];
      pair[Number(m[1])] = value ?? 0;
      form.onSet('duct.incident.mode', pair);
    },
  };
  return (
    <fieldset className="group">
      <legend>Outlet and incident wave</legend>
      <div className="row">
        <BoundaryField form={form} path="duct.outlet" label="Outlet" words={[{ value: 'anechoic', label: 'anechoic (duct continues)' }, { value: 'rigid', label: 'closed (rigid)' }]} />
      </div>
      <div className="row">
        <NumberField form={modeForm} path="duct.incident.mode[0]" label="Mode m" unit="–" optional placeholder="0" className="narrow" />
        <NumberField form={modeForm} path="duct.incident.mode[1]" label="Mode n" unit="–" optional placeholder="0" className="narrow" />
        <NumberField form={form} path="duct.incident.amplitudePa" label="Amplitude (peak)" unit="Pa" optional placeholder="1" className="narrow" />
      </div>
    </fieldset>
  );
}

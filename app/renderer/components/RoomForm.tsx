/** The room as fields: size, the six walls, sources and receivers by coordinates. */
import { addReceiver, addSource, getAt, isObject, moveItem, removeItem, type Draft, type Json } from '../model/draft.ts';
import { BoundaryField, ItemButtons, NumberField, TextField, type Form } from './form.tsx';

const WALLS: { key: string; label: string }[] = [
  { key: 'x-', label: 'Wall at x = 0' }, { key: 'x+', label: 'Wall at x = Lx' },
  { key: 'y-', label: 'Wall at y = 0' }, { key: 'y+', label: 'Wall at y = Ly' },
  { key: 'z-', label: 'Floor (z = 0)' }, { key: 'z+', label: 'Ceiling (z = Lz)' },
];

function list(d: Draft, path: string): Json[] {
  const v = getAt(d, path);
  return Array.isArray(v) ? v : [];
}

export function RoomFieldsets({ form, apply }: { form: Form; apply: (change: (d: Draft) => Draft) => void }) {
  const sources = list(form.draft, 'room.sources'), receivers = list(form.draft, 'room.receivers');
  const points = (kind: 'sources' | 'receivers', items: Json[]) => items.map((item, i) => {
    const p = `room.${kind}[${i}]`, name = isObject(item) && typeof item.name === 'string' ? item.name : `${kind} ${i + 1}`;
    return (
      <div className="item" key={i} data-item={p}>
        <div className="item-head">
          <span className={`badge ${kind === 'sources' ? 'source' : 'receiver'}`}>{kind === 'sources' ? 'S' : 'R'}{i + 1}</span>
          <TextField form={form} path={`${p}.name`} label="Name" className="name" />
          <ItemButtons label={name} index={i} count={items.length} canRemove={kind === 'receivers' || items.length > 1}
            onMove={(delta) => apply((d) => moveItem(d, `room.${kind}`, i, delta))} onRemove={() => apply((d) => removeItem(d, `room.${kind}`, i))} />
        </div>
        <div className="row">
          <NumberField form={form} path={`${p}.position[0]`} label="x" unit="length" />
          <NumberField form={form} path={`${p}.position[1]`} label="y" unit="length" />
          <NumberField form={form} path={`${p}.position[2]`} label="z" unit="length" />
          {kind === 'sources' && <NumberField form={form} path={`${p}.volumeVelocity`} label="Volume velocity (peak)" unit="m³/s" />}
        </div>
      </div>
    );
  });
  return (
    <>
      <fieldset className="group" data-path="room.size">
        <legend>Room</legend>
        <p className="hint">Inside dimensions; the room is the box from (0, 0, 0) to (Lx, Ly, Lz).</p>
        <div className="row">
          <NumberField form={form} path="room.size[0]" label="Lx" unit="length" />
          <NumberField form={form} path="room.size[1]" label="Ly" unit="length" />
          <NumberField form={form} path="room.size[2]" label="Lz" unit="length" />
        </div>
      </fieldset>
      <fieldset className="group" data-path="room.walls">
        <legend>Walls</legend>
        <div className="walls">
          {WALLS.map((w) => (
            <BoundaryField key={w.key} form={form} path={`room.walls.${w.key}`} label={w.label} words={[{ value: 'rigid', label: 'rigid' }, { value: 'open', label: 'open (free field)' }]} />
          ))}
        </div>
      </fieldset>
      <fieldset className="group" data-path="room.sources">
        <legend>Sources</legend>
        <p className="hint">Point sources (monopoles), all in phase, strictly inside the room.</p>
        {points('sources', sources)}
        <button type="button" className="link" onClick={() => apply(addSource)}>+ source</button>
      </fieldset>
      <fieldset className="group" data-path="room.receivers">
        <legend>Receivers</legend>
        <p className="hint">Points where the sound pressure level is reported.</p>
        {points('receivers', receivers)}
        <button type="button" className="link" onClick={() => apply(addReceiver)}>+ receiver</button>
      </fieldset>
    </>
  );
}

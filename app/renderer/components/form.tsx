/**
 * Form fields bound to paths of the scenario file. Each shows the validator's problems for its path
 * right under it, in words, and marks itself invalid for assistive technology as well.
 */
import { useId, useState, type ReactNode } from 'react';
import type { Issue } from '../../../engine/scenario/index.ts';
import { getAt, type Draft, type Json } from '../model/draft.ts';
import { issuesAt, issueText, type IssueIndex } from '../model/issues.ts';
import { displayText, LENGTH_SCALE, storedValue, type LengthUnit } from '../model/units.ts';

export interface Form {
  draft: Draft;
  errors: IssueIndex;
  warnings: IssueIndex;
  units: LengthUnit;
  onSet(path: string, value: Json | undefined): void;
}

function Notes({ id, errors, warnings }: { id: string; errors: Issue[]; warnings: Issue[] }) {
  if (errors.length === 0 && warnings.length === 0) return null;
  return (
    <div className="notes" id={id}>
      {errors.map((e, i) => <p key={`e${i}`} className="issue" role="alert">{issueText(e)}</p>)}
      {warnings.map((w, i) => <p key={`w${i}`} className="warning">{issueText(w)}</p>)}
    </div>
  );
}

interface FieldShellProps { form: Form; path: string; label: string; className?: string; children: (p: { id: string; invalid: boolean; describedBy?: string }) => ReactNode }

function FieldShell({ form, path, label, className, children }: FieldShellProps) {
  const id = useId(), errors = issuesAt(form.errors, path), warnings = issuesAt(form.warnings, path);
  const noteId = `${id}-notes`, has = errors.length + warnings.length > 0;
  return (
    <div className={`field${errors.length ? ' has-issue' : warnings.length ? ' has-warning' : ''}${className ? ` ${className}` : ''}`} data-path={path}>
      <label htmlFor={id}>{label}</label>
      {children({ id, invalid: errors.length > 0, describedBy: has ? noteId : undefined })}
      <Notes id={noteId} errors={errors} warnings={warnings} />
    </div>
  );
}

export interface NumberFieldProps {
  form: Form;
  path: string;
  label: string;
  /** 'length': shown in the session's unit; otherwise the unit's label, values as stored. */
  unit: 'length' | string;
  optional?: boolean;
  placeholder?: string;
  className?: string;
}

export function NumberField({ form, path, label, unit, optional, placeholder, className }: NumberFieldProps) {
  const scale = unit === 'length' ? LENGTH_SCALE[form.units] : 1;
  const shown = displayText(getAt(form.draft, path), scale);
  // While the field has focus it shows what is typed ("0." stays "0."), not the stored number re-formatted.
  const [typing, setTyping] = useState<string | null>(null);
  return (
    <FieldShell form={form} path={path} label={label} className={className}>
      {({ id, invalid, describedBy }) => (
        <div className="with-unit">
          <input
            id={id} type="text" inputMode="decimal" autoComplete="off" spellCheck={false} value={typing ?? shown} placeholder={placeholder}
            aria-invalid={invalid || undefined} aria-describedby={describedBy}
            onFocus={() => setTyping(shown)} onBlur={() => setTyping(null)}
            onChange={(e) => { setTyping(e.target.value); form.onSet(path, storedValue(e.target.value, scale, optional ?? false)); }}
          />
          <span className="unit">{unit === 'length' ? form.units : unit}</span>
        </div>
      )}
    </FieldShell>
  );
}

export interface TextFieldProps { form: Form; path: string; label: string; onChange?: (text: string) => void; className?: string; wide?: boolean }

export function TextField({ form, path, label, onChange, className }: TextFieldProps) {
  const v = getAt(form.draft, path);
  return (
    <FieldShell form={form} path={path} label={label} className={className}>
      {({ id, invalid, describedBy }) => (
        <input id={id} type="text" autoComplete="off" value={typeof v === 'string' ? v : ''} aria-invalid={invalid || undefined} aria-describedby={describedBy}
          onChange={(e) => (onChange ? onChange(e.target.value) : form.onSet(path, e.target.value))} />
      )}
    </FieldShell>
  );
}

export interface SelectFieldProps { form: Form; path: string; label: string; options: readonly { value: string; label: string }[]; className?: string; onChange?: (value: string) => void; value?: string }

export function SelectField({ form, path, label, options, className, onChange, value }: SelectFieldProps) {
  const v = value ?? getAt(form.draft, path);
  return (
    <FieldShell form={form} path={path} label={label} className={className}>
      {({ id, invalid, describedBy }) => (
        <select id={id} value={typeof v === 'string' ? v : ''} aria-invalid={invalid || undefined} aria-describedby={describedBy}
          onChange={(e) => (onChange ? onChange(e.target.value) : form.onSet(path, e.target.value))}>
          {typeof v === 'string' && !options.some((o) => o.value === v) && <option value={v}>{v}</option>}
          {options.map((o) => <option key={o.value} value={o.value}>{o.label}</option>)}
        </select>
      )}
    </FieldShell>
  );
}

type BoundaryKind = 'word' | 'absorption' | 'impedance';

/**
 * A boundary: one of the words ("anechoic", "rigid", "open"…) or a locally reacting surface given by its
 * absorption coefficient or its normalised impedance.
 */
export function BoundaryField({ form, path, label, words }: { form: Form; path: string; label: string; words: readonly { value: string; label: string }[] }) {
  const v = getAt(form.draft, path);
  const kind: BoundaryKind = v !== null && typeof v === 'object' && !Array.isArray(v) ? ('impedance' in v ? 'impedance' : 'absorption') : 'word';
  const current = kind === 'word' ? (typeof v === 'string' ? v : words[0].value) : kind;
  const options = [...words, { value: 'absorption', label: 'absorbing (α)' }, { value: 'impedance', label: 'impedance (z/ρc)' }];
  const change = (value: string) => {
    if (value === 'absorption') form.onSet(path, { absorption: 0.5 });
    else if (value === 'impedance') form.onSet(path, { impedance: [2, 0] });
    else form.onSet(path, value);
  };
  return (
    <div className="boundary">
      <SelectField form={form} path={path} label={label} options={options} value={current} onChange={change} />
      {kind === 'absorption' && <NumberField form={form} path={`${path}.absorption`} label="α" unit="–" className="narrow" />}
      {kind === 'impedance' && <>
        <NumberField form={form} path={`${path}.impedance[0]`} label="Re z" unit="ρc" className="narrow" />
        <NumberField form={form} path={`${path}.impedance[1]`} label="Im z" unit="ρc" className="narrow" />
      </>}
    </div>
  );
}

export function ItemButtons({ label, index, count, onMove, onRemove, canRemove = true }: { label: string; index: number; count: number; onMove: (delta: -1 | 1) => void; onRemove: () => void; canRemove?: boolean }) {
  return (
    <span className="item-buttons">
      <button type="button" className="icon" title={`Move ${label} up`} aria-label={`Move ${label} up`} disabled={index === 0} onClick={() => onMove(-1)}>↑</button>
      <button type="button" className="icon" title={`Move ${label} down`} aria-label={`Move ${label} down`} disabled={index === count - 1} onClick={() => onMove(1)}>↓</button>
      <button type="button" className="icon danger" title={`Remove ${label}`} aria-label={`Remove ${label}`} disabled={!canRemove} onClick={onRemove}>✕</button>
    </span>
  );
}

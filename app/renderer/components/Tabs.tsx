/** The four screens of the app, as tabs. */
import type { Tab } from '../controller.ts';

export const TABS: readonly { id: Tab; label: string }[] = [
  { id: 'sketch', label: 'Sketch' }, { id: 'sweep', label: 'Sweep & mesh' }, { id: 'results', label: 'Results' }, { id: 'field', label: 'Field slices' },
];

export function Tabs({ active, onSelect, badges }: { active: Tab; onSelect(t: Tab): void; badges: Partial<Record<Tab, string>> }) {
  return (
    <div className="tabs" role="tablist" aria-label="Screens">
      {TABS.map((t) => (
        <button key={t.id} type="button" role="tab" id={`tab-${t.id}`} aria-selected={active === t.id} aria-controls={`panel-${t.id}`} className={active === t.id ? 'on' : ''} onClick={() => onSelect(t.id)}>
          {t.label}{badges[t.id] && <span className="tab-badge">{badges[t.id]}</span>}
        </button>
      ))}
    </div>
  );
}

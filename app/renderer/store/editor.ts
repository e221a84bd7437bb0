/**
 * The editor: the draft scenario, what follows from it, the length unit, and which file it came from.
 * Every change is autosaved (storage is localStorage in the app), so unsaved edits survive a crash or a
 * reload; the saved copy is restored on the next start.
 */
import type { Geometry } from '../../../engine/scenario/index.ts';
import { setAt, type Draft, type Json } from '../model/draft.ts';
import { derive, type Derived } from '../model/scenario.ts';
import type { LengthUnit } from '../model/units.ts';
import { createStore, type Store } from './store.ts';

export interface FileRef { name: string; path: string | null }

export interface EditorState {
  draft: Draft;
  derived: Derived;
  /** The geometry of the last valid draft: what the drawing shows while the draft is invalid. */
  lastGeometry: Geometry | null;
  units: LengthUnit;
  file: FileRef;
  /** The draft as last opened or saved, as text: edits since make it dirty. */
  savedText: string;
  dirty: boolean;
  /** When the draft was restored from the autosave (ms since 1970), for the banner; null otherwise. */
  restoredAt: number | null;
}

export interface KeyValueStorage {
  getItem(key: string): string | null;
  setItem(key: string, value: string): void;
  removeItem(key: string): void;
}

export const AUTOSAVE_KEY = 'quietgrid.autosave.v1';
export const UNITS_KEY = 'quietgrid.units';

interface Autosave { draft: Draft; file: FileRef; savedText: string; at: number }

export function draftText(d: Draft): string {
  return `${JSON.stringify(d, null, 2)}\n`;
}

function stateFor(draft: Draft, file: FileRef, savedText: string, units: LengthUnit, previous: Geometry | null, restoredAt: number | null): EditorState {
  const derived = derive(draft);
  return { draft, derived, lastGeometry: derived.geometry ?? previous, units, file, savedText, dirty: draftText(draft) !== savedText, restoredAt };
}

export interface Editor {
  store: Store<EditorState>;
  /** Sets one field by its path in the scenario file; undefined removes it. */
  set(path: string, value: Json | undefined): void;
  /** Applies a list operation (add, remove, move…) to the draft. */
  apply(change: (d: Draft) => Draft): void;
  /** Replaces the draft with an opened file or a demo. */
  load(draft: Draft, file: FileRef): void;
  markSaved(file: FileRef): void;
  setUnits(units: LengthUnit): void;
  dismissRestored(): void;
}

export function createEditor(storage: KeyValueStorage, fallback: { draft: Draft; file: FileRef }, now: () => number = Date.now): Editor {
  const units: LengthUnit = storage.getItem(UNITS_KEY) === 'm' ? 'm' : 'mm';
  const saved = readAutosave(storage);
  const initial = saved
    ? stateFor(saved.draft, saved.file, saved.savedText, units, null, draftText(saved.draft) !== saved.savedText ? saved.at : null)
    : stateFor(fallback.draft, fallback.file, draftText(fallback.draft), units, null, null);
  const store = createStore(initial);

  const persist = (s: EditorState) => {
    const record: Autosave = { draft: s.draft, file: s.file, savedText: s.savedText, at: now() };
    try {
      storage.setItem(AUTOSAVE_KEY, JSON.stringify(record));
    } catch {
      // Storage full or refused: the edit stands, only its crash copy is missing.
    }
  };
  const replace = (draft: Draft, file: FileRef, savedText: string, restoredAt: number | null) => {
    const s = store.get(), next = stateFor(draft, file, savedText, s.units, s.lastGeometry, restoredAt);
    store.set(next);
    persist(next);
  };

  return {
    store,
    set(path, value) {
      const s = store.get();
      replace(setAt(s.draft, path, value), s.file, s.savedText, s.restoredAt);
    },
    apply(change) {
      const s = store.get(), d = change(s.draft);
      if (d !== s.draft) replace(d, s.file, s.savedText, s.restoredAt);
    },
    load(draft, file) {
      replace(draft, file, draftText(draft), null);
    },
    markSaved(file) {
      const s = store.get();
      replace(s.draft, file, draftText(s.draft), null);
    },
    setUnits(u) {
      storage.setItem(UNITS_KEY, u);
      store.set((s) => ({ ...s, units: u }));
    },
    dismissRestored() {
      store.set((s) => ({ ...s, restoredAt: null }));
    },
  };
}

function readAutosave(storage: KeyValueStorage): Autosave | null {
  try {
    const text = storage.getItem(AUTOSAVE_KEY);
    if (!text) return null;
    const v = JSON.parse(text) as Partial<Autosave>;
    if (!v || typeof v !== 'object' || !v.draft || typeof v.draft !== 'object' || Array.isArray(v.draft)) return null;
    const file = v.file && typeof v.file.name === 'string' ? { name: v.file.name, path: typeof v.file.path === 'string' ? v.file.path : null } : { name: 'scenario.json', path: null };
    return { draft: v.draft, file, savedText: typeof v.savedText === 'string' ? v.savedText : '', at: typeof v.at === 'number' ? v.at : 0 };
  } catch {
    return null;
  }
}

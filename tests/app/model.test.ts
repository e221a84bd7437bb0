// The renderer's plain models: the draft and its edits, units, issues placed at fields, autosave.
import { describe, expect, it } from 'vitest';
import { validateScenario } from '../../engine/scenario/index.ts';
import {
  addBranch, addSection, changeSweepForm, freshName, getAt, moveItem, parseFrequencyList, parsePath, removeSection, renameSection, setAt, type Draft,
} from '../../app/renderer/model/draft.ts';
import { displayText, formatClock, storedValue } from '../../app/renderer/model/units.ts';
import { indexIssues, issuesAt, issueText } from '../../app/renderer/model/issues.ts';
import { derive, runBlocker } from '../../app/renderer/model/scenario.ts';
import { DEMOS, demoById } from '../../app/renderer/model/demos.ts';
import { AUTOSAVE_KEY, createEditor, draftText, type KeyValueStorage } from '../../app/renderer/store/editor.ts';

const plant = () => structuredClone(demoById('plant-room-supply-silencer')!.draft);

function memoryStorage(): KeyValueStorage & { data: Map<string, string> } {
  const data = new Map<string, string>();
  return { data, getItem: (k) => data.get(k) ?? null, setItem: (k, v) => { data.set(k, v); }, removeItem: (k) => { data.delete(k); } };
}

describe('draft paths', () => {
  it('parse the validator\'s issue paths', () => {
    expect(parsePath('duct.sections[10].length')).toEqual(['duct', 'sections', 10, 'length']);
    expect(parsePath('room.sources[0].position[2]')).toEqual(['room', 'sources', 0, 'position', 2]);
    expect(parsePath('room.walls.x-')).toEqual(['room', 'walls', 'x-']);
  });
  it('set a value without touching the original, sharing what did not change', () => {
    const d = plant(), e = setAt(d, 'duct.sections[1].length', 0.5);
    expect(getAt(e, 'duct.sections[1].length')).toBe(0.5);
    expect(getAt(d, 'duct.sections[1].length')).toBe(0.6);
    expect(getAt(e, 'duct.sections[0]')).toBe(getAt(d, 'duct.sections[0]'));
    expect(e.sweep).toBe(d.sweep);
  });
  it('remove a key with undefined and create missing parents', () => {
    const d = setAt(setAt(plant(), 'air', undefined), 'mesh.order', 3);
    expect('air' in d).toBe(false);
    expect(setAt({}, 'duct.incident.mode', [1, 0])).toEqual({ duct: { incident: { mode: [1, 0] } } });
  });
});

describe('list edits', () => {
  it('add a section after another, with a fresh name and the same cross-section', () => {
    const d = addSection(plant(), 0), s = getAt(d, 'duct.sections') as Draft[];
    expect(s.map((x) => x.name)).toEqual(['fan side', 'section', 'chamber', 'room side']);
    expect(s[1].width).toBe(0.2);
    expect(validateScenario(d).ok).toBe(true);
  });
  it('rename a section and the branches and linings on it', () => {
    let d = addBranch(plant(), 1);
    d = renameSection(d, 1, 'big box');
    expect(getAt(d, 'duct.branches[0].section')).toBe('big box');
    expect(validateScenario(d).ok).toBe(true);
  });
  it('remove a section with what stands on it, and move sections', () => {
    const d = removeSection(addBranch(plant(), 1), 1);
    expect(getAt(d, 'duct.branches')).toEqual([]);
    expect((getAt(moveItem(plant(), 'duct.sections', 0, 1), 'duct.sections') as Draft[]).map((s) => s.name)).toEqual(['chamber', 'fan side', 'room side']);
    expect(moveItem(plant(), 'duct.sections', 0, -1)).toEqual(plant());
  });
  it('name new parts apart from existing ones', () => {
    expect(freshName(['branch', 'branch 2'], 'branch')).toBe('branch 3');
  });
});

describe('sweep forms', () => {
  it('turn a band sweep into the list of its frequencies and back into a range', () => {
    const v = validateScenario(plant());
    if (!v.ok) throw new Error('demo invalid');
    const list = changeSweepForm(plant(), 'list', v.scenario.sweep.frequenciesHz);
    expect(getAt(list, 'sweep.frequenciesHz')).toEqual([63.1, 79.4, 100, 125.9, 158.5, 199.5, 251.2, 316.2, 398.1, 501.2, 631]);
    const octave = changeSweepForm(list, 'octave', [63.1, 631]);
    expect(getAt(octave, 'sweep')).toEqual({ fromHz: 63.1, toHz: 631, spacing: 'octave' });
  });
  it('read typed lists, keeping what is not a number for the validator to name', () => {
    expect(parseFrequencyList('125, 250 500;1000')).toEqual([125, 250, 500, 1000]);
    const d = setAt(plant(), 'sweep', { frequenciesHz: parseFrequencyList('125, 2x0') });
    const v = validateScenario(d);
    expect(v.ok).toBe(false);
    if (!v.ok) expect(v.errors.map((e) => e.path)).toContain('sweep.frequenciesHz[1]');
  });
});

describe('units', () => {
  it('store millimetres as metres and show them back without float noise', () => {
    expect(storedValue('60', 1000, false)).toBe(0.06);
    expect(displayText(0.06, 1000)).toBe('60');
    expect(displayText(0.6 * 3, 1000)).toBe('1800');
    expect(storedValue('0,5', 1, false)).toBe(0.5);
  });
  it('keep text that is not a number, and empty optional fields as absent', () => {
    expect(storedValue('abc', 1000, false)).toBe('abc');
    expect(storedValue('  ', 1000, true)).toBeUndefined();
    expect(storedValue('', 1000, false)).toBe('');
  });
  it('write clocks', () => {
    expect(formatClock(7.4)).toBe('0:07');
    expect(formatClock(3723)).toBe('1:02:03');
  });
});

describe('issues at fields', () => {
  it('place the validator\'s message at the field\'s path, without the path and value', () => {
    const d = setAt(plant(), 'duct.sections[1].width', -0.45), v = validateScenario(d);
    if (v.ok) throw new Error('should be invalid');
    const at = issuesAt(indexIssues(v.errors), 'duct.sections[1].width');
    expect(at).toHaveLength(1);
    expect(issueText(at[0])).toMatch(/^The section width \(along y\) must be between 0.001 and 10000 m; fix: /);
    expect(issuesAt(indexIssues(v.errors), 'duct.sections[0].width')).toEqual([]);
  });
  it('give a position\'s coordinate issue to the position', () => {
    const room = structuredClone(demoById('generator-room-small')!.draft);
    const v = validateScenario(setAt(room, 'room.receivers[0].position[1]', 5));
    if (v.ok) throw new Error('should be invalid');
    expect(issuesAt(indexIssues(v.errors), 'room.receivers[0].position[1]').map((i) => i.rule)).toEqual(['inside-room']);
  });
  it('say why the run is disabled', () => {
    expect(runBlocker(derive(plant()), false)).toBeNull();
    expect(runBlocker(derive(plant()), true)).toBe('A run is in progress.');
    const reason = runBlocker(derive(setAt(plant(), 'duct.sections[0].length', 'abc')), false);
    expect(reason).toMatch(/^Cannot run: one problem in the scenario\. First: duct\.sections\[0\]\.length = "abc"/);
    expect(runBlocker(derive(plant()), false, { tooLarge: true }, false)).toMatch(/larger than runs without asking/);
  });
  it('every demo is valid and has a geometry', () => {
    for (const demo of DEMOS) {
      const d = derive(demo.draft);
      expect(d.validation.ok, demo.id).toBe(true);
      expect(d.geometry, demo.id).not.toBeNull();
    }
  });
});

describe('editor autosave', () => {
  const fallback = { draft: plant(), file: { name: 'plant.json', path: null } };
  it('starts clean on the fallback, and a fresh editor on the same storage restores an unsaved edit', () => {
    const storage = memoryStorage();
    const a = createEditor(storage, fallback, () => 1234);
    expect(a.store.get().dirty).toBe(false);
    a.set('duct.sections[1].length', 0.75);
    expect(a.store.get().dirty).toBe(true);
    expect(storage.data.has(AUTOSAVE_KEY)).toBe(true);
    const b = createEditor(storage, fallback);
    expect(getAt(b.store.get().draft, 'duct.sections[1].length')).toBe(0.75);
    expect(b.store.get().dirty).toBe(true);
    expect(b.store.get().restoredAt).toBe(1234);
  });
  it('is clean again once saved, and keeps the last valid geometry while the draft is invalid', () => {
    const storage = memoryStorage(), e = createEditor(storage, fallback);
    e.set('duct.sections[1].length', 'x');
    expect(e.store.get().derived.geometry).toBeNull();
    expect(e.store.get().lastGeometry?.duct?.sections[1].x1).toBeCloseTo(1.0, 12);
    e.set('duct.sections[1].length', 0.5);
    e.markSaved({ name: 'plant.json', path: null });
    expect(e.store.get().dirty).toBe(false);
    expect(e.store.get().savedText).toBe(draftText(e.store.get().draft));
    expect(createEditor(storage, fallback).store.get().restoredAt).toBeNull();
  });
  it('ignores a broken autosave', () => {
    const storage = memoryStorage();
    storage.setItem(AUTOSAVE_KEY, '{not json');
    expect(createEditor(storage, fallback).store.get().draft).toEqual(fallback.draft);
  });
});

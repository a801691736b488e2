import { describe, expect, it } from 'vitest';
import { checkForSave, draftKey, emptyFields, fieldKey, inputErrors, nextSave, parseMileage, readDraft, saveStateLabel, toCaseBody, writeDraft, type KeyValueStore, type StoredDraft } from '../../../features/cases/draft';
import { activeFilterCount, filtersFromParams, toggleSort, toQueryString, withFilter } from '../../../features/cases/list-query';
import { insertSyntax } from '../../../features/markdown/editing';

function memoryStore(): KeyValueStore & { map: Map<string, string> } {
  const map = new Map<string, string>();
  return { map, getItem: (k) => map.get(k) ?? null, setItem: (k, v) => void map.set(k, v), removeItem: (k) => void map.delete(k) };
}

describe('toolbar insertions', () => {
  it('puts a heading marker at the start of the current line and keeps the cursor in its place', () => {
    const edit = insertSyntax('Idle rough\nMore', { start: 4, end: 4 }, 'heading');
    expect(edit.text).toBe('## Idle rough\nMore');
    expect(edit.text.slice(0, edit.selection.start)).toBe('## Idle');
  });

  it('turns each selected line into a checklist item', () => {
    const text = 'check coil\ncheck plug';
    expect(insertSyntax(text, { start: 0, end: text.length }, 'checklist').text).toBe('- [ ] check coil\n- [ ] check plug');
  });

  it('wraps a selected word in backticks and a multi-line selection in a fence', () => {
    expect(insertSyntax('read P0302 now', { start: 5, end: 10 }, 'code').text).toBe('read `P0302` now');
    expect(insertSyntax('a\nb', { start: 0, end: 3 }, 'code').text).toBe('```\na\nb\n```\n');
  });

  it('inserts a table on its own paragraph with the cursor in the first empty cell', () => {
    const edit = insertSyntax('Readings:', { start: 9, end: 9 }, 'table');
    expect(edit.text.startsWith('Readings:\n\n| Test | Reading | Spec |\n| --- | --- | --- |\n|  |  |  |\n')).toBe(true);
    expect(edit.text.slice(edit.selection.start - 2, edit.selection.start + 2)).toBe('|  |');
    expect(edit.text.slice(0, edit.selection.start)).toContain('| --- | --- | --- |\n| ');
  });

  it('clamps a cursor beyond the text', () => {
    expect(insertSyntax('x', { start: 99, end: 99 }, 'list').text).toBe('- x');
  });
});

describe('the draft as an API body', () => {
  it('sends no vehicle when no vehicle field is filled, and nulls for empty cause and fix', () => {
    const body = toCaseBody({ ...emptyFields(), title: ' Misfire cyl 2 ' });
    expect(body).toMatchObject({ title: 'Misfire cyl 2', vehicle: null, rootCause: null, fix: null, codes: [], symptoms: [] });
  });

  it('reads mileage typed with spaces or separators as a whole number', () => {
    expect(parseMileage('84 200')).toBe(84200);
    expect(parseMileage('84,200')).toBe(84200);
    expect(parseMileage('')).toBeUndefined();
    expect(parseMileage('84k')).toBeNaN();
  });

  it('holds back a draft without a title, naming the field', () => {
    const check = checkForSave(emptyFields());
    expect(check.ok).toBe(false);
    if (!check.ok) expect(Object.keys(check.errors)).toContain('title');
  });

  it('holds back a bad VIN with checkVin’s reason beside the VIN input', () => {
    const check = checkForSave({ ...emptyFields(), title: 'Lean idle', vin: '1M8GDM9AXKP04278' });
    expect(check.ok).toBe(false);
    if (!check.ok) expect(check.errors.vin).toMatch(/17 characters/);
  });

  it('accepts a complete draft', () => {
    // 49 CFR 565 worked example VIN 1M8GDM9AXKP042788 (references.md §3)
    const check = checkForSave({ ...emptyFields(), title: 'Lean idle', vin: '1M8GDM9AXKP042788', mileage: '120 000', codes: ['P0171'] });
    expect(check.ok).toBe(true);
  });

  it('keys server field errors like the inputs', () => {
    expect(fieldKey('vehicle.vin')).toBe('vin');
    expect(fieldKey(['codes', 2])).toBe('codes');
    expect(inputErrors({ 'vehicle.mileage': 'Mileage must be a number.', title: 'x' })).toEqual({ mileage: 'Mileage must be a number.', title: 'x' });
  });
});

describe('the draft on the device', () => {
  const draft: StoredDraft = { caseId: 4, version: 2, dirty: true, savedAt: null, fields: { ...emptyFields(), title: 'Boost leak', body: 'Smoke test at 1.0 bar' } };

  it('round-trips through storage', () => {
    const store = memoryStore();
    expect(writeDraft(store, draftKey(1, 4), draft)).toBe(true);
    expect(readDraft(store, draftKey(1, 4))).toEqual(draft);
  });

  it('keeps drafts of different people apart', () => {
    expect(draftKey(1, 'new')).not.toBe(draftKey(2, 'new'));
  });

  it('ignores a corrupt or foreign entry instead of crashing', () => {
    const store = memoryStore();
    store.setItem('k', '{not json');
    expect(readDraft(store, 'k')).toBeNull();
    store.setItem('k', JSON.stringify({ caseId: 'x' }));
    expect(readDraft(store, 'k')).toBeNull();
    expect(readDraft(null, 'k')).toBeNull();
  });

  it('reports a device that refuses to store', () => {
    const full: KeyValueStore = { getItem: () => null, removeItem: () => undefined, setItem: () => { throw new Error('QuotaExceededError'); } };
    expect(writeDraft(full, 'k', draft)).toBe(false);
  });

  it('creates once, then patches with the version it was based on', () => {
    expect(nextSave({ caseId: null, version: null })).toEqual({ kind: 'create' });
    expect(nextSave({ caseId: 4, version: 2 })).toEqual({ kind: 'patch', id: 4, version: 2 });
  });

  it('says the save state in words', () => {
    expect(saveStateLabel({ kind: 'saved', at: new Date(2026, 0, 5, 12, 4) })).toBe('Saved 12:04');
    expect(saveStateLabel({ kind: 'offline' })).toBe('Offline — kept on this device');
    expect(saveStateLabel({ kind: 'saving' })).toBe('Saving…');
  });
});

describe('case-list filters in the URL', () => {
  it('keeps only known, non-empty parameters', () => {
    expect(filtersFromParams({ status: 'review', code: ['P0302', 'P0301'], junk: 'x', tag: '' })).toEqual({ status: 'review', code: 'P0302' });
  });

  it('writes a stable query string', () => {
    expect(toQueryString({ code: 'P0302', status: 'draft' }, 20)).toBe('status=draft&code=P0302&pageSize=20');
  });

  it('flips the direction when the same column is pressed again and resets the page', () => {
    const once = toggleSort({ page: '3' }, 'status');
    expect(once).toMatchObject({ sort: 'status', dir: 'desc', page: undefined });
    expect(toggleSort(once, 'status').dir).toBe('asc');
    expect(toggleSort(once, 'title').dir).toBe('asc');
  });

  it('goes back to page 1 when a filter changes, and counts active filters', () => {
    const f = withFilter({ page: '2', sort: 'title' }, 'mine', '1');
    expect(f.page).toBeUndefined();
    expect(activeFilterCount(f)).toBe(1);
    expect(withFilter({ page: '2' }, 'page', '3').page).toBe('3');
  });
});

// The editor's draft: plain form fields, how they become an API body, and how they are kept on the
// device (localStorage) so a reload or a lost connection loses nothing. No React here: unit-tested.
import { z } from 'zod';
import { caseCreateSchema, type CaseDetail } from '../../shared/schemas/cases';

export interface DraftFields {
  title: string;
  body: string;
  platformId: number | null;
  codes: string[];
  symptoms: string[];
  vin: string;
  plate: string;
  mileage: string;
  mileageUnit: 'km' | 'mi';
  visitDate: string;
  rootCause: string;
  fix: string;
  /** Global tree cause id (`misfire/coil`) the case confirms, or null. */
  cause: string | null;
}

export interface StoredDraft {
  caseId: number | null;
  /** the server version these fields were based on (null before the first save) */
  version: number | null;
  fields: DraftFields;
  /** true while the device holds changes the server has not acknowledged */
  dirty: boolean;
  savedAt: string | null;
}

export const emptyFields = (): DraftFields => ({
  title: '',
  body: '',
  platformId: null,
  codes: [],
  symptoms: [],
  vin: '',
  plate: '',
  mileage: '',
  mileageUnit: 'km',
  visitDate: '',
  rootCause: '',
  fix: '',
  cause: null,
});

export function fieldsFromCase(c: CaseDetail): DraftFields {
  return {
    title: c.title,
    body: c.body,
    platformId: c.platform?.id ?? null,
    codes: [...c.codes],
    symptoms: [...c.symptoms],
    vin: c.vehicle?.vin ?? '',
    plate: c.vehicle?.plate ?? '',
    mileage: c.vehicle?.mileage == null ? '' : String(c.vehicle.mileage),
    mileageUnit: c.vehicle?.mileageUnit ?? 'km',
    visitDate: c.visitDate ?? '',
    rootCause: c.rootCause ?? '',
    fix: c.fix ?? '',
    cause: c.cause,
  };
}

const orNull = (s: string) => (s.trim() ? s.trim() : null);

/** Mileage as typed ("84 200", "84,200") to a whole number; NaN keeps the schema's own message. */
export function parseMileage(text: string): number | undefined {
  const digits = text.replace(/[\s,._']/g, '');
  if (!digits) return undefined;
  return /^\d+$/.test(digits) ? Number(digits) : Number.NaN;
}

function vehicleBody(f: DraftFields) {
  const mileage = parseMileage(f.mileage);
  const v = {
    ...(f.vin.trim() ? { vin: f.vin.trim() } : {}),
    ...(f.plate.trim() ? { plate: f.plate.trim() } : {}),
    ...(mileage !== undefined ? { mileage, mileageUnit: f.mileageUnit } : {}),
    ...(f.visitDate.trim() ? { visitDate: f.visitDate.trim() } : {}),
  };
  return Object.keys(v).length ? v : null;
}

/** The JSON body for POST /api/cases (and, with a version, for PATCH). */
export function toCaseBody(f: DraftFields) {
  return {
    title: f.title.trim(),
    body: f.body,
    platformId: f.platformId,
    vehicle: vehicleBody(f),
    codes: f.codes,
    symptoms: f.symptoms,
    rootCause: orNull(f.rootCause),
    fix: orNull(f.fix),
    cause: f.cause,
  };
}

/** Field name for an error path: vehicle.vin -> vin, so it lands beside the right input. */
export function fieldKey(path: readonly PropertyKey[] | string): string {
  const parts = typeof path === 'string' ? path.split('.') : path.map(String);
  const named = parts.filter((p) => !/^\d+$/.test(p));
  return named[0] === 'vehicle' && named[1] ? named[1] : (named[0] ?? 'form');
}

export type SaveCheck = { ok: true; body: ReturnType<typeof toCaseBody> } | { ok: false; errors: Record<string, string> };

/** Checks the draft with the server's own schema before sending, so autosave never sends what must fail. */
export function checkForSave(f: DraftFields): SaveCheck {
  const body = toCaseBody(f);
  const parsed = caseCreateSchema.safeParse(body);
  if (parsed.success) return { ok: true, body };
  const errors: Record<string, string> = {};
  for (const issue of parsed.error.issues) errors[fieldKey(issue.path)] ??= issue.message;
  return { ok: false, errors };
}

/** Server field errors ({'vehicle.vin': '...'}) keyed like the inputs. */
export function inputErrors(fields: Record<string, string>): Record<string, string> {
  const out: Record<string, string> = {};
  for (const [name, message] of Object.entries(fields)) out[fieldKey(name)] ??= message;
  return out;
}

// ---- on the device ----

export interface KeyValueStore {
  getItem(key: string): string | null;
  setItem(key: string, value: string): void;
  removeItem(key: string): void;
}

/** One draft per signed-in user and case ("new" before the first save), so people sharing a device stay apart. */
export const draftKey = (userId: number, caseKey: number | 'new') => `causeway:case-draft:${userId}:${caseKey}`;

const storedDraftSchema = z.object({
  caseId: z.number().nullable(),
  version: z.number().nullable(),
  dirty: z.boolean(),
  savedAt: z.string().nullable(),
  fields: z.object({
    title: z.string(),
    body: z.string(),
    platformId: z.number().nullable(),
    codes: z.array(z.string()),
    symptoms: z.array(z.string()),
    vin: z.string(),
    plate: z.string(),
    mileage: z.string(),
    mileageUnit: z.enum(['km', 'mi']),
    visitDate: z.string(),
    rootCause: z.string(),
    fix: z.string(),
    // drafts kept by a build before the cause picker have none
    cause: z.string().nullable().default(null),
  }),
});

export function readDraft(store: KeyValueStore | null, key: string): StoredDraft | null {
  if (!store) return null;
  try {
    const raw = store.getItem(key);
    if (!raw) return null;
    const parsed = storedDraftSchema.safeParse(JSON.parse(raw));
    return parsed.success ? parsed.data : null;
  } catch {
    return null;
  }
}

/** False when the device refused (private mode, quota): the screen then says so. */
export function writeDraft(store: KeyValueStore | null, key: string, draft: StoredDraft): boolean {
  if (!store) return false;
  try {
    store.setItem(key, JSON.stringify(draft));
    return true;
  } catch {
    return false;
  }
}

export function deviceStore(): KeyValueStore | null {
  try {
    return typeof globalThis.localStorage === 'undefined' ? null : globalThis.localStorage;
  } catch {
    return null;
  }
}

// ---- what the editor says about saving ----

export type SaveState =
  | { kind: 'idle' }
  | { kind: 'saving' }
  | { kind: 'saved'; at: Date }
  | { kind: 'offline' }
  | { kind: 'held'; reason: string }
  | { kind: 'error'; message: string }
  | { kind: 'conflict' };

const hhmm = (d: Date) => `${String(d.getHours()).padStart(2, '0')}:${String(d.getMinutes()).padStart(2, '0')}`;

export function saveStateLabel(state: SaveState): string {
  switch (state.kind) {
    case 'idle':
      return 'Not saved yet';
    case 'saving':
      return 'Saving…';
    case 'saved':
      return `Saved ${hhmm(state.at)}`;
    case 'offline':
      return 'Offline — kept on this device';
    case 'held':
      return `Kept on this device — ${state.reason}`;
    case 'error':
      return `Not saved — ${state.message}`;
    case 'conflict':
      return 'Not saved — someone else saved a newer version';
  }
}

/** The first save creates the case; every later one patches it with the version it was based on. */
export function nextSave(draft: Pick<StoredDraft, 'caseId' | 'version'>): { kind: 'create' } | { kind: 'patch'; id: number; version: number } {
  return draft.caseId !== null && draft.version !== null ? { kind: 'patch', id: draft.caseId, version: draft.version } : { kind: 'create' };
}

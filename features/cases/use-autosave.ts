// Autosave: every change goes to this device at once (debounced) and to the server when it can.
// POST once, then PATCH with the version; a 409 stops saving until the person picks a version.
import { useCallback, useEffect, useRef, useState } from 'react';
import type { CaseDetail } from '../../shared/schemas/cases';
import { ApiError } from '../api/client';
import { conflictCurrent, createCase, patchCase } from './api';
import { checkForSave, deviceStore, fieldsFromCase, inputErrors, nextSave, writeDraft, type DraftFields, type SaveState, type StoredDraft } from './draft';

const LOCAL_DELAY_MS = 300;
const SERVER_DELAY_MS = 1500;

const same = (a: DraftFields, b: DraftFields) => JSON.stringify(a) === JSON.stringify(b);

function heldReason(errors: Record<string, string>, fields: DraftFields): string {
  if (errors.title && fields.title.trim().length < 3) return 'give it a title (3 letters or more) to save';
  return 'fix the marked fields to save';
}

export function useAutosave(storageKey: string, initial: StoredDraft, options: { startInConflict?: CaseDetail | null } = {}) {
  const [fields, setFields] = useState(initial.fields);
  const [saveState, setSaveState] = useState<SaveState>(initial.savedAt && !initial.dirty ? { kind: 'saved', at: new Date(initial.savedAt) } : { kind: 'idle' });
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [conflict, setConflict] = useState<CaseDetail | null>(options.startInConflict ?? null);
  const [caseId, setCaseId] = useState(initial.caseId);
  const [localFailed, setLocalFailed] = useState(false);

  // Refs hold the latest values for timers and in-flight saves.
  const latest = useRef({ fields: initial.fields, caseId: initial.caseId, version: initial.version, dirty: initial.dirty, savedAt: initial.savedAt });
  const conflictRef = useRef(conflict);
  conflictRef.current = conflict;
  const inFlight = useRef(false);
  const again = useRef(false);
  const localTimer = useRef<ReturnType<typeof setTimeout> | null>(null);
  const serverTimer = useRef<ReturnType<typeof setTimeout> | null>(null);

  const keepLocally = useCallback(() => {
    const { fields: f, caseId: id, version, dirty, savedAt } = latest.current;
    setLocalFailed(!writeDraft(deviceStore(), storageKey, { caseId: id, version, fields: f, dirty, savedAt }));
  }, [storageKey]);

  const flush = useCallback(async (): Promise<boolean> => {
    if (conflictRef.current) return false;
    if (inFlight.current) {
      again.current = true;
      return false;
    }
    const sent = latest.current.fields;
    const check = checkForSave(sent);
    if (!check.ok) {
      setErrors(check.errors);
      setSaveState({ kind: 'held', reason: heldReason(check.errors, sent) });
      return false;
    }
    if (!latest.current.dirty && latest.current.caseId !== null) return true;
    if (typeof navigator !== 'undefined' && navigator.onLine === false) {
      setSaveState({ kind: 'offline' });
      return false;
    }
    inFlight.current = true;
    setSaveState({ kind: 'saving' });
    let ok = false;
    try {
      const plan = nextSave(latest.current);
      const saved = plan.kind === 'create' ? await createCase(check.body) : await patchCase(plan.id, { ...check.body, version: plan.version });
      const now = new Date();
      latest.current = { ...latest.current, caseId: saved.id, version: saved.version, dirty: !same(sent, latest.current.fields), savedAt: now.toISOString() };
      setCaseId(saved.id);
      setErrors({});
      setSaveState({ kind: 'saved', at: now });
      ok = true;
    } catch (err) {
      const current = conflictCurrent(err);
      if (current) {
        setConflict(current);
        setSaveState({ kind: 'conflict' });
      } else if (err instanceof ApiError && err.status === 0) setSaveState({ kind: 'offline' });
      else if (err instanceof ApiError) {
        setErrors(inputErrors(err.fields));
        setSaveState({ kind: 'error', message: err.message });
      } else setSaveState({ kind: 'error', message: 'something went wrong' });
    } finally {
      inFlight.current = false;
      keepLocally();
    }
    if (again.current) {
      again.current = false;
      if (latest.current.dirty) return flush();
    }
    return ok && !latest.current.dirty;
  }, [keepLocally]);

  const update = useCallback(
    (patch: Partial<DraftFields>) => {
      setFields((prev) => {
        const next = { ...prev, ...patch };
        latest.current = { ...latest.current, fields: next, dirty: true };
        return next;
      });
      if (localTimer.current) clearTimeout(localTimer.current);
      localTimer.current = setTimeout(keepLocally, LOCAL_DELAY_MS);
      if (serverTimer.current) clearTimeout(serverTimer.current);
      serverTimer.current = setTimeout(() => void flush(), SERVER_DELAY_MS);
    },
    [flush, keepLocally],
  );

  /** Save now (Done, before an upload); the case id once the server has everything, else null. */
  const saveNow = useCallback(async (): Promise<number | null> => {
    if (serverTimer.current) clearTimeout(serverTimer.current);
    keepLocally();
    return (await flush()) ? latest.current.caseId : null;
  }, [flush, keepLocally]);

  const keepMine = useCallback(() => {
    const current = conflictRef.current;
    if (!current) return;
    latest.current = { ...latest.current, version: current.version, dirty: true };
    conflictRef.current = null;
    setConflict(null);
    void flush();
  }, [flush]);

  const takeTheirs = useCallback(() => {
    const current = conflictRef.current;
    if (!current) return;
    const theirs = fieldsFromCase(current);
    const now = new Date();
    latest.current = { fields: theirs, caseId: current.id, version: current.version, dirty: false, savedAt: now.toISOString() };
    conflictRef.current = null;
    setConflict(null);
    setFields(theirs);
    setErrors({});
    setSaveState({ kind: 'saved', at: now });
    keepLocally();
  }, [keepLocally]);

  useEffect(() => {
    const online = () => void flush();
    if (typeof window !== 'undefined') window.addEventListener('online', online);
    // Unsent changes from an earlier visit go out as soon as the editor opens.
    if (initial.dirty && !options.startInConflict) void flush();
    return () => {
      if (typeof window !== 'undefined') window.removeEventListener('online', online);
      if (localTimer.current) {
        clearTimeout(localTimer.current);
        keepLocally();
      }
      if (serverTimer.current) clearTimeout(serverTimer.current);
    };
  }, []); // eslint-disable-line react-hooks/exhaustive-deps

  return { fields, update, saveState, errors, conflict, keepMine, takeTheirs, saveNow, caseId, localFailed, version: () => latest.current.version };
}

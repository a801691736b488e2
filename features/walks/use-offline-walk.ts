// A walk that keeps working at the car: the server copy when there is one, else the last
// copy kept in localStorage; marks go into a queue first and are sent in order, now or
// when the connection returns (window "online" event, plus a retry every 15 s).
import { useCallback, useEffect, useMemo, useRef, useState } from 'react';
import type { StepMarkInput, WalkResponse } from '../../shared/schemas/walks';
import { ApiError } from '../api/client';
import { sendMark, useWalk } from './api';
import { applyQueued, enqueue, flushQueue, loadWalk, memoryStore, queuedFor, saveWalk, waitingLabel, type KeyValueStore, type SendResult } from './offline-queue';

const RETRY_MS = 15_000;

let fallback: KeyValueStore | null = null;
function browserStore(): KeyValueStore {
  try {
    const ls = globalThis.localStorage;
    if (ls) return ls;
  } catch {
    // Storage blocked (private mode settings): keep the queue in memory for this tab.
  }
  fallback ??= memoryStore();
  return fallback;
}

const isOnline = () => (typeof navigator === 'undefined' ? true : navigator.onLine !== false);

async function send(walkId: number, stepId: string, mark: StepMarkInput): Promise<SendResult> {
  try {
    return { ok: true, walk: await sendMark(walkId, stepId, mark) };
  } catch (error) {
    if (error instanceof ApiError) {
      // No connection or a server fault: try again later. A 4xx is the walk's answer.
      const retry = error.status === 0 || error.status >= 500 || error.status === 401;
      return { ok: false, retry, message: error.message };
    }
    return { ok: false, retry: true, message: 'The mark could not be sent.' };
  }
}

export interface OfflineWalk {
  walk: WalkResponse | undefined;
  error: unknown;
  /** True when the walk shown is the copy kept on this device. */
  fromCache: boolean;
  waiting: number;
  online: boolean;
  banner: string | null;
  refused: string[];
  mark: (stepId: string, mark: StepMarkInput) => void;
  retry: () => void;
  dismissRefused: () => void;
}

export function useOfflineWalk(id: number): OfflineWalk {
  const store = useMemo(browserStore, []);
  const { data, error, mutate } = useWalk(id);
  const [cached] = useState(() => loadWalk(store, id));
  const [queueVersion, setQueueVersion] = useState(0);
  const [online, setOnline] = useState(isOnline);
  const [refused, setRefused] = useState<string[]>([]);
  const flushing = useRef(false);

  useEffect(() => {
    if (data) saveWalk(store, data);
  }, [data, store]);

  const flush = useCallback(async () => {
    if (flushing.current || queuedFor(store, id).length === 0) return;
    flushing.current = true;
    try {
      const result = await flushQueue(store, (m) => send(m.walkId, m.stepId, m.mark));
      const latest = result.walks.get(id);
      if (latest) await mutate(latest, { revalidate: false });
      if (result.refused.length) {
        setRefused((r) => [...r, ...result.refused.filter((x) => x.mark.walkId === id).map((x) => x.message)]);
        await mutate();
      }
      setOnline(result.waiting === 0 ? true : isOnline());
    } finally {
      flushing.current = false;
      setQueueVersion((v) => v + 1);
    }
  }, [id, mutate, store]);

  useEffect(() => {
    const up = () => {
      setOnline(true);
      void flush();
    };
    const down = () => setOnline(false);
    globalThis.addEventListener?.('online', up);
    globalThis.addEventListener?.('offline', down);
    const timer = setInterval(() => void flush(), RETRY_MS);
    void flush();
    return () => {
      globalThis.removeEventListener?.('online', up);
      globalThis.removeEventListener?.('offline', down);
      clearInterval(timer);
    };
  }, [flush]);

  const queue = useMemo(() => queuedFor(store, id), [store, id, queueVersion]); // eslint-disable-line react-hooks/exhaustive-deps
  const base = data ?? cached ?? undefined;
  const walk = useMemo(() => (base ? applyQueued(base, queue) : undefined), [base, queue]);

  const mark = useCallback(
    (stepId: string, m: StepMarkInput) => {
      enqueue(store, id, stepId, m);
      setQueueVersion((v) => v + 1);
      void flush();
    },
    [flush, id, store],
  );

  const offlineNow = !online || (error instanceof ApiError && error.status === 0);
  return {
    walk,
    error: walk ? null : error,
    fromCache: !data && Boolean(cached),
    waiting: queue.length,
    online: !offlineNow,
    banner: waitingLabel(queue.length, !offlineNow) ?? (offlineNow && walk ? 'Offline — showing the copy kept on this device' : null),
    refused,
    mark,
    retry: () => {
      void mutate();
      void flush();
    },
    dismissRefused: () => setRefused([]),
  };
}

// The walk at the car on bad Wi-Fi: the last copy of each walk and the marks not yet sent,
// kept in a key-value store (localStorage in the browser). Pure apart from the store handed in,
// so it is unit-tested without a browser.
import { z } from 'zod';
import { stepMarkSchema, walkResponseSchema, type StepMarkInput, type WalkResponse } from '../../shared/schemas/walks';
import { markStep, WalkError } from '../../shared/walk';

export interface KeyValueStore {
  getItem(key: string): string | null;
  setItem(key: string, value: string): void;
  removeItem(key: string): void;
}

export interface QueuedMark {
  walkId: number;
  stepId: string;
  mark: StepMarkInput;
  /** Order the marks were made in; they are sent in this order. */
  seq: number;
}

const queuedMarkSchema = z.object({ walkId: z.number(), stepId: z.string(), mark: stepMarkSchema, seq: z.number() });

const walkKey = (id: number) => `causeway.walk.${id}`;
const QUEUE_KEY = 'causeway.walk-marks';

function readJson(store: KeyValueStore, key: string): unknown {
  try {
    const raw = store.getItem(key);
    return raw === null ? null : (JSON.parse(raw) as unknown);
  } catch {
    return null;
  }
}

function writeJson(store: KeyValueStore, key: string, value: unknown): void {
  try {
    store.setItem(key, JSON.stringify(value));
  } catch {
    // A full or blocked store only costs the offline copy; the server still has the walk.
  }
}

export function saveWalk(store: KeyValueStore, walk: WalkResponse): void {
  writeJson(store, walkKey(walk.id), walk);
}

/** The last copy of a walk, or null when there is none or it no longer reads (an older build). */
export function loadWalk(store: KeyValueStore, id: number): WalkResponse | null {
  const parsed = walkResponseSchema.safeParse(readJson(store, walkKey(id)));
  return parsed.success ? parsed.data : null;
}

export function allQueued(store: KeyValueStore): QueuedMark[] {
  const parsed = z.array(queuedMarkSchema).safeParse(readJson(store, QUEUE_KEY));
  return parsed.success ? [...parsed.data].sort((a, b) => a.seq - b.seq) : [];
}

export const queuedFor = (store: KeyValueStore, walkId: number) => allQueued(store).filter((m) => m.walkId === walkId);

function writeQueue(store: KeyValueStore, marks: QueuedMark[]): void {
  if (marks.length === 0) store.removeItem(QUEUE_KEY);
  else writeJson(store, QUEUE_KEY, marks);
}

export function enqueue(store: KeyValueStore, walkId: number, stepId: string, mark: StepMarkInput): QueuedMark {
  const queue = allQueued(store);
  const entry: QueuedMark = { walkId, stepId, mark, seq: (queue.at(-1)?.seq ?? 0) + 1 };
  writeQueue(store, [...queue, entry]);
  return entry;
}

function dequeue(store: KeyValueStore, seq: number): void {
  writeQueue(store, allQueued(store).filter((m) => m.seq !== seq));
}

/**
 * The walk as the tech will see it once the queued marks arrive, worked out with the
 * same markStep the server runs. A mark the walk cannot take is skipped here; the
 * server will refuse it too and the flush reports why.
 */
export function applyQueued(walk: WalkResponse, marks: readonly QueuedMark[]): WalkResponse {
  return marks
    .filter((m) => m.walkId === walk.id)
    .reduce<WalkResponse>((w, m) => {
      try {
        return markStep(w, m.stepId, m.mark) as WalkResponse;
      } catch (error) {
        if (error instanceof WalkError) return w;
        throw error;
      }
    }, walk);
}

export type SendResult = { ok: true; walk: WalkResponse } | { ok: false; retry: boolean; message: string };

export interface FlushResult {
  sent: number;
  /** Marks the server refused for good (e.g. the walk was finished on another device). */
  refused: { mark: QueuedMark; message: string }[];
  /** Marks still waiting because the connection dropped again. */
  waiting: number;
  /** The newest walk copies the server sent back, by id. */
  walks: Map<number, WalkResponse>;
}

/**
 * Send the queued marks oldest first. A mark leaves the queue once the server answers
 * it, with the walk or a refusal; on a network failure (or a server fault) the flush
 * stops so later marks never overtake an earlier one.
 */
export async function flushQueue(store: KeyValueStore, send: (m: QueuedMark) => Promise<SendResult>): Promise<FlushResult> {
  const result: FlushResult = { sent: 0, refused: [], waiting: 0, walks: new Map() };
  const queue = allQueued(store);
  for (let i = 0; i < queue.length; i++) {
    const m = queue[i]!;
    const answer = await send(m);
    if (!answer.ok && answer.retry) {
      result.waiting = queue.length - i;
      return result;
    }
    dequeue(store, m.seq);
    if (answer.ok) {
      result.sent += 1;
      result.walks.set(m.walkId, answer.walk);
      saveWalk(store, answer.walk);
    } else {
      result.refused.push({ mark: m, message: answer.message });
    }
  }
  return result;
}

/** "Offline — 2 marks waiting", in words, for the banner. */
export function waitingLabel(count: number, online: boolean): string | null {
  if (count === 0) return null;
  const marks = `${count} mark${count === 1 ? '' : 's'} waiting`;
  return online ? `Sending — ${marks}` : `Offline — ${marks}`;
}

/** An in-memory store for where localStorage is missing or blocked. */
export function memoryStore(): KeyValueStore {
  const data = new Map<string, string>();
  return {
    getItem: (k) => data.get(k) ?? null,
    setItem: (k, v) => void data.set(k, v),
    removeItem: (k) => void data.delete(k),
  };
}

import { describe, expect, it } from 'vitest';
import {
  allQueued,
  applyQueued,
  enqueue,
  flushQueue,
  loadWalk,
  memoryStore,
  queuedFor,
  saveWalk,
  waitingLabel,
  type QueuedMark,
  type SendResult,
} from '../../../features/walks/offline-queue';
import type { WalkResponse } from '../../../shared/schemas/walks';
import { markStep, startWalk } from '../../../shared/walk';
import { evidence, syntheticTree } from '../walk/helpers';

// The worked example of references.md §5: p = 0.5, 0.3, 0.2; c = 10, 2, 5 minutes.
const tree = syntheticTree([
  { id: 'a', weight: 0.5, minutes: 10 },
  { id: 'b', weight: 0.3, minutes: 2 },
  { id: 'c', weight: 0.2, minutes: 5 },
]);

function walkResponse(id = 7): WalkResponse {
  const ev = evidence({ symptoms: ['test'] });
  return {
    ...startWalk(tree, ev),
    id,
    revision: 1,
    owner: { id: 1, name: 'Jem' },
    platform: null,
    evidence: ev,
    query: null,
    caseId: null,
    alternatives: [],
    treeReasons: ['symptom test'],
    precedents: [],
    createdAt: '2026-01-01T00:00:00.000Z',
    updatedAt: '2026-01-01T00:00:00.000Z',
  };
}

/** A fake server: applies each mark with the shared engine, or fails as told. */
function server(walk: WalkResponse, failAt: Partial<Record<number, 'network' | 'refuse'>> = {}) {
  let current = walk;
  const seen: number[] = [];
  const send = async (m: QueuedMark): Promise<SendResult> => {
    seen.push(m.seq);
    const failure = failAt[m.seq];
    if (failure === 'network') return { ok: false, retry: true, message: 'No connection' };
    if (failure === 'refuse') return { ok: false, retry: false, message: 'This walk is finished.' };
    current = { ...(markStep(current, m.stepId, m.mark) as WalkResponse), revision: current.revision + 1 };
    return { ok: true, walk: current };
  };
  return { send, seen, current: () => current };
}

describe('walk copy in the store', () => {
  it('survives a reload: a saved walk reads back equal', () => {
    const store = memoryStore();
    const w = walkResponse();
    saveWalk(store, w);
    expect(loadWalk(store, w.id)).toEqual(w);
    expect(loadWalk(store, 999)).toBeNull();
  });

  it('drops a copy that no longer reads instead of showing it', () => {
    const store = memoryStore();
    store.setItem('causeway.walk.7', '{"version":2}');
    expect(loadWalk(store, 7)).toBeNull();
    store.setItem('causeway.walk.7', 'not json');
    expect(loadWalk(store, 7)).toBeNull();
  });
});

describe('queued marks', () => {
  it('keeps marks in the order they were made, per walk', () => {
    const store = memoryStore();
    enqueue(store, 7, 'b', { state: 'tested', outcome: 'no_fault' });
    enqueue(store, 8, 'a', { state: 'ruled_out', note: 'seen fine' });
    enqueue(store, 7, 'a', { state: 'tested', outcome: 'no_fault' });
    expect(allQueued(store).map((m) => m.seq)).toEqual([1, 2, 3]);
    expect(queuedFor(store, 7).map((m) => m.stepId)).toEqual(['b', 'a']);
  });

  it('shows the walk as it will be once the marks arrive, renormalised', () => {
    const store = memoryStore();
    const w = walkResponse();
    enqueue(store, w.id, 'b', { state: 'tested', outcome: 'no_fault' });
    const shown = applyQueued(w, queuedFor(store, w.id));
    // ruling out b leaves 0.5 / 0.7 and 0.2 / 0.7 (references.md §5)
    expect(shown.steps.find((s) => s.id === 'a')?.probability).toBeCloseTo(0.714286, 6);
    expect(shown.steps.find((s) => s.id === 'c')?.probability).toBeCloseTo(0.285714, 6);
    expect(shown.id).toBe(w.id);
    expect(shown.revision).toBe(w.revision);
  });

  it('skips a queued mark the walk cannot take instead of failing the whole view', () => {
    const w = walkResponse();
    const marks: QueuedMark[] = [
      { walkId: w.id, stepId: 'a', mark: { state: 'tested', outcome: 'fault_found' }, seq: 1 },
      { walkId: w.id, stepId: 'b', mark: { state: 'tested', outcome: 'no_fault' }, seq: 2 },
    ];
    const shown = applyQueued(w, marks);
    expect(shown.status).toBe('finished');
    expect(shown.steps.find((s) => s.id === 'b')?.state).toBe('open');
  });
});

describe('flushQueue', () => {
  it('sends every mark in order and empties the queue', async () => {
    const store = memoryStore();
    const w = walkResponse();
    enqueue(store, w.id, 'b', { state: 'tested', outcome: 'no_fault' });
    enqueue(store, w.id, 'c', { state: 'ruled_out', note: 'new part last week' });
    const srv = server(w);
    const result = await flushQueue(store, srv.send);
    expect(srv.seen).toEqual([1, 2]);
    expect(result).toMatchObject({ sent: 2, waiting: 0, refused: [] });
    expect(allQueued(store)).toEqual([]);
    expect(loadWalk(store, w.id)?.revision).toBe(3);
    expect(result.walks.get(w.id)?.steps[0]?.id).toBe('a');
  });

  it('stops at a network failure and keeps that mark and the later ones for the next try', async () => {
    const store = memoryStore();
    const w = walkResponse();
    enqueue(store, w.id, 'b', { state: 'tested', outcome: 'no_fault' });
    enqueue(store, w.id, 'c', { state: 'tested', outcome: 'no_fault' });
    enqueue(store, w.id, 'a', { state: 'tested', outcome: 'fault_found' });
    const first = await flushQueue(store, server(w, { 2: 'network' }).send);
    expect(first).toMatchObject({ sent: 1, waiting: 2 });
    expect(allQueued(store).map((m) => m.seq)).toEqual([2, 3]);
    expect(waitingLabel(first.waiting, false)).toBe('Offline — 2 marks waiting');
    const second = await flushQueue(store, server(w).send);
    expect(second).toMatchObject({ sent: 2, waiting: 0 });
    expect(allQueued(store)).toEqual([]);
  });

  it('drops a mark the server refuses and reports why, then carries on', async () => {
    const store = memoryStore();
    const w = walkResponse();
    enqueue(store, w.id, 'b', { state: 'tested', outcome: 'no_fault' });
    enqueue(store, w.id, 'c', { state: 'tested', outcome: 'no_fault' });
    const result = await flushQueue(store, server(w, { 1: 'refuse' }).send);
    expect(result.sent).toBe(1);
    expect(result.refused.map((r) => [r.mark.stepId, r.message])).toEqual([['b', 'This walk is finished.']]);
    expect(allQueued(store)).toEqual([]);
  });
});

describe('waitingLabel', () => {
  it('says in words how many marks wait, and nothing when none do', () => {
    expect(waitingLabel(0, false)).toBeNull();
    expect(waitingLabel(1, false)).toBe('Offline — 1 mark waiting');
    expect(waitingLabel(3, true)).toBe('Sending — 3 marks waiting');
  });
});

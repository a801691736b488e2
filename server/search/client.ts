// The app's handle on its search workers (worker.ts): config.searchWorkers threads
// per app instance, started with the first router, stopped with the app. Each holds
// its own copy of the index; a search goes to the worker with the fewest waiting.
// Requests and answers are messages; errors come back as HttpErrors. A worker that
// dies is started again on its next request (it rebuilds its index; /api/health
// says "building" meanwhile).
import { Worker } from 'node:worker_threads';
import { localWrites } from '../../db/client';
import type { Actor } from '../../shared/policy';
import type { SearchQuery, SearchResponse } from '../../shared/schemas/search';
import type { AppContext } from '../context';
import { HttpError } from '../http/errors';
import type { SearchIndexStatus } from './service';
import type { WorkerReply, WorkerRequest } from './worker-protocol';

type Pending = { resolve: (value: unknown) => void; reject: (err: unknown) => void };
type Request = WorkerRequest extends infer R ? (R extends { id: number } ? Omit<R, 'id'> : never) : never;

const STARTING: SearchIndexStatus = {
  state: 'starting',
  shops: { ready: 0, building: 0 },
  cases: 0,
  lastChangeId: 0,
  buildMs: null,
  gaps: { open: 0, filled: 0, expired: 0 },
  reconcile: { runs: 0, drifted: 0, repaired: 0, lastAt: null, lastMs: null },
};
const entry = new URL(`./worker.${import.meta.url.endsWith('.ts') ? 'ts' : 'js'}`, import.meta.url).href;
const unavailable = (why: string) => new HttpError(503, 'search_unavailable', why);

/** One worker thread and the requests waiting on it. */
class SearchWorker {
  private worker: Worker | null = null;
  private pending = new Map<number, Pending>();
  private nextId = 1;
  private stopped = false;

  constructor(private readonly ctx: AppContext) {
    this.start();
  }

  get waiting(): number {
    return this.pending.size;
  }

  send(req: Request): Promise<unknown> {
    if (this.stopped) return Promise.reject(unavailable('Search is shut down.'));
    const worker = this.worker ?? this.start();
    const id = this.nextId++;
    return new Promise((resolve, reject) => {
      this.pending.set(id, { resolve, reject });
      worker.postMessage({ ...req, id } as WorkerRequest);
    });
  }

  async stop(): Promise<void> {
    if (this.stopped || !this.worker) return;
    const worker = this.worker;
    const exited = new Promise<void>((resolve) => worker.once('exit', () => resolve()));
    await this.send({ kind: 'stop' }).catch(() => undefined);
    this.stopped = true;
    await Promise.race([exited, new Promise((r) => setTimeout(r, 2000).unref())]);
    await worker.terminate();
  }

  private start(): Worker {
    const { config } = this.ctx;
    const worker = new Worker(new URL('./worker-boot.mjs', import.meta.url), { workerData: { entry, config } });
    worker.unref(); // an app that is done does not wait on its index
    worker.on('message', (reply: WorkerReply) => this.settle(reply));
    worker.on('error', (err) => this.ctx.log.error({ err }, 'search worker failed'));
    worker.on('exit', () => {
      if (this.worker === worker) this.worker = null;
      for (const [id, p] of this.pending) {
        this.pending.delete(id);
        p.reject(unavailable('Search is restarting. Try again in a moment.'));
      }
    });
    this.worker = worker;
    return worker;
  }

  private settle(reply: WorkerReply) {
    const p = this.pending.get(reply.id);
    if (!p) return;
    this.pending.delete(reply.id);
    if (reply.ok) p.resolve(reply.value);
    else p.reject(new HttpError(reply.error.status, reply.error.code, reply.error.message));
  }
}

/** Several workers' index states as one: ready when all are, as far along as the slowest; counters add up. */
function combine(states: SearchIndexStatus[]): SearchIndexStatus {
  const order: SearchIndexStatus['state'][] = ['error', 'stopped', 'starting', 'building', 'ready'];
  const state = order.find((s) => states.some((x) => x.state === s)) ?? 'starting';
  const min = (f: (s: SearchIndexStatus) => number) => Math.min(...states.map(f));
  const sum = (f: (s: SearchIndexStatus) => number) => states.reduce((n, s) => n + f(s), 0);
  const latest = states.map((s) => s.reconcile).sort((x, y) => (y.lastAt ?? '').localeCompare(x.lastAt ?? ''))[0]!;
  return {
    state,
    shops: { ready: min((s) => s.shops.ready), building: Math.max(...states.map((s) => s.shops.building)) },
    cases: min((s) => s.cases),
    lastChangeId: min((s) => s.lastChangeId),
    buildMs: states.some((s) => s.buildMs === null) ? null : Math.max(...states.map((s) => s.buildMs!)),
    gaps: { open: sum((s) => s.gaps.open), filled: sum((s) => s.gaps.filled), expired: sum((s) => s.gaps.expired) },
    reconcile: {
      runs: sum((s) => s.reconcile.runs),
      drifted: sum((s) => s.reconcile.drifted),
      repaired: sum((s) => s.reconcile.repaired),
      lastAt: latest.lastAt,
      lastMs: latest.lastMs,
    },
  };
}

export class SearchClient {
  private readonly workers: SearchWorker[];
  private turn = 0;
  private stopped = false;

  constructor(ctx: AppContext) {
    this.workers = Array.from({ length: ctx.config.searchWorkers }, () => new SearchWorker(ctx));
  }

  search(actor: Actor, query: SearchQuery): Promise<SearchResponse> {
    const worker = this.leastBusy();
    return worker.send({ kind: 'search', actor, query, writes: localWrites() }) as Promise<SearchResponse>;
  }

  /** The worker with the fewest searches waiting; ties go round in turn. */
  private leastBusy(): SearchWorker {
    const n = this.workers.length;
    const start = this.turn++ % n;
    let best = this.workers[start]!;
    for (let i = 1; i < n; i++) {
      const w = this.workers[(start + i) % n]!;
      if (w.waiting < best.waiting) best = w;
    }
    return best;
  }

  async status(): Promise<SearchIndexStatus> {
    if (this.stopped) return { ...STARTING, state: 'stopped' };
    const states = await Promise.all(this.workers.map((w) => w.send({ kind: 'status' }).catch(() => STARTING) as Promise<SearchIndexStatus>));
    return combine(states);
  }

  async stop(): Promise<void> {
    this.stopped = true;
    await Promise.all(this.workers.map((w) => w.stop()));
  }
}

// One client per app instance (per AppContext): two createApp calls are two instances.
const clients = new WeakMap<AppContext, SearchClient>();

export function searchClientFor(ctx: AppContext): SearchClient {
  let c = clients.get(ctx);
  if (!c) {
    c = new SearchClient(ctx);
    clients.set(ctx, c);
  }
  return c;
}

/** For /api/health: the index state of this instance, or 'starting' before the first router is made. */
export function searchIndexStatus(ctx: AppContext): Promise<SearchIndexStatus> {
  return clients.get(ctx)?.status() ?? Promise.resolve(STARTING);
}

/** Stops the app's search workers (app shutdown). */
export function stopSearch(ctx: AppContext): Promise<void> {
  return clients.get(ctx)?.stop() ?? Promise.resolve();
}

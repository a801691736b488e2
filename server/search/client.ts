// The app's handle on its search worker (worker.ts): one worker per app instance,
// started with the first router, stopped with the app. Requests and answers are
// messages; errors come back as HttpErrors. A worker that dies is started again
// on the next request (it rebuilds its index; /api/health says "building" meanwhile).
import { Worker } from 'node:worker_threads';
import { committedTransactions } from '../../db/client';
import type { Actor } from '../../shared/policy';
import type { SearchQuery, SearchResponse } from '../../shared/schemas/search';
import type { AppContext } from '../context';
import { HttpError } from '../http/errors';
import type { SearchIndexStatus } from './service';
import type { WorkerReply, WorkerRequest } from './worker-protocol';

type Pending = { resolve: (value: unknown) => void; reject: (err: unknown) => void };
type Request = WorkerRequest extends infer R ? (R extends { id: number } ? Omit<R, 'id'> : never) : never;

const STARTING: SearchIndexStatus = { state: 'starting', shops: { ready: 0, building: 0 }, cases: 0, lastChangeId: 0, buildMs: null };
const entry = new URL(`./worker.${import.meta.url.endsWith('.ts') ? 'ts' : 'js'}`, import.meta.url).href;

export class SearchClient {
  private worker: Worker | null = null;
  private pending = new Map<number, Pending>();
  private nextId = 1;
  private stopped = false;

  constructor(private readonly ctx: AppContext) {
    this.start();
  }

  search(actor: Actor, query: SearchQuery): Promise<SearchResponse> {
    return this.send({ kind: 'search', actor, query, commits: committedTransactions() }) as Promise<SearchResponse>;
  }

  async status(): Promise<SearchIndexStatus> {
    if (this.stopped) return { ...STARTING, state: 'stopped' };
    return ((await this.send({ kind: 'status' }).catch(() => null)) as SearchIndexStatus | null) ?? STARTING;
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
        p.reject(new HttpError(503, 'search_unavailable', 'Search is restarting. Try again in a moment.'));
      }
    });
    this.worker = worker;
    return worker;
  }

  private send(req: Request): Promise<unknown> {
    if (this.stopped) return Promise.reject(new HttpError(503, 'search_unavailable', 'Search is shut down.'));
    const worker = this.worker ?? this.start();
    const id = this.nextId++;
    return new Promise((resolve, reject) => {
      this.pending.set(id, { resolve, reject });
      worker.postMessage({ ...req, id } as WorkerRequest);
    });
  }

  private settle(reply: WorkerReply) {
    const p = this.pending.get(reply.id);
    if (!p) return;
    this.pending.delete(reply.id);
    if (reply.ok) p.resolve(reply.value);
    else p.reject(new HttpError(reply.error.status, reply.error.code, reply.error.message));
  }
}

// One worker per app instance (per AppContext): two createApp calls are two instances.
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

/** Stops the app's search worker (app shutdown). */
export function stopSearch(ctx: AppContext): Promise<void> {
  return clients.get(ctx)?.stop() ?? Promise.resolve();
}

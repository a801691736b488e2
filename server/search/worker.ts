// The search worker: the app's search index and its change-log follower run in
// this thread, so building a 100,000-case index or ranking a broad query never
// holds up the HTTP event loop (sign-in, saving a case), and search has a core
// of its own. It reads MariaDB through its own small pool.
import { parentPort, workerData } from 'node:worker_threads';
import pino from 'pino';
import { connect } from '../../db/client';
import type { Config } from '../config';
import { HttpError } from '../http/errors';
import { SearchService } from './service';
import type { WorkerError, WorkerReply, WorkerRequest } from './worker-protocol';

const { config } = workerData as { config: Config };
const port = parentPort!;
const database = connect(config.db, { connectionLimit: 4 });
const log = pino({ level: config.logLevel }).child({ thread: 'search' });
let appWrites = 0;
const service = new SearchService(
  { db: database.db, log },
  { writeCount: () => appWrites, gapTimeoutMs: config.searchGapTimeoutMs, reconcileMs: config.searchReconcileMs },
);

function toWorkerError(err: unknown): WorkerError {
  if (err instanceof HttpError) return { status: err.status, code: err.code, message: err.message };
  log.error({ err }, 'search failed');
  return { status: 500, code: 'internal', message: 'Search failed. Try again in a moment.' };
}

async function answer(req: WorkerRequest): Promise<WorkerReply> {
  try {
    switch (req.kind) {
      case 'search':
        appWrites = Math.max(appWrites, req.writes);
        return { id: req.id, ok: true, value: await service.search(req.actor, req.query) };
      case 'status':
        return { id: req.id, ok: true, value: service.status() };
      case 'stop':
        service.stop();
        await database.close();
        return { id: req.id, ok: true, value: null };
    }
  } catch (err) {
    return { id: req.id, ok: false, error: toWorkerError(err) };
  }
}

port.on('message', (req: WorkerRequest) => {
  void answer(req).then((reply) => {
    port.postMessage(reply);
    if (req.kind === 'stop') port.close();
  });
});

// Messages between the app (main thread) and its search worker.
import type { Actor } from '../../shared/policy';
import type { SearchQuery, SearchResponse } from '../../shared/schemas/search';
import type { SearchIndexStatus } from './service';

export type WorkerRequest =
  /** `writes`: the app's write count (db/client localWrites) when the request came in */
  | { kind: 'search'; id: number; actor: Actor; query: SearchQuery; writes: number }
  | { kind: 'status'; id: number }
  | { kind: 'stop'; id: number };

/** An HttpError, flattened to cross the thread boundary. */
export interface WorkerError {
  status: number;
  code: string;
  message: string;
}

export type WorkerReply =
  | { id: number; ok: true; value: SearchResponse | SearchIndexStatus | null }
  | { id: number; ok: false; error: WorkerError };

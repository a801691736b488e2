// Messages between the app (main thread) and its search worker.
import type { Actor } from '../../shared/policy';
import type { SearchQuery, SearchResponse } from '../../shared/schemas/search';
import type { SearchIndexStatus } from './service';

export type WorkerRequest =
  /** `commits`: transactions the app had committed when the request came in (see SearchService) */
  | { kind: 'search'; id: number; actor: Actor; query: SearchQuery; commits: number }
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

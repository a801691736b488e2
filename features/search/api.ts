import { searchResponseSchema } from '../../shared/schemas/search';
import { useApi } from '../api/use-api';

export interface SearchParams {
  q: string;
  platformId?: string;
  code?: string;
  tag?: string;
  status?: string;
}

/** The API path for a search, or null when there is nothing to search for. */
export function searchPath(p: SearchParams, limit = 20): string | null {
  const qs = new URLSearchParams();
  if (p.q.trim()) qs.set('q', p.q.trim());
  for (const k of ['platformId', 'code', 'tag', 'status'] as const) {
    const v = p[k];
    if (v) qs.set(k, v);
  }
  if ([...qs.keys()].length === 0) return null;
  qs.set('limit', String(limit));
  return `/api/search?${qs.toString()}`;
}

export const useSearch = (p: SearchParams) => useApi(searchPath(p), searchResponseSchema, { keepPreviousData: true, revalidateOnFocus: false });

// The link that starts a cause walk from a search, with the same evidence the tech typed.
import type { Href } from 'expo-router';
import type { SearchResponse, SearchResult } from '../../shared/schemas/search';

/**
 * The query's codes, symptoms, recent work and platform; where the query has
 * none of a kind, the chosen result's (the tech picked that case as like theirs).
 */
export function walkHref(query: SearchResponse['query'], result: SearchResult | null, q: string, platformId?: string): Href {
  const qs = new URLSearchParams();
  const codes = query.codes.length ? query.codes : (result?.codes ?? []);
  const symptoms = query.tags.length ? query.tags : (result?.symptoms ?? []);
  const platform = platformId ?? (query.platformIds[0] !== undefined ? String(query.platformIds[0]) : result?.platform ? String(result.platform.id) : '');
  if (codes.length) qs.set('codes', codes.join(','));
  if (symptoms.length) qs.set('symptoms', symptoms.join(','));
  if (query.context.length) qs.set('context', query.context.join(','));
  if (platform) qs.set('platformId', platform);
  if (q.trim()) qs.set('query', q.trim());
  return `/walks/new?${qs.toString()}` as Href;
}

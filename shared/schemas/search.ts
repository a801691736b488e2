// The search API contract: GET /api/search and its answer.
import { z } from 'zod';
import { caseStatusSchema, dtcInputSchema, platformRefSchema, tagSchema } from './cases';

/** Longer than any real query; the parser reads only the first 500 characters anyway. */
export const SEARCH_QUERY_MAX_CHARS = 1000;
export const SEARCH_LIMIT_MAX = 50;

export const searchQuerySchema = z.object({
  q: z
    .string({ error: 'q must be one piece of text.' })
    .max(SEARCH_QUERY_MAX_CHARS, `A search is at most ${SEARCH_QUERY_MAX_CHARS} characters: keep the codes, symptoms and platform.`)
    .default(''),
  platformId: z.coerce.number({ error: 'platformId must be a number.' }).int().positive('platformId must be a platform id.').optional(),
  code: dtcInputSchema.optional(),
  tag: tagSchema.optional(),
  status: caseStatusSchema.optional(),
  limit: z.coerce
    .number({ error: 'limit must be a number.' })
    .int('limit is a whole number.')
    .min(1, 'limit is at least 1.')
    .max(SEARCH_LIMIT_MAX, `limit is at most ${SEARCH_LIMIT_MAX}.`)
    .default(20),
});
export type SearchQuery = z.infer<typeof searchQuerySchema>;

export const searchChipSchema = z.object({
  kind: z.enum(['code', 'cylinder', 'tag', 'context', 'platform', 'term']),
  value: z.string(),
  label: z.string(),
  removable: z.boolean(),
  /** the query text without this chip */
  without: z.string(),
});
export type SearchChip = z.infer<typeof searchChipSchema>;

export const parsedQuerySchema = z.object({
  /** codes searched on: typed, then implied by cylinders and misfire words */
  codes: z.array(z.string()),
  impliedCodes: z.array(z.string()),
  cylinders: z.array(z.number()),
  tags: z.array(z.string()),
  context: z.array(z.string()),
  terms: z.array(z.object({ from: z.string(), to: z.string() })),
  platformIds: z.array(z.number()),
  /** free words left over */
  text: z.string(),
  chips: z.array(searchChipSchema),
});

export const searchResultSchema = z.object({
  id: z.number(),
  title: z.string(),
  score: z.number(),
  why: z.array(z.string()),
  codes: z.array(z.string()),
  symptoms: z.array(z.string()),
  context: z.array(z.string()),
  platform: platformRefSchema.nullable(),
  status: caseStatusSchema,
  fixConfirmed: z.boolean(),
  updatedAt: z.string(),
});
export type SearchResult = z.infer<typeof searchResultSchema>;

export const searchResponseSchema = z.object({
  query: parsedQuerySchema,
  results: z.array(searchResultSchema),
  total: z.number(),
  tookMs: z.number(),
  /** 'ready', or 'building' while the shop's index is first built */
  index: z.enum(['ready', 'building']),
});
export type SearchResponse = z.infer<typeof searchResponseSchema>;

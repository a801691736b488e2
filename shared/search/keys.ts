// Exact-lookup keys: what the server's candidate selection matches on before
// ranking (codes, code families, cylinders, tags, recent work, platforms), and
// the words it sends to the text index. Query side and case side use the same
// key spelling, so a key table (case id, key) can be joined directly.
import { cylinderForMisfireCode, dtcFamily, parseDtc } from '../codes';
import { expandTerm } from '../terms';
import type { ParsedQuery } from './query';
import { kebabToWords, unique } from './text';

export interface StructuredKeys {
  /** typed and implied codes */
  codes: string[];
  /** first four characters of each code ('P030') */
  families: string[];
  cylinders: number[];
  tags: string[];
  context: string[];
  platformIds: number[];
  /** all of the above as 'code:P0302', 'family:P030', 'cyl:2', 'tag:rough-idle', 'ctx:after-tune', 'platform:3' */
  keys: string[];
}

const validCodes = (codes: readonly string[]): string[] =>
  unique(codes.map((c) => parseDtc(c)).flatMap((r) => (r.ok ? [r.dtc.code] : [])));

const tagKey = (t: string): string => t.trim().toLowerCase().replace(/[\s_]+/g, '-');

function flatten(k: Omit<StructuredKeys, 'keys'>): string[] {
  return [
    ...k.codes.map((c) => `code:${c}`),
    ...k.families.map((f) => `family:${f}`),
    ...k.cylinders.map((c) => `cyl:${c}`),
    ...k.tags.map((t) => `tag:${tagKey(t)}`),
    ...k.context.map((t) => `ctx:${tagKey(t)}`),
    ...k.platformIds.map((id) => `platform:${id}`),
  ];
}

export function structuredKeys(parsed: ParsedQuery): StructuredKeys {
  const codes = validCodes([...parsed.codes, ...parsed.impliedCodes]);
  const k = {
    codes,
    families: unique(codes.map(dtcFamily)),
    cylinders: unique(parsed.cylinders),
    tags: unique(parsed.tags),
    context: unique(parsed.context),
    platformIds: unique(parsed.platformIds),
  };
  return { ...k, keys: flatten(k) };
}

/** The same keys for a stored case, to write beside it when it is saved. */
export function caseLookupKeys(c: {
  codes: readonly string[];
  symptoms: readonly string[];
  context: readonly string[];
  platformId?: number | null;
}): StructuredKeys {
  const codes = validCodes(c.codes);
  const k = {
    codes,
    families: unique(codes.map(dtcFamily)),
    cylinders: unique(codes.map(cylinderForMisfireCode).filter((n): n is number => n !== null)),
    tags: unique(c.symptoms.map(tagKey)),
    context: unique(c.context.map(tagKey)),
    platformIds: c.platformId == null ? [] : [c.platformId],
  };
  return { ...k, keys: flatten(k) };
}

/**
 * Words for the full-text index: the free words, each recognised standard
 * term with its synonyms (case notes say "cat" as often as "TWC"), and the
 * words of the symptom tags (so untagged notes that describe the symptom
 * still turn up).
 */
export function textSearchTerms(parsed: ParsedQuery): string[] {
  const terms = parsed.terms.flatMap((t) => expandTerm(t.to));
  const tags = parsed.tags.map(kebabToWords);
  return unique([...parsed.words, ...terms, ...tags].map((s) => s.toLowerCase()));
}

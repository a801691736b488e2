/**
 * How close a confirmed case is to a walk's evidence, 0..1, for learnFromCases.
 * Three parts, each 0..1, weighted and renormalised over the parts the walk has
 * evidence for (a walk with no platform is not marked down for it):
 *   codes 0.5     Jaccard of the base codes, or 0.6 x Jaccard of the families (P030x)
 *   platform 0.25 platformSimilarity (same engine 0.85-1, same model 0.6-0.7, same layout 0.3-0.4)
 *   tags 0.25     cosine (Ochiai) of the symptom and context tag sets: |A n B| / sqrt(|A| |B|),
 *                 so a write-up that lists more tags than the walk is not marked down as hard as Jaccard would
 * A case that shares nothing scores 0 and is ignored by the learning.
 */
import { normaliseCode, normaliseTag } from './evidence';

export interface SimilarityInput {
  codes: string[];
  symptoms: string[];
  context: string[];
}

export const SIMILARITY_WEIGHTS = { codes: 0.5, platform: 0.25, tags: 0.25 } as const;
/** A shared family (P0301 vs P0304) counts for this much of a shared code. */
export const FAMILY_CREDIT = 0.6;

function jaccard(a: Set<string>, b: Set<string>): number {
  if (a.size === 0 || b.size === 0) return 0;
  let shared = 0;
  for (const x of a) if (b.has(x)) shared += 1;
  return shared / (a.size + b.size - shared);
}

function cosine(a: Set<string>, b: Set<string>): number {
  if (a.size === 0 || b.size === 0) return 0;
  let shared = 0;
  for (const x of a) if (b.has(x)) shared += 1;
  return shared / Math.sqrt(a.size * b.size);
}

const baseCodes = (codes: string[]) => new Set(codes.map((c) => normaliseCode(c).slice(0, 5)));
const families = (codes: string[]) => new Set(codes.map((c) => normaliseCode(c).slice(0, 4)));
const tags = (x: SimilarityInput) => new Set([...x.symptoms, ...x.context].map(normaliseTag).filter(Boolean));

export function codeSimilarity(walk: string[], other: string[]): number {
  return Math.max(jaccard(baseCodes(walk), baseCodes(other)), FAMILY_CREDIT * jaccard(families(walk), families(other)));
}

/**
 * `platformScore` is platformSimilarity(walk platform, case platform).score, or null
 * when the walk has no platform (the part is then left out, not counted as 0).
 */
export function caseSimilarity(walk: SimilarityInput, other: SimilarityInput, platformScore: number | null): number {
  const parts: [number, number][] = [];
  if (walk.codes.length) parts.push([SIMILARITY_WEIGHTS.codes, codeSimilarity(walk.codes, other.codes)]);
  if (platformScore !== null) parts.push([SIMILARITY_WEIGHTS.platform, Math.min(1, Math.max(0, platformScore))]);
  const walkTags = tags(walk);
  if (walkTags.size) parts.push([SIMILARITY_WEIGHTS.tags, cosine(walkTags, tags(other))]);
  const weight = parts.reduce((sum, [w]) => sum + w, 0);
  if (weight === 0) return 0;
  const score = parts.reduce((sum, [w, s]) => sum + w * s, 0) / weight;
  return Math.round(score * 1000) / 1000;
}

/**
 * The shop's history as a walk sees it: the evidence a case (or a walk request) gives,
 * and every confirmed case scored against a walk. The server and `npm run bench:walks`
 * both go through here, so the bench measures what the walk screen does.
 */
import { cylinderForMisfireCode } from '../codes';
import { banksOfCylinders, platformSimilarity, type Platform } from '../platform';
import { normaliseCode, type WalkEvidence } from './evidence';
import type { CaseId } from './priors';
import type { PrecedentCandidate } from './precedents';
import { caseSimilarity } from './similarity';

export interface EvidenceParts {
  codes: readonly string[];
  /** Cylinders named beside the codes (free text); misfire codes add their own. */
  cylinders?: readonly number[];
  symptoms: readonly string[];
  context: readonly string[];
}

const uniq = <T>(xs: Iterable<T>) => [...new Set(xs)];

/** Walk evidence from codes, tags and the platform record: misfiring cylinders, their banks, the platform's facts. */
export function evidenceFrom(parts: EvidenceParts, platform: Platform | null): WalkEvidence {
  const codes = uniq(parts.codes.map(normaliseCode));
  const fromCodes = codes.map(cylinderForMisfireCode).filter((n): n is number => n !== null);
  const cylinders = uniq([...fromCodes, ...(parts.cylinders ?? [])]).sort((a, b) => a - b);
  let banks: WalkEvidence['banks'] = null;
  if (platform && cylinders.length) {
    const b = banksOfCylinders(platform, cylinders);
    if (b.bank1.length || b.bank2.length) banks = { bank1: b.bank1, bank2: b.bank2, bothBanks: b.bothBanks };
  }
  let facts: WalkEvidence['platform'] = null;
  if (platform) {
    facts = { layout: platform.layout, cylinders: platform.cylinders };
    if (platform.fuel) facts.fuel = platform.fuel;
    if (platform.induction) facts.induction = platform.induction;
  }
  return { codes, cylinders, banks, symptoms: uniq(parts.symptoms), context: uniq(parts.context), platform: facts };
}

export interface HistoryCase {
  caseId: CaseId;
  title: string;
  cause: string | null;
  codes: string[];
  symptoms: string[];
  context: string[];
  platform: Platform | null;
}

/** Each confirmed case with its similarity to the walk (caseSimilarity; platform part left out when the walk has none). */
export function scoreHistory(ev: WalkEvidence, walkPlatform: Platform | null, history: readonly HistoryCase[]): (PrecedentCandidate & { sameEngine: boolean })[] {
  return history.map((c) => {
    const match = walkPlatform && c.platform ? platformSimilarity(walkPlatform, c.platform) : null;
    const platformScore = walkPlatform ? (match?.score ?? 0) : null;
    return {
      caseId: c.caseId,
      title: c.title,
      cause: c.cause,
      similarity: caseSimilarity(ev, c, platformScore),
      sameEngine: match?.level === 'same-engine',
    };
  });
}

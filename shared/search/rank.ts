// Explained ranking: each case gets a score and the reasons for it, in words
// a tech reads at a glance ("both misfire codes P0302 P0305", "same engine VT27").
import { type CodeFacts, validCodeFacts } from './code-facts';
import { banksOfCylinders, type Platform, platformSimilarity } from '../platform';
import { contextLabel, type ParsedQuery } from './query';
import { kebabToWords, unique, wordsMatch } from './text';
import { SEARCH_WEIGHTS, type SearchWeights } from './weights';

export interface CaseCandidate {
  id: number | string;
  title: string;
  codes: string[];
  symptoms: string[];
  context: string[];
  platform: Platform | null;
  status: string;
  fixConfirmed: boolean;
  updatedAt: Date | string;
  /** 0..1 normalised text relevance from the index */
  textScore: number;
  /** query words the index matched in this case, if it reports them */
  matchedWords?: string[];
  /** validCodeFacts(codes), if the caller keeps it (the server's index works it out once per case) */
  codeFacts?: readonly CodeFacts[];
}

export interface RankContext {
  /** the platform the query is about, if any */
  platform: Platform | null;
  now: Date;
  weights?: SearchWeights;
}

export interface CaseScore { score: number; why: string[] }

interface Part { points: number; why: string | null }

const DAY_MS = 86_400_000;

const listWords = (xs: string[]): string =>
  xs.length <= 1 ? xs.join('') : `${xs.slice(0, -1).join(', ')} and ${xs[xs.length - 1]}`;

function exactWhy(exact: CodeFacts[]): string {
  const misfire = exact.every((c) => c.misfire);
  const kind = misfire ? 'misfire code' : 'code';
  if (exact.length === 1) return `${kind} ${exact[0]!.code}`;
  const all = exact.length === 2 ? 'both' : `all ${exact.length}`;
  return `${all} ${kind}s ${exact.map((c) => c.code).join(' ')}`;
}

function codePart(queryCodes: readonly CodeFacts[], caseCodes: readonly CodeFacts[], w: SearchWeights): Part[] {
  if (queryCodes.length === 0 || caseCodes.length === 0) return [];
  const exact: CodeFacts[] = [];
  const families: string[] = [];
  const groups: string[] = [];
  for (const q of queryCodes) {
    if (caseCodes.some((c) => c.code === q.code)) exact.push(q);
    else if (caseCodes.some((c) => c.family === q.family)) families.push(`${q.family}x`);
    else if (q.group !== null && caseCodes.some((c) => c.group === q.group)) groups.push(q.groupLabel ?? '');
  }
  // points per query code, so a query with many codes does not outweigh everything else
  const per = w.code.points / queryCodes.length;
  const parts: Part[] = [];
  if (exact.length) parts.push({ points: per * w.code.exact * exact.length, why: exactWhy(exact) });
  if (families.length) {
    parts.push({ points: per * w.code.family * families.length, why: `same code family ${unique(families).join(' ')}` });
  }
  if (groups.length) {
    parts.push({ points: per * w.code.group * groups.length, why: `same system: ${unique(groups).join(', ').toLowerCase()}` });
  }
  return parts;
}

function caseCylinders(caseCodes: readonly CodeFacts[]): number[] {
  return caseCodes.map((c) => c.cylinder).filter((n): n is number => n !== null);
}

function cylinderPart(parsed: ParsedQuery, caseCyls: number[], w: SearchWeights): Part[] {
  // with misfire, named cylinders became codes and the code match already counts them
  if (parsed.misfire || parsed.cylinders.length === 0) return [];
  const shared = parsed.cylinders.filter((c) => caseCyls.includes(c));
  if (shared.length === 0) return [];
  const label = shared.length === 1 ? `same cylinder ${shared[0]}` : `same cylinders ${listWords(shared.map(String))}`;
  return [{ points: (w.cylinder * shared.length) / parsed.cylinders.length, why: label }];
}

function bankPart(parsed: ParsedQuery, c: CaseCandidate, caseCyls: number[], query: Platform | null, w: SearchWeights): Part[] {
  const q = parsed.banks;
  if (!q || !c.platform || caseCyls.length === 0) return [];
  const b = banksOfCylinders(c.platform, caseCyls);
  if (q.bothBanks && b.bothBanks) return [{ points: w.bank.bothBanks, why: 'misfires on both banks, like your search' }];
  const oneBank = (x: { bank1: number[]; bank2: number[]; bothBanks: boolean }) =>
    x.bothBanks ? null : x.bank1.length ? 1 : x.bank2.length ? 2 : null;
  const qBank = oneBank(q);
  // an inline engine has one bank: "same bank" says nothing there
  if (qBank !== null && qBank === oneBank(b) && c.platform.layout !== 'inline' && query?.layout !== 'inline') {
    return [{ points: w.bank.sameBank, why: `same bank (bank ${qBank})` }];
  }
  return [];
}

const NORMS = new Map<string, string>();
/** 'Rough idle' and 'rough_idle' are the tag 'rough-idle'; a shop's few hundred tags are normalised once. */
function norm(s: string): string {
  let n = NORMS.get(s);
  if (n === undefined) {
    n = s.trim().toLowerCase().replace(/[\s_]+/g, '-');
    if (NORMS.size >= 10_000) NORMS.clear();
    NORMS.set(s, n);
  }
  return n;
}

const NORMALISED = new WeakMap<readonly string[], Set<string>>();

/** A case's tags, normalised once per list (the server's index hands the same lists to every search). */
function normalisedTags(tags: readonly string[]): Set<string> {
  let set = NORMALISED.get(tags);
  if (!set) {
    set = new Set(tags.map(norm));
    NORMALISED.set(tags, set);
  }
  return set;
}

function overlap(query: string[], caseTags: readonly string[]): string[] {
  if (query.length === 0 || caseTags.length === 0) return [];
  const have = normalisedTags(caseTags);
  return query.filter((t) => have.has(norm(t)));
}

function symptomPart(parsed: ParsedQuery, c: CaseCandidate, w: SearchWeights): Part[] {
  const shared = overlap(parsed.tags, c.symptoms);
  if (shared.length === 0) return [];
  return [{ points: (w.symptom * shared.length) / parsed.tags.length, why: `symptoms: ${shared.map(kebabToWords).join(', ')}` }];
}

function contextPart(parsed: ParsedQuery, c: CaseCandidate, w: SearchWeights): Part[] {
  const shared = overlap(parsed.context, c.context);
  if (shared.length === 0) return [];
  const why = `${listWords(shared.map(contextLabel))}, like your search`;
  return [{ points: (w.context * shared.length) / parsed.context.length, why }];
}

function layoutWords(p: Platform): string {
  if (p.layout === 'V') return `V${p.cylinders}`;
  return `${p.layout} ${p.cylinders}`;
}

function platformPart(query: Platform | null, c: CaseCandidate, w: SearchWeights): Part[] {
  if (!query || !c.platform) return [];
  const { level } = platformSimilarity(query, c.platform);
  const points = w.platform[level];
  if (level === 'none' || points <= 0) return [];
  const why =
    level === 'same-engine'
      ? `same engine ${c.platform.engine}`
      : level === 'same-model'
        ? `same make and model (${c.platform.make} ${c.platform.model})`
        : `same layout and cylinder count (${layoutWords(c.platform)})`;
  return [{ points, why }];
}

/** Query words found in the case title, for when the index does not say which matched. */
function wordsInTitle(words: string[], title: string): string[] {
  const titleWords = title.toLowerCase().match(/[\p{L}\p{N}]+/gu) ?? [];
  return words.filter((w) => titleWords.some((t) => wordsMatch(w, t)));
}

function textPart(parsed: ParsedQuery, c: CaseCandidate, w: SearchWeights): Part[] {
  const s = Number.isFinite(c.textScore) ? Math.min(1, Math.max(0, c.textScore)) : 0;
  if (s <= 0) return [];
  const matched = c.matchedWords?.length ? unique(c.matchedWords.map((m) => m.toLowerCase())) : wordsInTitle(parsed.words, c.title);
  const why = matched.length ? `matches words: ${matched.join(', ')}` : 'matches your words';
  return [{ points: w.text * s, why }];
}

function ageDays(updatedAt: Date | string, now: Date): number | null {
  const t = (updatedAt instanceof Date ? updatedAt : new Date(updatedAt)).getTime();
  if (!Number.isFinite(t)) return null;
  return Math.max(0, (now.getTime() - t) / DAY_MS);
}

function recencyFactor(age: number | null, w: SearchWeights): number {
  if (age === null) return w.recency.floor;
  const decay = 0.5 ** (age / w.recency.halfLifeDays);
  return w.recency.floor + (1 - w.recency.floor) * decay;
}

const QUERY_CODES = new WeakMap<ParsedQuery, CodeFacts[]>();

/** The query's typed and implied codes, worked out once per query rather than per candidate. */
function queryCodesOf(parsed: ParsedQuery): CodeFacts[] {
  let codes = QUERY_CODES.get(parsed);
  if (!codes) {
    codes = validCodeFacts([...parsed.codes, ...parsed.impliedCodes]);
    QUERY_CODES.set(parsed, codes);
  }
  return codes;
}

/** Score of one case for a parsed query, with the reasons, strongest first. */
export function scoreCase(parsed: ParsedQuery, candidate: CaseCandidate, ctx: RankContext): CaseScore {
  const w = ctx.weights ?? SEARCH_WEIGHTS;
  const codes = candidate.codeFacts ?? validCodeFacts(candidate.codes);
  const cyls = caseCylinders(codes);
  const parts = codePart(queryCodesOf(parsed), codes, w).concat(
    cylinderPart(parsed, cyls, w),
    bankPart(parsed, candidate, cyls, ctx.platform, w),
    symptomPart(parsed, candidate, w),
    contextPart(parsed, candidate, w),
    platformPart(ctx.platform, candidate, w),
    textPart(parsed, candidate, w),
  );
  const relevance = parts.reduce((s, p) => s + p.points, 0);
  if (relevance <= 0) return { score: 0, why: [] };

  const age = ageDays(candidate.updatedAt, ctx.now);
  const quality =
    (candidate.fixConfirmed ? w.fixConfirmed : 1) * (w.status[candidate.status] ?? 1) * recencyFactor(age, w);
  const why = parts.sort((a, b) => b.points - a.points).map((p) => p.why).filter((s): s is string => !!s);
  if (candidate.fixConfirmed) why.push('fix confirmed');
  if (age !== null && age <= w.recency.mentionWithinDays) {
    const d = Math.floor(age);
    why.push(d === 0 ? 'updated today' : `updated ${d} ${d === 1 ? 'day' : 'days'} ago`);
  }
  return { score: Math.round(relevance * quality * 1000) / 1000, why };
}

export interface RankedCase<C extends CaseCandidate = CaseCandidate> extends CaseScore { candidate: C }

const timeOf = (d: Date | string): number => {
  const t = (d instanceof Date ? d : new Date(d)).getTime();
  return Number.isFinite(t) ? t : 0;
};

const idCollator = new Intl.Collator('en', { numeric: true });

/** Ids in natural order ('case-2' before 'case-10'); one collator, as creating one per call is slow. */
const compareIds = (a: number | string, b: number | string): number =>
  typeof a === 'number' && typeof b === 'number' ? a - b : idCollator.compare(String(a), String(b));

/** Cases by score (highest first), then most recently updated, then id. */
export function rankCases<C extends CaseCandidate>(parsed: ParsedQuery, candidates: readonly C[], ctx: RankContext): RankedCase<C>[] {
  return candidates
    .map((candidate) => ({ candidate, ...scoreCase(parsed, candidate, ctx) }))
    .sort(
      (a, b) =>
        b.score - a.score ||
        timeOf(b.candidate.updatedAt) - timeOf(a.candidate.updatedAt) ||
        compareIds(a.candidate.id, b.candidate.id),
    );
}

// Platform words in a query ("vt27", "the sable", "aldwyn sable 2012"),
// matched against the shop's own platform records.
import type { Platform } from '../platform';
import { mask } from './text';

// An engine code names one engine; a model names one car; a make many.
const ENGINE_POINTS = 4;
const MODEL_POINTS = 2;
const MAKE_POINTS = 1;
const YEAR_POINTS = 1;

const escapeRe = (s: string): string => s.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');

const NAME_RES = new Map<string, RegExp | null>();

/** nameRe, compiled once per name: every search tries every platform of the shop. */
function cachedNameRe(name: string, looseJoin: boolean): RegExp | null {
  const key = `${looseJoin ? 1 : 0}${name}`;
  let re = NAME_RES.get(key);
  if (re === undefined) {
    re = nameRe(name, looseJoin);
    if (NAME_RES.size >= 5000) NAME_RES.clear();
    NAME_RES.set(key, re);
  }
  return re;
}

/** Words of a name as a regex; spaces and hyphens between parts are optional for codes ("VT-27", "vt 27"). */
function nameRe(name: string, looseJoin: boolean): RegExp | null {
  const parts = name.trim().split(/[\s-]+/).filter(Boolean).map(escapeRe);
  if (parts.length === 0 || name.trim().length < 2) return null;
  if (looseJoin) {
    // split letter/digit runs too: "VT27" also matches "vt 27" and "vt-27"
    const chars = name.replace(/[\s-]+/g, '').match(/[\p{L}]+|[\p{N}]+|[^\p{L}\p{N}]+/gu) ?? [];
    return new RegExp(`(?<![\\p{L}\\p{N}])${chars.map(escapeRe).join('[\\s-]?')}(?![\\p{L}\\p{N}])`, 'giu');
  }
  return new RegExp(`(?<![\\p{L}\\p{N}])${parts.join('[\\s-]+')}(?![\\p{L}\\p{N}])`, 'giu');
}

interface Span { start: number; end: number }

function spansOf(text: string, re: RegExp | null): Span[] {
  if (!re) return [];
  return [...text.matchAll(re)].map((m) => ({ start: m.index ?? 0, end: (m.index ?? 0) + m[0].length }));
}

const YEAR_RE = /(?<![\p{L}\p{N}])(19[89]\d|20[0-3]\d)(?![\p{L}\p{N}])/gu;

export interface QueryPlatforms { rest: string; platformIds: number[] }

/**
 * Scores each platform by the words that name it and keeps the best-scoring
 * ones ("aldwyn" alone keeps every Aldwyn; "aldwyn sable" only the Sables).
 * A year counts only for platforms already named, and only inside their years.
 */
export function extractPlatforms(text: string, platforms: readonly Platform[]): QueryPlatforms {
  const scored: { p: Platform; score: number; spans: Span[] }[] = [];
  const years = [...text.matchAll(YEAR_RE)].map((m) => ({ year: Number(m[1]), start: m.index ?? 0, end: (m.index ?? 0) + m[0].length }));
  for (const p of platforms) {
    const engine = spansOf(text, cachedNameRe(p.engine, true));
    const model = spansOf(text, cachedNameRe(p.model, false));
    const make = spansOf(text, cachedNameRe(p.make, false));
    let score = (engine.length ? ENGINE_POINTS : 0) + (model.length ? MODEL_POINTS : 0) + (make.length ? MAKE_POINTS : 0);
    if (score === 0) continue;
    const spans = [...engine, ...model, ...make];
    const inYears = years.filter((y) => y.year >= p.yearFrom && y.year <= p.yearTo);
    if (inYears.length) {
      score += YEAR_POINTS;
      spans.push(...inYears);
    }
    scored.push({ p, score, spans });
  }
  if (scored.length === 0) return { rest: text, platformIds: [] };
  const best = Math.max(...scored.map((s) => s.score));
  const kept = scored.filter((s) => s.score === best);
  let rest = text;
  for (const s of kept) for (const sp of s.spans) rest = mask(rest, sp.start, sp.end);
  return { rest, platformIds: kept.map((s) => s.p.id).sort((a, b) => a - b) };
}

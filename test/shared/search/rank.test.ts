import { describe, expect, it } from 'vitest';
import type { Platform } from '../../../shared/platform';
import { type CaseCandidate, parseQuery, rankCases, scoreCase, SEARCH_WEIGHTS } from '../../../shared/search';
import { ctx, fenM16, marshVt27, sableQl20, sableVt27, tesselKx30 } from './fixtures';

// Codes used (generic titles, references.md §1): P0301-P0306 cylinder N misfire, P0171/P0174 system
// too lean bank 1/2, P0420 catalyst efficiency bank 1, P0016 crank/cam correlation bank 1.
// P0351 is used only for its third character (3 = ignition system or misfire, references.md §1).
// The weights compared are SEARCH_WEIGHTS (judgement calls, common practice, no source).

const now = new Date('2025-06-01T12:00:00Z');
const daysAgo = (n: number) => new Date(now.getTime() - n * 86_400_000);

let nextId = 1;
function kase(over: Partial<CaseCandidate> = {}): CaseCandidate {
  return {
    id: nextId++, title: 'Case', codes: [], symptoms: [], context: [], platform: null,
    status: 'published', fixConfirmed: false, updatedAt: daysAgo(100), textScore: 0, ...over,
  };
}

const rankCtx = (platform: Platform | null = null) => ({ platform, now });

describe('rankCases: misfire on two cylinders', () => {
  const parsed = parseQuery('Sable VT27 cyl 2 and 5 misfire', ctx);
  const both = kase({ title: 'both', codes: ['P0302', 'P0305'], platform: sableVt27 });
  const single = kase({ title: 'single', codes: ['P0302'], platform: sableVt27 });
  const otherInline = kase({ title: 'inline', codes: ['P0302', 'P0305'], platform: fenM16 });
  const otherV6 = kase({ title: 'other V6', codes: ['P0302', 'P0305'], platform: tesselKx30 });
  const unrelated = kase({ title: 'unrelated', codes: ['P0420'], platform: fenM16 });
  const ranked = rankCases(parsed, [unrelated, otherInline, single, otherV6, both], rankCtx(sableVt27));

  it('puts the case with both cylinder codes on the same engine first', () => {
    expect(ranked[0]?.candidate.title).toBe('both');
  });

  it('ranks it above the single-code case and the other-platform cases', () => {
    const score = (t: string) => ranked.find((r) => r.candidate.title === t)?.score ?? -1;
    expect(score('both')).toBeGreaterThan(score('single'));
    expect(score('both')).toBeGreaterThan(score('other V6'));
    expect(score('both')).toBeGreaterThan(score('inline'));
    expect(score('other V6')).toBeGreaterThan(score('inline')); // same layout and cylinder count
  });

  it('puts the unrelated case last with no reasons', () => {
    expect(ranked.at(-1)?.candidate.title).toBe('unrelated');
    expect(ranked.at(-1)?.score).toBe(0);
    expect(ranked.at(-1)?.why).toEqual([]);
  });

  it('says why in workshop words', () => {
    expect(ranked[0]?.why).toEqual(['both misfire codes P0302 P0305', 'same engine VT27', 'misfires on both banks, like your search']);
    const s = ranked.find((r) => r.candidate.title === 'single');
    expect(s?.why).toEqual(['misfire code P0302', 'same engine VT27', 'same code family P030x']);
    const v6 = ranked.find((r) => r.candidate.title === 'other V6');
    expect(v6?.why).toContain('same layout and cylinder count (V6)');
  });
});

describe('scoreCase: codes', () => {
  const parsed = parseQuery('P0302', ctx);
  // P0301 shares the first four characters; P0351 only the third-character group (references.md §1)
  const exact = scoreCase(parsed, kase({ codes: ['P0302'] }), rankCtx());
  const family = scoreCase(parsed, kase({ codes: ['P0301'] }), rankCtx());
  const group = scoreCase(parsed, kase({ codes: ['P0351'] }), rankCtx());
  const none = scoreCase(parsed, kase({ codes: ['P0171'] }), rankCtx());

  it('ranks exact code > same family > same system group > nothing', () => {
    expect(exact.score).toBeGreaterThan(family.score);
    expect(family.score).toBeGreaterThan(group.score);
    expect(group.score).toBeGreaterThan(none.score);
    expect(none.score).toBe(0);
  });

  it('names the kind of code match', () => {
    expect(exact.why[0]).toBe('misfire code P0302');
    expect(family.why[0]).toBe('same code family P030x');
    expect(group.why[0]).toBe('same system: ignition system or misfire');
  });

  it('reads "both codes" for two non-misfire codes', () => {
    const p = parseQuery('P0171 P0174', ctx);
    expect(scoreCase(p, kase({ codes: ['P0174', 'P0171'] }), rankCtx()).why[0]).toBe('both codes P0171 P0174');
  });

  it('scores per query code, so two matched codes beat one', () => {
    const p = parseQuery('P0171 P0174', ctx);
    const two = scoreCase(p, kase({ codes: ['P0171', 'P0174'] }), rankCtx()).score;
    const one = scoreCase(p, kase({ codes: ['P0171'] }), rankCtx()).score;
    expect(two).toBeGreaterThan(one);
    expect(two).toBeLessThanOrEqual(SEARCH_WEIGHTS.code.points * 1.0001);
  });

  it('ignores malformed codes in case data instead of throwing', () => {
    const r = scoreCase(parsed, kase({ codes: ['nonsense', '', 'P0302-13'] }), rankCtx());
    expect(r.why[0]).toBe('misfire code P0302');
  });
});

describe('scoreCase: quality', () => {
  const parsed = parseQuery('P0171', ctx);

  it('puts a confirmed fix above an unconfirmed one at equal match', () => {
    const open = kase({ codes: ['P0171'] }); // lower id, so a tie would put it first
    const confirmed = kase({ codes: ['P0171'], fixConfirmed: true });
    const ranked = rankCases(parsed, [open, confirmed], rankCtx());
    expect(ranked[0]?.candidate).toBe(confirmed);
    expect(ranked[0]?.score).toBeGreaterThan(ranked[1]?.score ?? Infinity);
    expect(ranked[0]?.why).toContain('fix confirmed');
    expect(ranked[1]?.why).not.toContain('fix confirmed');
  });

  it('does not lift an unrelated case because its fix is confirmed', () => {
    expect(scoreCase(parsed, kase({ codes: ['P0420'], fixConfirmed: true }), rankCtx()).score).toBe(0);
  });

  it('lets a better match beat a confirmed fix', () => {
    const p = parseQuery('P0171 P0174', ctx);
    const better = scoreCase(p, kase({ codes: ['P0171', 'P0174'] }), rankCtx()).score;
    const confirmed = scoreCase(p, kase({ codes: ['P0171'], fixConfirmed: true }), rankCtx()).score;
    expect(better).toBeGreaterThan(confirmed);
  });

  it('decays gently with age', () => {
    const fresh = scoreCase(parsed, kase({ codes: ['P0171'], updatedAt: daysAgo(1) }), rankCtx()).score;
    const old = scoreCase(parsed, kase({ codes: ['P0171'], updatedAt: daysAgo(3650) }), rankCtx()).score;
    expect(fresh).toBeGreaterThan(old);
    expect(old).toBeGreaterThanOrEqual(fresh * SEARCH_WEIGHTS.recency.floor);
  });

  it('accepts updatedAt as an ISO string and says when it is recent', () => {
    const r = scoreCase(parsed, kase({ codes: ['P0171'], updatedAt: daysAgo(3).toISOString() }), rankCtx());
    expect(r.why).toContain('updated 3 days ago');
  });

  it('ranks a reviewed case above a draft at equal match', () => {
    const published = scoreCase(parsed, kase({ codes: ['P0171'], status: 'published' }), rankCtx()).score;
    const draft = scoreCase(parsed, kase({ codes: ['P0171'], status: 'draft' }), rankCtx()).score;
    expect(published).toBeGreaterThan(draft);
  });

  it('breaks equal scores by recency, newest first', () => {
    const older = kase({ codes: ['P0171'], updatedAt: daysAgo(10) });
    const newer = kase({ codes: ['P0171'], updatedAt: daysAgo(10) });
    newer.updatedAt = new Date((newer.updatedAt as Date).getTime() + 1000);
    // one second apart: same score to the third decimal, order by date
    const ranked = rankCases(parsed, [older, newer], rankCtx());
    expect(ranked[0]?.score).toBe(ranked[1]?.score);
    expect(ranked[0]?.candidate).toBe(newer);
  });
});

describe('scoreCase: platform', () => {
  const parsed = parseQuery('rough idle', ctx);
  const base = { symptoms: ['rough-idle'] };
  const of = (p: Platform) => scoreCase(parsed, kase({ ...base, platform: p }), rankCtx(sableVt27));

  it('ranks same engine > same make and model > same layout > other', () => {
    expect(of(marshVt27).score).toBeGreaterThan(of(sableQl20).score);
    expect(of(sableQl20).score).toBeGreaterThan(of(tesselKx30).score);
    expect(of(tesselKx30).score).toBeGreaterThan(of(fenM16).score);
  });

  it('names the engine, the model, or the layout', () => {
    expect(of(marshVt27).why).toContain('same engine VT27');
    expect(of(sableQl20).why).toContain('same make and model (Aldwyn Sable)');
    expect(of(tesselKx30).why).toContain('same layout and cylinder count (V6)');
    expect(of(fenM16).why.join(' ')).not.toMatch(/same (engine|make|layout)/);
  });

  it('adds nothing for platform when the query has none', () => {
    const r = scoreCase(parsed, kase({ ...base, platform: sableVt27 }), rankCtx(null));
    expect(r.why).toEqual(['symptoms: rough idle']);
  });
});

describe('scoreCase: symptoms, recent work, cylinders, text', () => {
  it('lists the shared symptoms', () => {
    const p = parseQuery('rough idle, shakes at idle', ctx);
    const r = scoreCase(p, kase({ symptoms: ['shakes-at-idle', 'rough-idle', 'stalls'] }), rankCtx());
    expect(r.why).toEqual(['symptoms: rough idle, shakes at idle']);
    const half = scoreCase(p, kase({ symptoms: ['rough-idle'] }), rankCtx());
    expect(r.score).toBeGreaterThan(half.score);
  });

  it('names recent work shared with the search', () => {
    const p = parseQuery('misfire after timing work', ctx);
    const r = scoreCase(p, kase({ context: ['after-timing-work'] }), rankCtx());
    expect(r.why).toContain('after timing work, like your search');
  });

  it('ranks a case from after the same work above one without', () => {
    const p = parseQuery('P0016 since the belt job', ctx);
    const withWork = kase({ codes: ['P0016'], context: ['after-belt-job', 'after-timing-work'] });
    const without = kase({ codes: ['P0016'] });
    expect(rankCases(p, [without, withWork], rankCtx())[0]?.candidate).toBe(withWork);
  });

  it('matches named cylinders without misfire against the case\'s misfire codes', () => {
    const p = parseQuery('low compression cyl 3', ctx);
    const r = scoreCase(p, kase({ codes: ['P0303'] }), rankCtx());
    expect(r.why).toContain('same cylinder 3');
  });

  it('credits a one-bank misfire on the same bank', () => {
    // VT27 bank 2 = 2, 4, 6 (fixture)
    const p = parseQuery('VT27 misfire cyl 2 and 4', ctx);
    const r = scoreCase(p, kase({ codes: ['P0306'], platform: marshVt27 }), rankCtx(sableVt27));
    expect(r.why).toContain('same bank (bank 2)');
  });

  it('reports the words the index matched', () => {
    const p = parseQuery('belt tensioner noise', ctx);
    const r = scoreCase(p, kase({ textScore: 0.8, matchedWords: ['belt', 'tensioner'] }), rankCtx());
    expect(r.why).toEqual(['matches words: belt, tensioner']);
    expect(r.score).toBeGreaterThan(0);
  });

  it('falls back to words found in the title', () => {
    const p = parseQuery('belt tensioner noise', ctx);
    const r = scoreCase(p, kase({ title: 'Worn tensioners and a glazed belt', textScore: 0.5 }), rankCtx());
    expect(r.why).toEqual(['matches words: belt, tensioner']);
  });

  it('gives more for higher text relevance', () => {
    const p = parseQuery('belt tensioner noise', ctx);
    const hi = scoreCase(p, kase({ textScore: 0.9 }), rankCtx()).score;
    const lo = scoreCase(p, kase({ textScore: 0.2 }), rankCtx()).score;
    expect(hi).toBeGreaterThan(lo);
  });

  it('clamps out-of-range text scores', () => {
    const p = parseQuery('belt', ctx);
    const over = scoreCase(p, kase({ textScore: 7 }), rankCtx()).score;
    const one = scoreCase(p, kase({ textScore: 1 }), rankCtx()).score;
    expect(over).toBe(one);
    expect(scoreCase(p, kase({ textScore: Number.NaN }), rankCtx()).score).toBe(0);
  });
});

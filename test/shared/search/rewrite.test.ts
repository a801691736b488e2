import { describe, expect, it } from 'vitest';
import { parseQuery, queryWithout, removableChips } from '../../../shared/search';
import { ctx, platforms } from './fixtures';

const parse = (q: string) => parseQuery(q, ctx);
const chipsOf = (q: string) => removableChips(parse(q), platforms);
const reparse = (q: string, kind: string, value: string) => {
  const chip = chipsOf(q).find((c) => c.kind === kind && c.value === value);
  if (!chip) throw new Error(`no ${kind} chip ${value} for "${q}"`);
  return parse(chip.without);
};

describe('removableChips: each chip knows the query without it', () => {
  it('drops one cylinder and its implied misfire code, keeping the rest', () => {
    // P0301..P0312 cylinder N misfire (references.md §1)
    const p = reparse('misfire cyl 2 and 5 sable vt27 after timing work rough idle', 'cylinder', '2');
    expect(p.cylinders).toEqual([5]);
    expect(p.impliedCodes).toEqual(['P0305']);
    expect(p.context).toEqual(['after-timing-work']);
    expect(p.platformIds).toEqual([1]);
    expect(p.tags).toEqual(expect.arrayContaining(['misfire', 'rough-idle']));
  });

  it('drops an implied code together with its cylinder', () => {
    const p = reparse('misfire cyl 2 and 5', 'code', 'P0302');
    expect(p.impliedCodes).toEqual(['P0305']);
    expect(p.cylinders).toEqual([5]);
  });

  it('drops a typed code and keeps the free words', () => {
    const p = reparse('P0171 P0174 lean both banks hiss', 'code', 'P0171');
    expect(p.codes).toEqual(['P0174']);
    expect(p.words).toEqual(expect.arrayContaining(['lean', 'hiss']));
  });

  it('drops the platform, or one of two that share an engine', () => {
    expect(parse('vt27 P0299').platformIds).toEqual([1, 3]);
    expect(reparse('vt27 P0299', 'platform', '1').platformIds).toEqual([3]);
    const p = reparse('sable vt27 P0299 whistle under boost', 'platform', '1');
    expect(p.platformIds).toEqual([]);
    expect(p.codes).toEqual(['P0299']);
    expect(p.tags).toEqual(['whistle-under-boost']);
  });

  it('drops a symptom tag', () => {
    const p = reparse('rough idle and hesitation P0171', 'tag', 'rough-idle');
    expect(p.tags).toEqual(['hesitation']);
    expect(p.codes).toEqual(['P0171']);
  });

  it('drops recent work, including the timing work a belt job implies', () => {
    const p = reparse('no start since the belt job', 'context', 'after-timing-work');
    expect(p.context).toEqual([]);
    expect(p.tags).toEqual(['no-start']);
  });

  it.each(['after-timing-work', 'after-engine-swap', 'after-tune', 'after-clutch-job', 'after-brake-job', 'after-battery-change', 'after-programming', 'after-accident-repair'])(
    'writes %s back in words the parser reads again',
    (tag) => {
      const p = parse(`rough idle ${tag.replace(/-/g, ' ')}`);
      expect(p.context).toContain(tag);
      const other = removableChips(p, platforms).find((c) => c.kind === 'tag')!;
      expect(parse(other.without).context).toContain(tag);
    },
  );

  it('offers no removal for a term reading, and none for a filter platform', () => {
    const chips = removableChips(parseQuery('cat rattle', { ...ctx, platform: platforms[0] }), platforms, 1);
    expect(chips.filter((c) => c.kind === 'term').every((c) => !c.removable)).toBe(true);
    expect(chips.some((c) => c.kind === 'platform')).toBe(false);
  });

  it('queryWithout keeps nothing of an empty parse', () => {
    const p = parse('');
    expect(queryWithout(p, { kind: 'code', value: 'P0302', label: 'P0302' }, platforms)).toBe('');
  });
});

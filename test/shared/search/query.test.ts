import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { describeQuery, emptyParse, parseQuery } from '../../../shared/search';
import { ctx, fenM16, platforms, sableVt27, tesselKx30 } from './fixtures';

const parse = (q: string) => parseQuery(q, ctx);

describe('parseQuery: trouble codes', () => {
  // Code syntax: letter P/C/B/U, digit 0-3, three hex characters, optional FTB (references.md §1)
  it.each([
    ['p0302', ['P0302']],
    ['P0302', ['P0302']],
    ['P0302-13', ['P0302']],
    ['P030213', ['P0302']],
    ['P 0302', ['P0302']],
    ['p-0302', ['P0302']],
    ['u0100 and C0035', ['U0100', 'C0035']],
    ['P0171, P0174', ['P0171', 'P0174']],
    ['p0302 P0302-13', ['P0302']],
  ])('reads %s', (q, codes) => {
    expect(parse(q).codes).toEqual(codes);
  });

  it.each(['P4302', 'X0302', 'P03021', 'P030G', 'VINP0302X'])('rejects %s', (q) => {
    expect(parse(q).codes).toEqual([]);
  });

  it('takes codes out of the free text', () => {
    const p = parse('P0171 lean at idle');
    expect(p.words).not.toContain('p0171');
    expect(p.words).toContain('lean');
  });

  it('a typed misfire code sets misfire and its cylinder', () => {
    // P0301..P0312 cylinder N misfire detected (references.md §1)
    const p = parse('P0305');
    expect(p.misfire).toBe(true);
    expect(p.cylinders).toEqual([5]);
    expect(p.impliedCodes).toEqual([]);
  });
});

describe('parseQuery: cylinders', () => {
  it.each([
    ['cyl 2 and 5 misfire', [2, 5]],
    ['cylinders 2 & 5 misfire', [2, 5]],
    ['#2 and #5 misfire', [2, 5]],
    ['misfire 2,5', [2, 5]],
    ['2,5 misfiring', [2, 5]],
    ['cyl2/5 misfire', [2, 5]],
    ['cylinder 3 misfire', [3]],
    ['cyls 1 3 5 misfire', [1, 3, 5]],
    ['2 and 5 misfire', [2, 5]],
    ['misfire on 3', [3]],
    ['missing on 2 and 6', [2, 6]],
    ['cyl. 4 stumble', [4]],
    ['cylinder no. 4 misfire', [4]],
    ['number 6 cylinder misfire', [6]],
    ['dead cyl 4', [4]],
  ])('reads %s', (q, cylinders) => {
    const p = parse(q);
    expect(p.cylinders).toEqual(cylinders);
    expect(p.misfire).toBe(true);
  });

  it('turns cylinders into misfire codes when the query talks about misfire', () => {
    expect(parse('cyl 2 and 5 misfire').impliedCodes).toEqual(['P0302', 'P0305']);
    expect(parse('stumble on 3').impliedCodes).toEqual(['P0303']);
  });

  it('does not imply misfire codes without a misfire word', () => {
    const p = parse('low compression cyl 3');
    expect(p.cylinders).toEqual([3]);
    expect(p.misfire).toBe(false);
    expect(p.impliedCodes).toEqual([]);
  });

  it('does not repeat a typed code among the implied ones', () => {
    const p = parse('P0302 misfire cyl 2 and 5');
    expect(p.codes).toEqual(['P0302']);
    expect(p.impliedCodes).toEqual(['P0305']);
  });

  it('reads "random misfire" as P0300', () => {
    // P0300 Random/Multiple Cylinder Misfire Detected (references.md §1)
    expect(parse('random misfire under load').impliedCodes).toEqual(['P0300']);
  });

  it.each([
    ['hesitation at 3/4 throttle', []],
    ['misfire at 3/4 throttle', []],
    ['misfire at 3000 rpm', []],
    ['misfire for 2 or 3 days', []],
    ['12v at the coil', []],
    ['2.5 bar fuel pressure', []],
    ['cyl 3 reads 20 psi', [3]],
  ])('does not read readings as cylinders: %s', (q, cylinders) => {
    expect(parse(q).cylinders).toEqual(cylinders);
  });

  it('does not take a lone number as a cylinder', () => {
    expect(parse('rough idle 2 weeks').cylinders).toEqual([]);
  });

  it('splits cylinders into banks on the query platform', () => {
    // VT27: bank 1 = 1, 3, 5; bank 2 = 2, 4, 6 (fixture)
    const p = parse('VT27 misfire cyl 2 and 5');
    expect(p.platformIds).toEqual([sableVt27.id, 3]);
    expect(p.banks).toEqual({ bank1: [5], bank2: [2], bothBanks: true });
  });

  it('uses each platform\'s own bank map', () => {
    // KX-30 numbers 1-3 on bank 1: cylinders 1 and 2 are one bank there
    const p = parse('tessel misfire cyl 1 and 2');
    expect(p.platformIds).toEqual([tesselKx30.id]);
    expect(p.banks).toEqual({ bank1: [1, 2], bank2: [], bothBanks: false });
  });

  it('prefers a platform passed in over words in the text', () => {
    // cylinders 2 and 3: both on bank 1 of the KX-30, one on each bank of the Sable VT27
    const p = parseQuery('misfire cyl 2 and 3 sable', { ...ctx, platform: tesselKx30 });
    expect(p.platformIds[0]).toBe(tesselKx30.id);
    expect(p.banks).toEqual({ bank1: [2, 3], bank2: [], bothBanks: false });
  });

  it('gives no banks without a platform', () => {
    expect(parse('misfire cyl 2 and 5').banks).toBeNull();
  });
});

describe('parseQuery: symptoms', () => {
  it.each([
    ['shakes at idle', ['shakes-at-idle']],
    ['shaking at idle', ['shakes-at-idle']],
    ['rough idle', ['rough-idle']],
    ['rough idel', ['rough-idle']], // one typo in the phrase
    ['rouhg idle', ['rough-idle']], // one typo in a 5-letter word
    ['idles rough', ['rough-idle']], // any order
    ['whistling on boost', ['whistle-under-boost']],
    ['whistles under boost', ['whistle-under-boost']],
    ['no start', ['no-start']],
    ["won't start", ['no-start']],
    ['cranks but does not start', ['no-start']],
    ['hesitaton', ['hesitation']], // one typo
    ['hesitates pulling away', ['hesitation']],
    ['stalling at lights', ['stalls']],
    ['hard to start when hot', ['hard-start-when-hot']],
  ])('maps %s to %j', (q, tags) => {
    expect(parse(q).tags).toEqual(tags);
  });

  it('finds several tags in query order and removes their words', () => {
    const p = parse('rough idle and shakes at idle, belt noise');
    expect(p.tags).toEqual(['rough-idle', 'shakes-at-idle']);
    expect(p.words).toEqual(['belt', 'noise']);
  });

  it('matches a tag through the J1930 normaliser', () => {
    // tag cel-on and "check engine light on" both normalise to "MIL on" (references.md §4)
    expect(parse('check engine light on').tags).toEqual(['cel-on']);
  });

  it('does not stretch short words with typos', () => {
    expect(parse('idel').tags).toEqual([]);
    expect(parse('rough ride').tags).toEqual([]);
  });

  it('keeps the misfire word for a misfire tag', () => {
    const p = parse('misfire cyl 3');
    expect(p.tags).toEqual(['misfire']);
    expect(p.misfire).toBe(true);
  });

  it('matches only the shop\'s own tags', () => {
    expect(parseQuery('rough idle', { platforms, symptomTags: [] }).tags).toEqual([]);
  });
});

describe('parseQuery: recent work', () => {
  it.each([
    ['misfire after timing work', ['after-timing-work']],
    ['since the timing chain job', ['after-timing-work']],
    ['since the belt job', ['after-timing-work', 'after-belt-job']],
    ['after timing belt replacement', ['after-timing-work', 'after-belt-job']],
    ['cambelt job done last week', ['after-timing-work', 'after-belt-job']],
    ['after swap', ['after-engine-swap']],
    ['after engine swap', ['after-engine-swap']],
    ['after swapping the engine', ['after-engine-swap']],
    ['after tune', ['after-tune']],
    ['since the remap', ['after-tune']],
    ['since the clutch job', ['after-clutch-job']],
    ['after brake job', ['after-brake-job']],
    ['since we did the brakes', ['after-brake-job']],
    ['after battery change', ['after-battery-change']],
    ['after a new battery', ['after-battery-change']],
    ['after programming', ['after-programming']],
    ['after flash', ['after-programming']],
    ['since the ECU was flashed', ['after-programming']],
    ['after coding the module', ['after-programming']],
    ['after accident repair', ['after-accident-repair']],
    ['since the collision', ['after-accident-repair']],
  ])('reads %s', (q, context) => {
    expect(parse(q).context).toEqual(context);
  });

  it.each([
    'after serpentine belt', // an accessory belt is not a belt job
    'after swapping coils', // a diagnostic swap, not an engine swap
    'after a tune-up', // a service, not a tune
    'after new engine mounts',
    'battery reads 12.4 V',
  ])('does not read %s as recent work', (q) => {
    expect(parse(q).context).toEqual([]);
  });

  it('removes the recent-work words from the free text', () => {
    const p = parse('tensioner noise after timing work');
    expect(p.words).toEqual(['tensioner', 'noise']);
  });
});

describe('parseQuery: platforms', () => {
  it('matches an engine code in any case and spacing', () => {
    expect(parse('vt27 misfire').platformIds).toEqual([1, 3]);
    expect(parse('kx 30 misfire').platformIds).toEqual([tesselKx30.id]);
    expect(parse('KX30 misfire').platformIds).toEqual([tesselKx30.id]);
  });

  it('matches a model ("the sable")', () => {
    expect(parse('the sable shakes').platformIds).toEqual([1, 2]);
  });

  it('narrows with make, model, engine and year', () => {
    expect(parse('aldwyn').platformIds).toEqual([1, 2, 3]);
    expect(parse('Aldwyn Sable VT27').platformIds).toEqual([1]);
    expect(parse('sable 2019').platformIds).toEqual([2]); // only the QL20 Sable covers 2019
  });

  it('removes platform words from the free text', () => {
    const p = parse('Brennock Fen M16 belt squeal');
    expect(p.platformIds).toEqual([fenM16.id]);
    expect(p.words).toEqual(['belt', 'squeal']);
  });

  it('keeps a year as a word when no platform is named', () => {
    expect(parse('recall 2019').words).toContain('2019');
  });
});

describe('parseQuery: J1930 terms and free text', () => {
  it('normalises terms in what is left', () => {
    const p = parseQuery('TPS replaced, check engine light flashing', { platforms, symptomTags: [] });
    expect(p.terms).toEqual([
      { from: 'TPS', to: 'TP' },
      { from: 'check engine light', to: 'MIL' },
    ]);
    expect(p.text).toBe('TP replaced MIL flashing');
    expect(p.words).toEqual(['tp', 'replaced', 'mil', 'flashing']);
  });

  it('drops stop words and lower-cases the words', () => {
    const p = parse('The belt and the Tensioner were replaced');
    expect(p.words).toEqual(['belt', 'tensioner', 'replaced']);
  });

  it('reads a full tech query into all its parts', () => {
    const p = parse('Sable VT27 cyl 2 and 5 misfire since the belt job, shakes at idle, new CPS');
    expect(p.impliedCodes).toEqual(['P0302', 'P0305']);
    expect(p.cylinders).toEqual([2, 5]);
    expect(p.banks?.bothBanks).toBe(true);
    expect(p.tags).toEqual(['misfire', 'shakes-at-idle']);
    expect(p.context).toEqual(['after-timing-work', 'after-belt-job']);
    expect(p.platformIds).toEqual([1]);
    expect(p.terms).toEqual([{ from: 'CPS', to: 'CKP' }]);
    expect(p.words).toEqual(['new', 'ckp']);
  });
});

describe('parseQuery: absurd input', () => {
  it.each([
    ['empty', ''],
    ['spaces', '     '],
    ['punctuation only', '!!!???...;;;---'],
    ['control characters', '\u0000\u0001\u0007\u001b\u0008\u007f\u200b'],
    ['emoji only', '🔧🔧🔧'],
  ])('returns an empty parse for %s', (_, q) => {
    expect(parse(q)).toEqual(emptyParse());
  });

  it('returns an empty parse for a non-string', () => {
    expect(parseQuery(undefined as unknown as string, ctx)).toEqual(emptyParse());
  });

  it('returns an empty parse for one endless word', () => {
    expect(parse('x'.repeat(10_000))).toEqual(emptyParse());
  });

  it('reads only the first 500 characters of 10 kB', () => {
    const q = `${'belt '.repeat(2_000)} P0302`;
    const t0 = performance.now();
    const p = parse(q);
    expect(performance.now() - t0).toBeLessThan(500);
    expect(p.codes).toEqual([]);
    expect(p.words).toEqual(['belt']);
  });

  it('stays fast on 10 kB of near-miss material', () => {
    const q = 'cyl 1 2 3 4 5 6 7 8 9 10 misfire after the the the rough idel #1, #2 P0 3 '.repeat(200);
    const t0 = performance.now();
    expect(() => parse(q)).not.toThrow();
    expect(performance.now() - t0).toBeLessThan(500);
  });

  it('never throws and keeps its invariants on any input', () => {
    // words a tech might type, mixed with arbitrary code points
    const vocab = fc.constantFrom('cyl', '2', '5', '#', ',', 'and', 'misfire', 'after', 'the', 'belt', 'job', 'P0302',
      'p 0', 'vt27', 'sable', 'rough', 'idel', 'TPS', '-', '/', '  ', '\u0000');
    const input = fc.oneof(
      fc.string({ unit: 'binary', maxLength: 700 }),
      fc.array(vocab, { maxLength: 150 }).map((ws) => ws.join(' ')),
    );
    fc.assert(
      fc.property(input, (q) => {
        const p = parse(q);
        expect(p.text.length).toBeLessThanOrEqual(500);
        expect(p.cylinders.every((c) => Number.isInteger(c) && c >= 1 && c <= 16)).toBe(true);
        expect(p.impliedCodes.every((c) => !p.codes.includes(c))).toBe(true);
        if (p.impliedCodes.length > 0) expect(p.misfire).toBe(true);
      }),
      { numRuns: 300 },
    );
  });

  it('treats control characters inside words as spaces', () => {
    expect(parse('rough\u0000idle').tags).toEqual(['rough-idle']);
  });
});

describe('describeQuery', () => {
  it('shows each part back as a chip', () => {
    const p = parse('VT27 cyl 2 and 5 misfire after timing work shakes at idle TPS');
    const chips = describeQuery(p, platforms);
    expect(chips).toEqual([
      { kind: 'code', value: 'P0302', label: 'P0302 (cylinder 2 misfire)' },
      { kind: 'code', value: 'P0305', label: 'P0305 (cylinder 5 misfire)' },
      { kind: 'cylinder', value: '2', label: 'cylinder 2, bank 2' },
      { kind: 'cylinder', value: '5', label: 'cylinder 5, bank 1' },
      { kind: 'cylinder', value: 'both-banks', label: 'both banks' },
      { kind: 'tag', value: 'misfire', label: 'misfire' },
      { kind: 'tag', value: 'shakes-at-idle', label: 'shakes at idle' },
      { kind: 'context', value: 'after-timing-work', label: 'after timing work' },
      { kind: 'platform', value: '1', label: 'Aldwyn Sable VT27 (2010-2016)' },
      { kind: 'platform', value: '3', label: 'Aldwyn Marsh VT27 (2012-2018)' },
      { kind: 'term', value: 'TP', label: 'TPS = TP' },
    ]);
  });

  it('labels a typed code plainly', () => {
    expect(describeQuery(parse('P0171'), platforms)).toEqual([
      { kind: 'code', value: 'P0171', label: 'P0171' },
    ]);
  });

  it('gives no chips for an empty parse', () => {
    expect(describeQuery(emptyParse(), platforms)).toEqual([]);
  });
});

import { describe, expect, it } from 'vitest';
import { caseLookupKeys, emptyParse, parseQuery, structuredKeys, textSearchTerms } from '../../../shared/search';
import { ctx } from './fixtures';

describe('structuredKeys', () => {
  it('lists typed and implied codes, their families, cylinders, tags, context and platforms', () => {
    const k = structuredKeys(parseQuery('VT27 P0171 cyl 2 and 5 misfire since the belt job, rough idle', ctx));
    expect(k.codes).toEqual(['P0171', 'P0302', 'P0305']);
    // families: first four characters ('P0302' -> 'P030')
    expect(k.families).toEqual(['P017', 'P030']);
    expect(k.cylinders).toEqual([2, 5]);
    expect(k.tags).toEqual(['misfire', 'rough-idle']);
    expect(k.context).toEqual(['after-timing-work', 'after-belt-job']);
    expect(k.platformIds).toEqual([1, 3]);
    expect(k.keys).toEqual([
      'code:P0171', 'code:P0302', 'code:P0305', 'family:P017', 'family:P030', 'cyl:2', 'cyl:5',
      'tag:misfire', 'tag:rough-idle', 'ctx:after-timing-work', 'ctx:after-belt-job', 'platform:1', 'platform:3',
    ]);
  });

  it('is empty for an empty parse', () => {
    expect(structuredKeys(emptyParse()).keys).toEqual([]);
  });
});

describe('caseLookupKeys', () => {
  it('spells a stored case\'s keys like the query\'s, so they can be joined', () => {
    const caseKeys = caseLookupKeys({
      codes: ['p0305', 'P0302-13', 'junk'], symptoms: ['Rough Idle'], context: ['after-timing-work'], platformId: 1,
    });
    expect(caseKeys.keys).toEqual([
      'code:P0305', 'code:P0302', 'family:P030', 'cyl:5', 'cyl:2', 'tag:rough-idle', 'ctx:after-timing-work', 'platform:1',
    ]);
    const queryKeys = structuredKeys(parseQuery('VT27 misfire cyl 2 rough idle', ctx)).keys;
    const shared = queryKeys.filter((k) => caseKeys.keys.includes(k));
    expect(shared).toEqual(['code:P0302', 'family:P030', 'cyl:2', 'tag:rough-idle', 'platform:1']);
  });

  it('gives no platform key without a platform', () => {
    expect(caseLookupKeys({ codes: [], symptoms: [], context: [], platformId: null }).keys).toEqual([]);
  });
});

describe('textSearchTerms', () => {
  it('sends free words, term synonyms and tag words to the text index', () => {
    const terms = textSearchTerms(parseQuery('cat rattle, rough idle', ctx));
    expect(terms).toEqual(expect.arrayContaining(['rattle', 'twc', 'cat', 'catalytic converter', 'rough idle']));
  });
});

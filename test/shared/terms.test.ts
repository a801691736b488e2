import { describe, expect, it } from 'vitest';
import { expandTerm, findTerm, normaliseTerms, TERMS } from '../../shared/terms';

const toOf = (text: string): string[] => normaliseTerms(text).terms.map((t) => t.to);

describe('normaliseTerms: informal words listed in references.md §4 (common practice)', () => {
  it.each([
    ['TPS', 'TP'], // references.md §4: TPS -> TP
    ['CPS', 'CKP'], // references.md §4: CPS -> CKP
    ['CTS', 'ECT'], // references.md §4: CTS -> ECT
    ['ACT', 'IAT'], // references.md §4: ACT/MAT -> IAT
    ['MAT', 'IAT'], // references.md §4: ACT/MAT -> IAT
    ['CEL', 'MIL'], // references.md §4: CEL -> MIL
    ['check engine light', 'MIL'], // references.md §4
    ['ECU', 'ECM'], // references.md §4: ECU -> ECM/PCM
    ['OBD port', 'DLC'], // references.md §4
    ['cat', 'TWC'], // references.md §4: cat -> catalyst (TWC)
    ['cyl', 'cylinder'], // references.md §4
  ])('reads %s as %s', (from, to) => {
    expect(toOf(`replaced the ${from} today`)).toEqual([to]);
  });
});

describe('normaliseTerms: other trade words (common practice, no source)', () => {
  it.each([
    ['cam sensor', 'CMP'],
    ['crank sensor', 'CKP'],
    ['engine light', 'MIL'],
    ['diagnostic port', 'DLC'],
    ['air flow meter', 'MAF'],
    ['lambda', 'O2S'],
    ['lambda sensor', 'O2S'],
    ['heated O2 sensor', 'HO2S'],
    ['knock sensor', 'KS'],
    ['coil pack', 'ignition coil'],
    ['flash', 'program'],
    ['reflash', 'program'],
    ['code the module', 'program'],
    ['catalytic converter', 'TWC'],
    ['purge valve', 'EVAP'],
    ['idle control valve', 'IAC'],
  ])('reads %s as %s', (from, to) => {
    expect(toOf(`checked ${from} first`)).toEqual([to]);
  });
});

describe('normaliseTerms: standard spellings map to the J1930 acronym (references.md §4)', () => {
  it.each([
    ['mass air flow sensor', 'MAF'],
    ['MAP sensor', 'MAP'],
    ['manifold absolute pressure', 'MAP'],
    ['oxygen sensor', 'O2S'],
    ['O2 sensor', 'O2S'],
    ['EGR valve', 'EGR'],
    ['EVAP', 'EVAP'],
    ['vehicle speed sensor', 'VSS'],
    ['PCV valve', 'PCV'],
    ['intake air temperature', 'IAT'],
    ['data link connector', 'DLC'],
  ])('reads %s as %s', (from, to) => {
    expect(toOf(`bad ${from} suspected`)).toEqual([to]);
  });
});

describe('normaliseTerms: matching rules', () => {
  it('ignores case and keeps the words as written in `from`', () => {
    const r = normaliseTerms('Check Engine Light came on');
    expect(r.terms).toEqual([{ from: 'Check Engine Light', to: 'MIL' }]);
    expect(r.text).toBe('MIL came on');
  });

  it('prefers the longest phrase ("MAF sensor" is one term, not MAF + sensor)', () => {
    const r = normaliseTerms('new MAF sensor fitted');
    expect(r.terms).toEqual([{ from: 'MAF sensor', to: 'MAF' }]);
    expect(r.text).toBe('new MAF fitted');
  });

  it('matches whole words only', () => {
    expect(toOf('category scatter catalogue')).toEqual([]);
    expect(toOf('TPSX and XTPS')).toEqual([]);
  });

  it('accepts plurals and hyphens', () => {
    expect(toOf('both cats and the coil-packs')).toEqual(['TWC', 'ignition coil']);
  });

  it('needs capitals for acronyms that are also English words', () => {
    expect(toOf('the MAP reads high')).toEqual(['MAP']);
    expect(toOf('new map loaded')).toEqual([]); // a tune map, not the sensor
    expect(toOf('floor mat wet, act now')).toEqual([]);
  });

  it('does not read a flashing MIL as programming', () => {
    expect(toOf('check engine light flashing')).toEqual(['MIL']);
    expect(toOf('light flashes under load')).toEqual([]);
  });

  it('leaves guarded phrases alone ("coil spring" is suspension)', () => {
    const r = normaliseTerms('broken coil spring and cat-back exhaust');
    expect(r.terms).toEqual([]);
    expect(r.text).toBe('broken coil spring and cat-back exhaust');
  });

  it('finds several terms in order', () => {
    expect(toOf('CEL on, TPS and O2 sensor replaced, ECU reflashed')).toEqual(['MIL', 'TP', 'O2S', 'ECM', 'program']);
  });

  it('returns text unchanged when nothing matches', () => {
    expect(normaliseTerms('belt tensioner noise')).toEqual({ text: 'belt tensioner noise', terms: [] });
  });
});

describe('expandTerm', () => {
  it('gives the standard form first, then its synonyms', () => {
    const forms = expandTerm('TP');
    expect(forms[0]).toBe('TP');
    expect(forms).toEqual(expect.arrayContaining(['TPS', 'throttle position sensor']));
  });

  it('expands from an informal word too', () => {
    expect(expandTerm('check engine light')[0]).toBe('MIL');
    expect(expandTerm('cat')).toEqual(expect.arrayContaining(['TWC', 'catalyst', 'catalytic converter']));
  });

  it('adds related standard forms (ECM and PCM are searched together)', () => {
    expect(expandTerm('ECU')).toEqual(expect.arrayContaining(['ECM', 'PCM']));
  });

  it('returns an unknown word as it is', () => {
    expect(expandTerm('tensioner')).toEqual(['tensioner']);
  });

  it('has no duplicates', () => {
    for (const e of TERMS) {
      const forms = expandTerm(e.to).map((f) => f.toLowerCase());
      expect(new Set(forms).size).toBe(forms.length);
    }
  });
});

describe('TERMS table', () => {
  it('marks the acronyms references.md §4 calls corroborated', () => {
    const corroborated = TERMS.filter((e) => e.evidence === 'corroborated').map((e) => e.to).sort();
    // references.md §4: DLC, ECM, ECT, EGR, IAT, MAF, MAP, O2S, HO2S corroborated by general glossaries
    expect(corroborated).toEqual(['DLC', 'ECM', 'ECT', 'EGR', 'HO2S', 'IAT', 'MAF', 'MAP', 'O2S']);
  });

  it('keeps listed words inside the informal list', () => {
    for (const e of TERMS) for (const l of e.listed ?? []) expect(e.informal).toContain(l);
  });

  it('has one entry per spelling (no word maps to two standard forms)', () => {
    const seen = new Map<string, string>();
    for (const e of TERMS) {
      for (const s of [e.to, ...e.standard, ...e.informal]) {
        const k = s.toLowerCase();
        expect(seen.get(k) ?? e.to, `"${s}" is in ${seen.get(k)} and ${e.to}`).toBe(e.to);
        seen.set(k, e.to);
      }
    }
  });

  it('finds an entry by any spelling', () => {
    expect(findTerm('air flow meter')?.to).toBe('MAF');
    expect(findTerm('nonsense')).toBeUndefined();
  });
});

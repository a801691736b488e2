import { describe, expect, it } from 'vitest';
import { codeMatches, conditionHolds, listCauses, parseTree, TreeError } from '../../../shared/walk';
import { evidence } from './helpers';

const cause = (over: Record<string, unknown> = {}) => ({
  id: 'leaky-hose',
  title: 'Hose leaking',
  weight: 2,
  minutes: 10,
  test: { do: 'Look at the hose.', expect: 'Dry.' },
  ...over,
});
const tree = (causes: unknown[], over: Record<string, unknown> = {}) => ({
  id: 'hoses',
  title: 'Hoses',
  description: 'Hose faults.',
  appliesTo: { symptoms: ['leak'] },
  branches: [{ system: 'cooling', causes }],
  ...over,
});

function problems(input: unknown): string[] {
  try {
    parseTree(input);
  } catch (error) {
    if (error instanceof TreeError) return error.problems;
    throw error;
  }
  return [];
}

describe('parseTree', () => {
  it('accepts a minimal tree and fills defaults', () => {
    const parsed = parseTree(tree([cause()]));
    const [only] = listCauses(parsed);
    expect(only?.globalId).toBe('hoses/leaky-hose');
    expect(only?.system).toBe('cooling');
    expect(only?.modifiers).toEqual([]);
    expect(only?.test.tools).toEqual([]);
  });

  it('accepts unit spellings in a spec and stores the canonical unit', () => {
    const parsed = parseTree(tree([cause({ test: { do: 'x', expect: 'y', spec: { max: 7, unit: 'KPA' } } })]));
    expect(listCauses(parsed)[0]?.test.spec?.unit).toBe('kPa');
  });

  it('reports a repeated cause id with its path', () => {
    expect(problems(tree([cause(), cause()]))).toEqual(['branches.0.causes.1.id: cause id "leaky-hose" is used twice']);
  });

  it('reports unknown keys, so a typo in a file does not pass silently', () => {
    expect(problems(tree([cause({ wieght: 3 })])).join()).toMatch(/wieght/);
  });

  it('rejects specs without limits, with min above max, or with an unknown unit', () => {
    expect(problems(tree([cause({ test: { do: 'x', expect: 'y', spec: { unit: 'V' } } })])).join()).toMatch(/min, max or both/);
    expect(problems(tree([cause({ test: { do: 'x', expect: 'y', spec: { min: 5, max: 1, unit: 'V' } } })])).join()).toMatch(/above max/);
    expect(problems(tree([cause({ test: { do: 'x', expect: 'y', spec: { max: 1, unit: 'furlong' } } })])).length).toBeGreaterThan(0);
  });

  it('rejects bad code patterns, ids and non-positive weights', () => {
    expect(problems(tree([cause()], { appliesTo: { codes: ['P03'] } })).join()).toMatch(/code pattern/);
    expect(problems(tree([cause({ id: 'Leaky Hose' })])).join()).toMatch(/hyphens/);
    expect(problems(tree([cause({ weight: 0 })])).length).toBeGreaterThan(0);
  });

  it('rejects a tree that nothing can select', () => {
    expect(problems(tree([cause()], { appliesTo: {} })).join()).toMatch(/never be chosen/);
  });
});

describe('code patterns and conditions', () => {
  it('matches families, exact codes and single-character wildcards', () => {
    expect(codeMatches('P030*', 'P0302')).toBe(true);
    expect(codeMatches('P030*', 'P0302-00')).toBe(true);
    expect(codeMatches('P030*', 'P0420')).toBe(false);
    expect(codeMatches('P0171', 'p0171')).toBe(true);
    expect(codeMatches('P0171', 'P0174')).toBe(false);
    expect(codeMatches('P017?', 'P0174')).toBe(true);
    expect(codeMatches('U0*', 'U0100')).toBe(true);
  });

  it('needs every key of a condition to hold', () => {
    const ev = evidence({ codes: ['P0171'], context: ['after-intake-work'] });
    expect(conditionHolds({ codes: ['P0171'], context: ['after-intake-work'] }, ev, 'fail')).toBe(true);
    expect(conditionHolds({ codes: ['P0171'], context: ['after-timing-work'] }, ev, 'fail')).toBe(false);
    expect(conditionHolds({ allCodes: ['P0171', 'P0174'] }, ev, 'fail')).toBe(false);
  });

  it('lets an unknown platform pass an applicability check but not fire a modifier', () => {
    const ev = evidence();
    expect(conditionHolds({ fuel: ['petrol'] }, ev, 'pass')).toBe(true);
    expect(conditionHolds({ fuel: ['petrol'] }, ev, 'fail')).toBe(false);
    expect(conditionHolds({ layout: ['v'] }, evidence({ platform: { layout: 'V8' } }), 'fail')).toBe(true);
  });
});

import { describe, expect, it } from 'vitest';
import {
  areFiringCompanions,
  bankOfCylinder,
  banksOfCylinders,
  describeCylinders,
  fireConsecutively,
  firingCompanionPairs,
  type Platform,
  type PlatformInput,
  platformFieldsSchema,
  platformInputSchema,
  platformProblems,
  platformSimilarity,
} from '../../shared/platform';

// Invented makes, models and engine codes.
const inline4: PlatformInput = {
  make: 'Corvane',
  model: 'Tern',
  engine: 'KX16',
  yearFrom: 2012,
  yearTo: 2019,
  cylinders: 4,
  layout: 'inline',
  firingOrder: [1, 3, 4, 2], // inline-4, references.md §6 [S]
  fuel: 'petrol',
  induction: 'natural',
};

const v6: PlatformInput = {
  make: 'Halvard',
  model: 'Ridgeline Estate',
  engine: 'HV30 V6',
  yearFrom: 2008,
  yearTo: 2015,
  cylinders: 6,
  layout: 'V',
  // numbered one bank after the other, so 1-4-3-6-2-5 alternates banks as an even-firing V6 must
  banks: { '1': [1, 2, 3], '2': [4, 5, 6] },
  firingOrder: [1, 4, 3, 6, 2, 5], // common 90-degree V6, references.md §6 [S]
  fuel: 'petrol',
  induction: 'turbo',
};

const v8: PlatformInput = {
  make: 'Halvard',
  model: 'Tamar',
  engine: 'HV50',
  yearFrom: 2005,
  yearTo: 2011,
  cylinders: 8,
  layout: 'V',
  banks: { '1': [1, 3, 5, 7], '2': [2, 4, 6, 8] },
  firingOrder: [1, 8, 4, 3, 6, 5, 7, 2], // cross-plane V8, references.md §6 [S]
};

const inline6: PlatformInput = { ...inline4, engine: 'KX30', cylinders: 6, firingOrder: [1, 5, 3, 6, 2, 4] }; // references.md §6 [S]

function issues(input: unknown): string[] {
  const r = platformInputSchema.safeParse(input);
  return r.success ? [] : r.error.issues.map((i) => i.message);
}

describe('platformInputSchema', () => {
  it.each([
    ['inline-4', inline4],
    ['V6', v6],
    ['V8', v8],
    ['inline-6', inline6],
  ])('accepts a %s record', (_, p) => {
    expect(issues(p)).toEqual([]);
  });

  it('accepts an electric platform with 0 cylinders', () => {
    expect(issues({ ...inline4, cylinders: 0, firingOrder: undefined, fuel: 'electric' })).toEqual([]);
  });

  it('trims text fields', () => {
    expect(platformInputSchema.parse({ ...inline4, make: '  Corvane ' }).make).toBe('Corvane');
  });

  it.each([
    [{ yearFrom: 2020, yearTo: 2012 }, 'Last year (2012) is before first year (2020)'],
    [{ yearFrom: 1850 }, 'First year must be 1900 or later'],
    [{ yearTo: 2100 }, 'Last year must be 2039 or earlier'],
    [{ yearFrom: 2012.5 }, 'First year must be a whole year'],
    [{ cylinders: 17, firingOrder: undefined }, 'Cylinders must be 0 (electric) to 16'],
    [{ cylinders: -1, firingOrder: undefined }, 'Cylinders must be 0 (electric) to 16'],
    [{ cylinders: 0, firingOrder: undefined }, '0 cylinders is only for electric platforms: set fuel to electric'],
    [{ fuel: 'electric' }, 'An electric platform has 0 cylinders'],
    [{ make: ' ' }, 'Make is required'],
    [{ layout: 'W' }, 'Layout must be inline, V or flat'],
    [{ fuel: 'steam' }, 'Fuel must be petrol, diesel, hybrid or electric'],
    [{ induction: 'blown' }, 'Induction must be natural, turbo or supercharged'],
    [{ banks: { '1': [1, 2], '2': [3, 4] } }, 'An inline engine has one bank: leave banks out'],
    [{ firingOrder: [1, 3, 4] }, 'Firing order lists 3 cylinders but the engine has 4'],
    [{ firingOrder: [1, 3, 3, 2] }, 'Firing order lists cylinder 3 more than once'],
    [{ firingOrder: [1, 3, 5, 2] }, 'Firing order names cylinder 5, beyond 4'],
    [{ firingOrder: [0, 1, 2, 3] }, 'cylinder numbers start at 1'],
  ])('rejects %j: %s', (patch, message) => {
    expect(issues({ ...inline4, ...patch })).toContain(message);
  });

  it.each([
    [{ '1': [1, 3, 5], '2': [2, 4] }, 'Cylinder 6 is on neither bank'],
    [{ '1': [1, 3, 5, 2], '2': [2, 4, 6] }, 'Cylinder 2 is listed more than once across the banks'],
    [{ '1': [1, 3, 5], '2': [2, 4, 7] }, 'Cylinder 7 is beyond the 6 cylinders of this engine'],
    [{ '1': [1, 2, 3, 4, 5, 6], '2': [] }, 'A V or flat engine needs cylinders on both banks'],
  ])('rejects V6 banks %j: %s', (banks, message) => {
    expect(issues({ ...v6, banks })).toContain(message);
  });

  it('puts each problem on its field', () => {
    const r = platformInputSchema.safeParse({ ...v6, yearTo: 2001, banks: { '1': [1], '2': [2] } });
    expect(r.success).toBe(false);
    const paths = r.error?.issues.map((i) => i.path.join('.')) ?? [];
    expect(paths).toContain('yearTo');
    expect(paths).toContain('banks');
  });
});

describe('banks', () => {
  it('an inline engine is all bank 1', () => {
    expect(bankOfCylinder(inline4, 3)).toBe(1);
  });

  it('a V engine uses its recorded banks; bank 1 holds cylinder 1', () => {
    // references.md §6 [M]: bank 1 is the bank with cylinder 1
    expect(bankOfCylinder(v6, 1)).toBe(1);
    expect(bankOfCylinder(v6, 4)).toBe(2);
  });

  it('does not guess banks that are not recorded', () => {
    const { banks: _, ...noBanks } = v6;
    expect(bankOfCylinder(noBanks, 2)).toBeNull();
  });

  it('returns null for cylinders the engine does not have', () => {
    expect(bankOfCylinder(inline4, 5)).toBeNull();
    expect(bankOfCylinder(v6, 0)).toBeNull();
  });

  it('sorts a set of cylinders by bank', () => {
    expect(banksOfCylinders(v6, [2, 5, 9, 2])).toEqual({ bank1: [2], bank2: [5], unknown: [9], bothBanks: true });
    expect(banksOfCylinders(v6, [1, 3])).toMatchObject({ bothBanks: false });
    expect(banksOfCylinders(inline4, [1, 4]).bank1).toEqual([1, 4]);
  });
});

describe('firing companions', () => {
  it('inline-4 1-3-4-2: 1 and 4 are companions, 2 and 3 are companions', () => {
    // references.md §6 [S]
    expect(areFiringCompanions(inline4, 1, 4)).toBe(true);
    expect(areFiringCompanions(inline4, 4, 1)).toBe(true);
    expect(areFiringCompanions(inline4, 2, 3)).toBe(true);
    expect(areFiringCompanions(inline4, 1, 3)).toBe(false);
    expect(areFiringCompanions(inline4, 1, 2)).toBe(false);
  });

  it('inline-6 1-5-3-6-2-4: 1&6, 5&2, 3&4', () => {
    // references.md §6 [S]
    expect(firingCompanionPairs(inline6.firingOrder ?? [])).toEqual([
      [1, 6],
      [5, 2],
      [3, 4],
    ]);
    expect(areFiringCompanions(inline6, 3, 4)).toBe(true);
    expect(areFiringCompanions(inline6, 1, 5)).toBe(false);
  });

  it('V6 1-4-3-6-2-5: 1&6, 4&2, 3&5', () => {
    // references.md §6 [S]
    expect(firingCompanionPairs(v6.firingOrder ?? [])).toEqual([
      [1, 6],
      [4, 2],
      [3, 5],
    ]);
  });

  it('cross-plane V8 1-8-4-3-6-5-7-2: 1&6, 8&5, 4&7, 3&2', () => {
    // references.md §6 [S]
    expect(areFiringCompanions(v8, 1, 6)).toBe(true);
    expect(areFiringCompanions(v8, 8, 5)).toBe(true);
    expect(areFiringCompanions(v8, 4, 7)).toBe(true);
    expect(areFiringCompanions(v8, 3, 2)).toBe(true);
    expect(areFiringCompanions(v8, 1, 8)).toBe(false);
  });

  it('other V8 order 1-5-4-2-6-3-7-8: 1&6, 5&3, 4&7, 2&8', () => {
    // references.md §6 [S]
    expect(firingCompanionPairs([1, 5, 4, 2, 6, 3, 7, 8])).toEqual([
      [1, 6],
      [5, 3],
      [4, 7],
      [2, 8],
    ]);
  });

  it('is null without a firing order and false for odd counts or the same cylinder', () => {
    expect(areFiringCompanions({ cylinders: 4 }, 1, 4)).toBeNull();
    expect(areFiringCompanions({ cylinders: 5, firingOrder: [1, 2, 4, 5, 3] }, 1, 4)).toBe(false);
    expect(firingCompanionPairs([1, 2, 4, 5, 3])).toEqual([]);
    expect(areFiringCompanions(inline4, 2, 2)).toBe(false);
  });

  it('throws for a cylinder the engine does not have', () => {
    expect(() => areFiringCompanions(inline4, 1, 5)).toThrow(RangeError);
  });

  it('knows which cylinders fire one after the other, wrapping round', () => {
    expect(fireConsecutively(inline4, 1, 3)).toBe(true);
    expect(fireConsecutively(inline4, 2, 1)).toBe(true); // 2 then back to 1
    expect(fireConsecutively(inline4, 1, 4)).toBe(false);
    expect(fireConsecutively({ cylinders: 4 }, 1, 3)).toBeNull();
  });
});

describe('describeCylinders', () => {
  it('V6 cylinders 1 and 6: one on each bank, firing companions', () => {
    expect(describeCylinders(v6, [1, 6])).toBe('cylinders 1 and 6: one on each bank, firing companions');
  });

  it('V6 cylinders 2 and 5: one on each bank, firing one after the other', () => {
    expect(describeCylinders(v6, [2, 5])).toBe('cylinders 2 and 5: one on each bank, fire one after the other');
  });

  it('same bank, no firing relation', () => {
    expect(describeCylinders(v8, [1, 3])).toBe('cylinders 1 and 3: both on bank 1');
    expect(describeCylinders(v8, [2, 4, 8])).toBe('cylinders 2, 4 and 8: all on bank 2');
  });

  it('inline engines say nothing about banks', () => {
    expect(describeCylinders(inline4, [1, 4])).toBe('cylinders 1 and 4: firing companions');
    expect(describeCylinders(inline4, [3])).toBe('cylinder 3');
  });

  it('a single V cylinder names its bank', () => {
    expect(describeCylinders(v6, [4])).toBe('cylinder 4: bank 2');
  });

  it('mixed sets list both banks and any companion pairs', () => {
    expect(describeCylinders(v6, [1, 2, 4, 6])).toBe('cylinders 1, 2, 4 and 6: 1 and 2 on bank 1, 4 and 6 on bank 2, firing companions 1 and 6, 4 and 2');
  });

  it('says when banks are not recorded', () => {
    const { banks: _, firingOrder: __, ...bare } = v6;
    expect(describeCylinders(bare, [2, 5])).toBe('cylinders 2 and 5: bank not recorded');
  });

  it('flags cylinders the engine does not have, and empty sets', () => {
    expect(describeCylinders(inline4, [2, 7])).toBe('cylinder 7 is not on this engine (4 cylinders)');
    expect(describeCylinders(inline4, [])).toBe('no cylinders');
  });
});

describe('platformSimilarity', () => {
  const p = (id: number, input: PlatformInput): Platform => ({ ...input, id });

  it('the same record is the same engine with score 1', () => {
    expect(platformSimilarity(p(1, v6), p(1, v6))).toEqual({ level: 'same-engine', score: 1 });
  });

  it('same make and engine in another model is same-engine', () => {
    const r = platformSimilarity(p(1, v6), p(2, { ...v6, model: 'Ridgeline Van' }));
    expect(r.level).toBe('same-engine');
    expect(r.score).toBeGreaterThanOrEqual(0.85);
    expect(r.score).toBeLessThan(1);
  });

  it('engine names compare without case or extra spaces', () => {
    expect(platformSimilarity(p(1, v6), p(2, { ...v6, engine: 'hv30  v6' })).level).toBe('same-engine');
  });

  it('same make and model with another engine is same-model', () => {
    const r = platformSimilarity(p(1, inline4), p(2, inline6));
    expect(r.level).toBe('same-model');
    expect(r.score).toBeGreaterThanOrEqual(0.6);
  });

  it('another make with the same layout and cylinder count is same-layout', () => {
    const other = p(2, { ...v6, make: 'Ostrava', model: 'Kestrel', engine: 'OK-30' });
    const r = platformSimilarity(p(1, v6), other);
    expect(r.level).toBe('same-layout');
    expect(r.score).toBeGreaterThan(0.3);
  });

  it('unrelated platforms score 0', () => {
    expect(platformSimilarity(p(1, inline4), p(2, v8))).toEqual({ level: 'none', score: 0 });
  });

  it('scores rank the levels in order and are symmetric', () => {
    const a = p(1, v6);
    const engine = platformSimilarity(a, p(2, { ...v6, model: 'Ridgeline Van' })).score;
    const model = platformSimilarity(a, p(3, { ...v6, engine: 'HV35', cylinders: 6 })).score;
    const layout = platformSimilarity(a, p(4, { ...v6, make: 'Ostrava', model: 'Kestrel', engine: 'OK-30' })).score;
    expect(engine).toBeGreaterThan(model);
    expect(model).toBeGreaterThan(layout);
    expect(platformSimilarity(p(4, inline6), a)).toEqual(platformSimilarity(a, p(4, inline6)));
  });
});

describe('platformFieldsSchema', () => {
  it('can be made partial for updates, while the full schema keeps the cross-field rules', () => {
    const patch = platformFieldsSchema.partial().parse({ yearTo: 2010 });
    expect(patch).toEqual({ yearTo: 2010 });
    expect(issues({ ...inline4, ...patch })).toContain('Last year (2010) is before first year (2012)');
    expect(platformProblems({ ...inline4, ...patch })).toEqual([[['yearTo'], 'Last year (2010) is before first year (2012)']]);
  });
});

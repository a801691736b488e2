import { describe, expect, it } from 'vitest';
import { stepMarkSchema, walkCreateSchema } from '../../../shared/walk';

describe('walkCreateSchema', () => {
  it('normalises codes and tags and fills defaults', () => {
    const parsed = walkCreateSchema.parse({ codes: [' p0302 ', 'P0301-00'], symptoms: ['Rough idle'], platformId: 4 });
    expect(parsed.codes).toEqual(['P0302', 'P0301-00']);
    expect(parsed.symptoms).toEqual(['rough-idle']);
    expect(walkCreateSchema.parse({}).codes).toEqual([]);
  });

  it('rejects codes that are not J2012 shaped and unknown fields', () => {
    // SAE J2012 format: letter P/C/B/U, then 0-3, then three hex characters (references.md §1)
    expect(walkCreateSchema.safeParse({ codes: ['P4302'], symptoms: [] }).success).toBe(false);
    expect(walkCreateSchema.safeParse({ codes: ['X0100'], symptoms: [] }).success).toBe(false);
    expect(walkCreateSchema.safeParse({ codes: [], symptoms: [], shopId: 3 }).success).toBe(false);
  });
});

describe('stepMarkSchema', () => {
  it('accepts a test with an outcome and a reading in any spelling of its unit', () => {
    const parsed = stepMarkSchema.parse({ state: 'tested', outcome: 'no_fault', measurement: { value: 45, unit: 'PSI' } });
    expect(parsed.measurement).toEqual({ value: 45, unit: 'psi' });
  });

  it('mirrors the walk rules so the API can name the field at fault', () => {
    const fields = (input: unknown) => stepMarkSchema.safeParse(input).error?.issues.map((i) => i.path.join('.'));
    expect(fields({ state: 'tested' })).toEqual(['outcome']);
    expect(fields({ state: 'open', outcome: 'no_fault' })).toEqual(['outcome']);
    expect(fields({ state: 'ruled_out' })).toEqual(['note']);
    expect(fields({ state: 'ruled_out', note: 'new part', measurement: { value: 1, unit: 'V' } })).toEqual(['measurement']);
    expect(fields({ state: 'tested', outcome: 'no_fault', measurement: { value: 1, unit: 'cubits' } })).toEqual(['measurement.unit']);
  });
});

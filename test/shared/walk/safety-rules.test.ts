/// <reference types="node" />
// Trade-content rules over every shipped tree and platform (issue 13).
import { readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { parse } from 'yaml';
import { describe, expect, it } from 'vitest';
import { codeCaution } from '../../../shared/codes/code-cautions';
import { bankFiringWarnings, platformInputSchema } from '../../../shared/platform';
import { composeCaution, conditionHolds, DEFERRAL, emptyEvidence, listCauses, parseTree, removedCautions, stepCaution } from '../../../shared/walk';

const root = path.resolve(import.meta.dirname, '../../../content');
const trees = readdirSync(path.join(root, 'trees')).filter((f) => f.endsWith('.yaml')).map((f) => parseTree(parse(readFileSync(path.join(root, 'trees', f), 'utf8'))));
const causes = trees.flatMap(listCauses);
const diesel = { ...emptyEvidence(), platform: { fuel: 'diesel' } } as ReturnType<typeof emptyEvidence>;

describe('shipped content safety rules', () => {
  it('keeps ignition causes and petrol manifold-vacuum specs off diesel platforms', () => {
    const petrolOnly = causes.filter((c) => c.system === 'ignition' || (c.test.spec?.unit === 'inHg' && /petrol/i.test(c.test.spec.text ?? '')));
    expect(petrolOnly.length).toBeGreaterThan(3);
    for (const c of petrolOnly) expect(c.appliesWhen && conditionHolds(c.appliesWhen, diesel, 'pass'), c.globalId).toBe(false);
  });

  it('words every step caution once and defers exactly once', () => {
    for (const c of causes) {
      const text = stepCaution(c, { platform: { fuel: 'hybrid' } }) ?? '';
      expect(text, c.globalId).not.toMatch(/caution:/i);
      expect(text.split(DEFERRAL).length - 1, c.globalId).toBe(1);
      expect(text.match(/follow the manufacturer/gi)?.length, c.globalId).toBe(1);
      expect(text, c.globalId).toMatch(/ready mode the engine can start by itself/);
    }
    expect(composeCaution(['Caution: Caution: hot. Follow the manufacturer’s procedure.'])).toBe(`hot. ${DEFERRAL}`);
  });

  it('adds the closed-bay exhaust caution to running-engine steps and the road-test caution to road tests', () => {
    const coil = causes.find((c) => c.globalId === 'misfire/coil');
    const text = coil ? stepCaution(coil, { platform: null }) ?? '' : '';
    expect(text).toMatch(/closed bay/);
    expect(text).toMatch(/second person reads the scan tool/);
  });

  it('refuses an edit that removes a shipped caution', () => {
    const misfire = trees.find((t) => t.id === 'misfire');
    if (!misfire) throw new Error('misfire tree missing');
    expect(removedCautions(misfire, misfire)).toEqual([]);
    const cut = structuredClone(misfire);
    delete cut.branches[0]?.causes[0]?.caution;
    expect(removedCautions(misfire, cut)[0]).toMatch(/"coil" must keep its shipped caution/);
  });

  it('has no cold-plug step that asks for a warm compression test', () => {
    const compression = causes.find((c) => c.globalId === 'misfire/low-compression');
    expect(compression?.test.do).toMatch(/^Engine cold/);
  });

  it('fits every shipped bank map to its firing order', () => {
    const list = (parse(readFileSync(path.join(root, 'platforms.yaml'), 'utf8')) as { platforms: Record<string, unknown>[] }).platforms;
    for (const { key, ...rest } of list) expect(bankFiringWarnings(platformInputSchema.parse(rest)), String(key)).toEqual([]);
    // the old VT27 map: odd/even banks against 1-4-3-6-2-5 fires 6 then 2 on bank 2
    const wrong = bankFiringWarnings({ layout: 'V', cylinders: 6, banks: { '1': [1, 3, 5], '2': [2, 4, 6] }, firingOrder: [1, 4, 3, 6, 2, 5] });
    expect(wrong[0]).toMatch(/6 then 2 on bank 2/);
  });

  it('chooses code-page cautions from the range table', () => {
    expect(codeCaution('P0299')?.topic).toBe('boost');
    expect(codeCaution('P0217')?.topic).toBe('over-temperature');
    expect(codeCaution('P0335')?.topic).toBe('rotating-engine');
    expect(codeCaution('P0380')?.topic).toBe('glow-plugs');
    expect(codeCaution('P0087')?.topic).toBe('fuel-pressure');
    expect(codeCaution('U0151')?.topic).toBe('restraints');
    expect(codeCaution('P0302')?.topic).toBe('ignition');
    expect(codeCaution('P0A80')?.topic).toBe('hybrid-high-voltage');
  });
});

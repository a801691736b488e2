import { describe, expect, it } from 'vitest';
import { caseWeight, DEFAULT_STRENGTH, learnFromCases, PRECEDENT_COUNT, priorsFor, SHARPNESS, startWalk, type CausePrior, type ConfirmedCase } from '../../../shared/walk';
import { evidence, loadTree } from './helpers';

const misfire = loadTree('misfire');
const random = evidence({ codes: ['P0300'] });
const base = priorsFor(misfire, random);
const pOf = (priors: CausePrior[], id: string) => priors.find((p) => p.causeId === id)?.probability ?? NaN;
const camCase = (caseId: string | number, similarity = 1): ConfirmedCase => ({
  caseId,
  title: `Case ${caseId}: P0300 after belt job`,
  cause: 'misfire/cam-timing',
  similarity,
});

describe('learnFromCases', () => {
  it('raises a cause confirmed in this shop and lowers the others, still summing to 1', () => {
    const learned = learnFromCases(base, [camCase('c-101', 0.9)]);
    expect(pOf(learned, 'cam-timing')).toBeGreaterThan(pOf(base, 'cam-timing'));
    for (const p of base.filter((p) => p.causeId !== 'cam-timing')) {
      expect(pOf(learned, p.causeId)).toBeLessThan(p.probability);
    }
    expect(learned.reduce((s, p) => s + p.probability, 0)).toBeCloseTo(1, 12);
  });

  it('follows the documented Dirichlet mean (a p + n) / (a + N), each case counting PRECEDENT_COUNT x s^SHARPNESS', () => {
    const learned = learnFromCases(base, [camCase(1, 0.8), { ...camCase(2, 0.5), cause: 'misfire/coil' }]);
    const a = DEFAULT_STRENGTH;
    const [n1, n2] = [PRECEDENT_COUNT * 0.8 ** SHARPNESS, PRECEDENT_COUNT * 0.5 ** SHARPNESS];
    expect(pOf(learned, 'cam-timing')).toBeCloseTo((a * pOf(base, 'cam-timing') + n1) / (a + n1 + n2), 12);
    expect(pOf(learned, 'coil')).toBeCloseTo((a * pOf(base, 'coil') + n2) / (a + n1 + n2), 12);
  });

  it('counts similarity sharply: a near-exact precedent moves a cause far more than a same-family case', () => {
    const exact = pOf(learnFromCases(base, [camCase('exact', 1)]), 'cam-timing') - pOf(base, 'cam-timing');
    const family = pOf(learnFromCases(base, [camCase('family', 0.45)]), 'cam-timing') - pOf(base, 'cam-timing');
    expect(caseWeight(1) / caseWeight(0.45)).toBeGreaterThan(20);
    expect(exact).toBeGreaterThan(8 * family);
    // the shop's exact precedent takes the lead over the tree's favourite...
    const precedent = learnFromCases(base, [camCase('exact', 1)]);
    expect(pOf(precedent, 'cam-timing')).toBeGreaterThan(pOf(precedent, 'coil'));
    // ...a loosely related case does not
    const loose = learnFromCases(base, [camCase('loose', 0.45)]);
    expect(pOf(loose, 'cam-timing')).toBeLessThan(pOf(loose, 'coil'));
  });

  it('lets many confirmed fixes of the same cause take the lead', () => {
    const learned = learnFromCases(base, Array.from({ length: 10 }, (_, i) => camCase(i)));
    const top = [...learned].sort((a, b) => b.probability - a.probability)[0];
    expect(top?.causeId).toBe('cam-timing');
  });

  it('lists the supporting cases on the cause and says how many', () => {
    const learned = learnFromCases(base, [camCase('a', 0.4), camCase('b', 0.9)]);
    const cam = learned.find((p) => p.causeId === 'cam-timing');
    expect(cam?.evidence).toEqual([
      { caseId: 'b', title: 'Case b: P0300 after belt job' },
      { caseId: 'a', title: 'Case a: P0300 after belt job' },
    ]);
    expect(cam?.why).toContain('2 confirmed fixes in this shop');
    expect(learnFromCases(base, [camCase('a')]).find((p) => p.causeId === 'cam-timing')?.why).toContain(
      '1 confirmed fix in this shop',
    );
  });

  it('ignores cases of other trees, repeated cases and cases with no similarity', () => {
    const other: ConfirmedCase = { caseId: 'x', title: 'Brake judder', cause: 'brakes/rotor-runout', similarity: 1 };
    expect(learnFromCases(base, [other, camCase('z', 0)])).toEqual(base);
    const once = learnFromCases(base, [camCase('same')]);
    const twice = learnFromCases(base, [camCase('same'), camCase('same')]);
    expect(pOf(twice, 'cam-timing')).toBe(pOf(once, 'cam-timing'));
  });

  it('carries shop cases into the walk so the confirmed cause moves up the order', () => {
    const plain = startWalk(misfire, random);
    const learned = startWalk(misfire, random, { confirmedCases: [camCase(7), camCase(8), camCase(9)] });
    const rank = (w: typeof plain) => w.steps.findIndex((s) => s.id === 'cam-timing');
    expect(rank(learned)).toBeLessThan(rank(plain));
    expect(learned.steps.find((s) => s.id === 'cam-timing')?.evidence).toHaveLength(3);
  });
});

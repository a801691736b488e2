import { describe, expect, it } from 'vitest';
import { priorsFor, startWalk, type CausePrior } from '../../../shared/walk';
import { evidence, loadTree } from './helpers';

const misfire = loadTree('misfire');
const CYLINDER_LOCAL = ['coil', 'spark-plug', 'injector', 'low-compression', 'ignition-harness', 'injector-harness'];
const SHARED = ['cam-timing', 'fuel-pressure-low', 'vacuum-leak', 'maf-contaminated'];

const pOf = (priors: CausePrior[], id: string) => priors.find((p) => p.causeId === id)?.probability ?? NaN;
const sum = (priors: CausePrior[]) => priors.reduce((s, p) => s + p.probability, 0);

// A V6 numbered 1-3-5 on bank 1 and 2-4-6 on bank 2 (fictional platform record).
const bothBanks = evidence({
  codes: ['P0300', 'P0302', 'P0305'],
  cylinders: [2, 5],
  banks: { bank1: [5], bank2: [2], bothBanks: true },
  platform: { fuel: 'petrol', layout: 'V6', cylinders: 6 },
});
const singleCylinder = evidence({
  codes: ['P0302'],
  cylinders: [2],
  banks: { bank1: [], bank2: [2], bothBanks: false },
  platform: { fuel: 'petrol', layout: 'V6', cylinders: 6 },
});

describe('priorsFor', () => {
  it('gives probabilities that sum to 1', () => {
    expect(sum(priorsFor(misfire, bothBanks))).toBeCloseTo(1, 12);
    expect(sum(priorsFor(misfire, evidence()))).toBeCloseTo(1, 12);
  });

  it('sends a tech to a shared cause first when misfires span both banks', () => {
    const walk = startWalk(misfire, bothBanks);
    expect(SHARED).toContain(walk.nextStepId);
    const coil = walk.steps.find((s) => s.id === 'coil');
    expect(coil?.why).toContain('misfires on both banks make a part on one cylinder unlikely');
    const cam = walk.steps.find((s) => s.id === 'cam-timing');
    expect(cam?.why).toContain('misfires on both banks point to a shared cause');
  });

  it('sends a tech to a part on that cylinder first when one cylinder misfires', () => {
    const walk = startWalk(misfire, singleCylinder);
    expect(CYLINDER_LOCAL).toContain(walk.nextStepId);
    expect(walk.steps.slice(0, 3).every((s) => CYLINDER_LOCAL.includes(s.id))).toBe(true);
  });

  it('moves cylinder-local causes up and shared ones down going from both banks to one cylinder', () => {
    const wide = priorsFor(misfire, bothBanks);
    const narrow = priorsFor(misfire, singleCylinder);
    for (const id of ['coil', 'spark-plug', 'injector', 'low-compression']) expect(pOf(narrow, id)).toBeGreaterThan(pOf(wide, id));
    for (const id of SHARED) expect(pOf(narrow, id)).toBeLessThan(pOf(wide, id));
  });

  it('puts cam timing first after timing work, where it was not first before', () => {
    const random = evidence({ codes: ['P0300'] });
    expect(startWalk(misfire, random).nextStepId).not.toBe('cam-timing');
    const afterTiming = startWalk(misfire, { ...random, context: ['after-timing-work'] });
    expect(afterTiming.nextStepId).toBe('cam-timing');
    expect(afterTiming.steps[0]?.why).toContain('timing work was done just before the fault');
  });

  it('reads a single-cylinder pattern from a per-cylinder code when no cylinder list is given', () => {
    const walk = startWalk(misfire, evidence({ codes: ['P0304'] }));
    expect(CYLINDER_LOCAL).toContain(walk.nextStepId);
  });

  it('drops causes that cannot apply to a known platform and keeps them when it is unknown', () => {
    const diesel = priorsFor(misfire, evidence({ codes: ['P0300'], platform: { fuel: 'diesel' } }));
    expect(diesel.map((p) => p.causeId)).not.toContain('spark-plug');
    const unknown = priorsFor(misfire, evidence({ codes: ['P0300'] }));
    expect(unknown.map((p) => p.causeId)).toContain('spark-plug');
    const gasoline = priorsFor(misfire, evidence({ codes: ['P0300'], platform: { fuel: 'Gasoline' } }));
    expect(gasoline.map((p) => p.causeId)).toContain('spark-plug');
  });

  it('raises the causes a stored code points at', () => {
    const plain = priorsFor(misfire, evidence({ codes: ['P0300'] }));
    const withCoilCode = priorsFor(misfire, evidence({ codes: ['P0300', 'P0352'] }));
    expect(pOf(withCoilCode, 'coil')).toBeGreaterThan(pOf(plain, 'coil'));
    expect(pOf(withCoilCode, 'ignition-harness')).toBeGreaterThan(pOf(plain, 'ignition-harness'));
  });

  it('treats lean on both banks as a shared cause and lean on one bank as local', () => {
    const lean = loadTree('lean');
    const both = priorsFor(lean, evidence({ codes: ['P0171', 'P0174'] }));
    const one = priorsFor(lean, evidence({ codes: ['P0171'] }));
    expect(pOf(both, 'maf-contaminated')).toBeGreaterThan(pOf(one, 'maf-contaminated'));
    expect(pOf(both, 'intake-gasket')).toBeLessThan(pOf(one, 'intake-gasket'));
  });

  it('keeps the global id, the test and the caution with each prior', () => {
    const cam = priorsFor(misfire, evidence()).find((p) => p.causeId === 'cam-timing');
    expect(cam?.cause).toBe('misfire/cam-timing');
    expect(cam?.spec).toMatchObject({ min: -4, max: 4, unit: 'deg' }); // common practice, no source
    expect(cam?.caution).toMatch(/interference engine/);
  });
});

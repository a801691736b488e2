import { describe, expect, it } from 'vitest';
import { markStep, refreshWalk, startWalk, WalkError, walkStateSchema, type Walk, type WalkErrorCode } from '../../../shared/walk';
import { evidence, loadTree, syntheticTree, WORKED_EXAMPLE } from './helpers';

const workedWalk = () => startWalk(syntheticTree(WORKED_EXAMPLE), evidence());
const byId = (walk: Walk) => Object.fromEntries(walk.steps.map((s) => [s.id, s]));

function errorCode(fn: () => unknown): WalkErrorCode | undefined {
  try {
    fn();
  } catch (error) {
    if (error instanceof WalkError) return error.code;
    throw error;
  }
  return undefined;
}

describe('startWalk', () => {
  it('starts with the tree weights as probabilities and recommends the best p/c first', () => {
    // references.md §5 worked check: p = 0.5, 0.3, 0.2; c = 10, 2, 5; order 2, 1, 3.
    const walk = workedWalk();
    expect(walk.steps.map((s) => s.id)).toEqual(['c2', 'c1', 'c3']);
    expect(walk.nextStepId).toBe('c2');
    expect(byId(walk).c1?.probability).toBeCloseTo(0.5, 9);
    expect(walk.expectedMinutes.recommended).toBeCloseTo(10.0, 9); // references.md §5
    expect(walk.expectedMinutes.byLikelihood).toBeCloseTo(12.0, 9); // references.md §5
  });
});

describe('markStep', () => {
  it('renormalises after ruling out cause 2 to 0.714286 and 0.285714', () => {
    // references.md §5: p_j' = p_j / (1 - p_i)
    const walk = markStep(workedWalk(), 'c2', { state: 'ruled_out', note: 'Hose replaced last week, checked by eye.' });
    const steps = byId(walk);
    expect(steps.c1?.probability).toBeCloseTo(0.714286, 6);
    expect(steps.c3?.probability).toBeCloseTo(0.285714, 6);
    expect(steps.c2?.probability).toBe(0);
    expect(walk.steps.map((s) => s.id)).toEqual(['c1', 'c3', 'c2']);
  });

  it('renormalises the same way after a test that finds no fault', () => {
    const walk = markStep(workedWalk(), 'c2', { state: 'tested', outcome: 'no_fault' });
    expect(byId(walk).c1?.probability).toBeCloseTo(0.714286, 6); // references.md §5
    expect(walk.status).toBe('open');
  });

  it('restores the starting probabilities exactly when a step is set back to open', () => {
    const start = workedWalk();
    const afterTwo = markStep(
      markStep(start, 'c2', { state: 'tested', outcome: 'no_fault', note: 'ok' }),
      'c3',
      { state: 'ruled_out', note: 'new part' },
    );
    const reopened = markStep(markStep(afterTwo, 'c3', { state: 'open' }), 'c2', { state: 'open' });
    for (const step of reopened.steps) {
      expect(step.probability).toBe(byId(start)[step.id]?.probability);
      expect(step.state).toBe('open');
      expect(step.note).toBeUndefined();
    }
    expect(reopened.steps.map((s) => s.id)).toEqual(start.steps.map((s) => s.id));
  });

  it('finishes the walk on fault_found and confirms that cause', () => {
    const walk = markStep(workedWalk(), 'c1', { state: 'tested', outcome: 'fault_found' });
    expect(walk.status).toBe('finished');
    expect(walk.confirmedStepId).toBe('c1');
    expect(byId(walk).c1?.probability).toBe(1);
    expect(walk.nextStepId).toBeUndefined();
  });

  it('refuses marks on a finished walk, except reopening the confirmed step', () => {
    const finished = markStep(workedWalk(), 'c1', { state: 'tested', outcome: 'fault_found' });
    expect(errorCode(() => markStep(finished, 'c2', { state: 'tested', outcome: 'no_fault' }))).toBe('walk_finished');
    const reopened = markStep(finished, 'c1', { state: 'open' });
    expect(reopened.status).toBe('open');
    expect(reopened.confirmedStepId).toBeUndefined();
    expect(byId(reopened).c1?.probability).toBeCloseTo(0.5, 9);
  });

  it('rejects bad marks with a stable error code', () => {
    const walk = workedWalk();
    expect(errorCode(() => markStep(walk, 'nope', { state: 'open' }))).toBe('unknown_step');
    expect(errorCode(() => markStep(walk, 'c1', { state: 'tested' }))).toBe('outcome_required');
    expect(errorCode(() => markStep(walk, 'c1', { state: 'ruled_out', outcome: 'no_fault', note: 'x' }))).toBe('outcome_not_allowed');
    expect(errorCode(() => markStep(walk, 'c1', { state: 'open', outcome: 'no_fault' }))).toBe('outcome_not_allowed');
    expect(errorCode(() => markStep(walk, 'c1', { state: 'ruled_out' }))).toBe('reason_required');
    expect(
      errorCode(() => markStep(walk, 'c1', { state: 'ruled_out', note: 'x', measurement: { value: 1, unit: 'V' } })),
    ).toBe('measurement_not_allowed');
  });

  it('does not change the walk it was given', () => {
    const walk = workedWalk();
    const before = JSON.stringify(walk);
    markStep(walk, 'c2', { state: 'tested', outcome: 'fault_found' });
    expect(JSON.stringify(walk)).toBe(before);
  });
});

describe('measurements', () => {
  const pressureTree = syntheticTree([
    { id: 'pressure', weight: 1, minutes: 20, spec: { min: 300, max: 420, unit: 'kPa' } },
    { id: 'other', weight: 1, minutes: 20 },
  ]);

  it('converts a psi reading against a kPa spec and records the verdict', () => {
    // 15 psi = 103.42 kPa (references.md §6, derived from NIST SP 811)
    const walk = markStep(startWalk(pressureTree, evidence()), 'pressure', {
      state: 'tested',
      outcome: 'fault_found',
      measurement: { value: 15, unit: 'psi' },
    });
    const step = byId(walk).pressure;
    expect(step?.measurement).toEqual({ value: 15, unit: 'psi' });
    expect(step?.verdict?.verdict).toBe('out');
    expect(step?.verdict?.valueInSpecUnit).toBeCloseTo(103.42, 2);
  });

  it('rejects a volt reading against a pressure spec as wrong_unit', () => {
    const walk = startWalk(pressureTree, evidence());
    expect(
      errorCode(() => markStep(walk, 'pressure', { state: 'tested', outcome: 'no_fault', measurement: { value: 12, unit: 'V' } })),
    ).toBe('wrong_unit');
  });

  it('keeps a reading without a verdict when the step has no spec', () => {
    const walk = markStep(startWalk(pressureTree, evidence()), 'other', {
      state: 'tested',
      outcome: 'no_fault',
      measurement: { value: 12, unit: 'V' },
    });
    expect(byId(walk).other?.measurement).toEqual({ value: 12, unit: 'V' });
    expect(byId(walk).other?.verdict).toBeUndefined();
  });

  it('finds a cam one tooth off out of spec on the authored cam-crank step', () => {
    // 14 deg one tooth off against a limit of about 4 deg: common practice, no source
    const walk = startWalk(loadTree('cam-crank'), evidence({ codes: ['P0016'], context: ['after-timing-work'] }));
    const marked = markStep(walk, 'timing-one-tooth-off', {
      state: 'tested',
      outcome: 'fault_found',
      measurement: { value: 14, unit: 'deg' },
    });
    expect(byId(marked)['timing-one-tooth-off']?.verdict?.verdict).toBe('out');
  });

  it('finds 14.4 V in spec on the authored charging step', () => {
    // charging voltage about 13.5-14.5 V (references.md §6)
    const walk = startWalk(loadTree('charging'), evidence({ symptoms: ['battery-light'] }));
    const marked = markStep(walk, 'alternator-output', {
      state: 'tested',
      outcome: 'no_fault',
      measurement: { value: 14.4, unit: 'V' },
    });
    expect(byId(marked)['alternator-output']?.verdict?.verdict).toBe('in');
  });
});

describe('walk state', () => {
  it('rebuilds to the same walk with refreshWalk', () => {
    const walk = markStep(workedWalk(), 'c2', { state: 'ruled_out', note: 'new part' });
    expect(refreshWalk(walk)).toEqual(walk);
  });

  it('survives a JSON round trip and validates against the stored-state schema', () => {
    const tree = loadTree('misfire');
    const walk = markStep(startWalk(tree, evidence({ codes: ['P0302'], cylinders: [2] })), 'coil', {
      state: 'tested',
      outcome: 'no_fault',
      note: 'Swapped coil 2 and 3, misfire stayed on 2.',
    });
    const copy = JSON.parse(JSON.stringify(walk)) as unknown;
    expect(copy).toStrictEqual(walk); // no explicit undefined fields that JSON would drop
    const parsed = walkStateSchema.parse(copy);
    const next = markStep(parsed, 'spark-plug', { state: 'tested', outcome: 'fault_found' });
    expect(next.confirmedStepId).toBe('spark-plug');
  });
});

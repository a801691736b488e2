/**
 * Walk state and marks. A walk is a plain JSON-safe object (stored in MariaDB and
 * offline in the browser); every function returns a new walk and never mutates.
 */
import { checkReading, quantityOf, unitLabel, UNITS, UnitError, type Reading, type ReadingCheck } from '../units';
import { WalkError } from './errors';
import type { WalkEvidence } from './evidence';
import { learnFromCases, type ConfirmedCase, type LearnOptions } from './learn';
import { expectedMinutes, orderSteps, type ExpectedMinutes, type StepState } from './order';
import { priorsFor, type CaseRef, type CausePrior, type TestInstructions } from './priors';
import type { System, Tree, TreeSpec } from './tree-schema';

export type StepOutcome = 'fault_found' | 'no_fault';

export interface Step {
  /** The cause id inside the tree; unique within a walk. */
  id: string;
  /** Global cause id `<treeId>/<causeId>`. */
  cause: string;
  title: string;
  about?: string;
  system: System;
  test: TestInstructions;
  spec?: TreeSpec;
  costMinutes: number;
  /** Current probability: the prior renormalised over the steps still open. */
  probability: number;
  /** Probability when the walk started (tree weights, evidence rules, shop cases). Never changes. */
  prior: number;
  state: StepState;
  outcome?: StepOutcome;
  measurement?: Reading;
  verdict?: ReadingCheck;
  note?: string;
  caution?: string;
  evidence: CaseRef[];
  why: string[];
  markOrder?: number;
}

export interface Walk {
  version: 1;
  treeId: string;
  treeTitle: string;
  status: 'open' | 'finished';
  confirmedStepId?: string;
  /** Open steps in recommended order, then the done ones in the order they were marked. */
  steps: Step[];
  nextStepId?: string;
  expectedMinutes: ExpectedMinutes;
  /** Count of marks so far; numbers each step's markOrder. */
  marks: number;
}

export interface StepMark {
  state: StepState;
  outcome?: StepOutcome;
  measurement?: Reading;
  note?: string;
}

function stepFromPrior(p: CausePrior): Step {
  const step: Step = {
    id: p.causeId,
    cause: p.cause,
    title: p.title,
    system: p.system,
    test: p.test,
    costMinutes: p.minutes,
    probability: p.probability,
    prior: p.probability,
    state: 'open',
    evidence: p.evidence,
    why: p.why,
  };
  if (p.about !== undefined) step.about = p.about;
  if (p.spec !== undefined) step.spec = p.spec;
  if (p.caution !== undefined) step.caution = p.caution;
  return step;
}

/**
 * Probabilities from the stored priors, never by undoing earlier arithmetic:
 * open steps share the mass in proportion to their priors (ruling out i gives
 * p_j / (1 - p_i), references.md §5); a confirmed step holds it all.
 */
function withProbabilities(steps: Step[], confirmedStepId: string | undefined): Step[] {
  if (confirmedStepId !== undefined) {
    return steps.map((s) => ({ ...s, probability: s.id === confirmedStepId ? 1 : 0 }));
  }
  const openMass = steps.filter((s) => s.state === 'open').reduce((sum, s) => sum + s.prior, 0);
  return steps.map((s) => ({ ...s, probability: s.state === 'open' && openMass > 0 ? s.prior / openMass : 0 }));
}

function assemble(base: Omit<Walk, 'steps' | 'nextStepId' | 'expectedMinutes'>, steps: Step[]): Walk {
  const ordered = orderSteps(withProbabilities(steps, base.confirmedStepId));
  const walk: Walk = { ...base, steps: ordered, expectedMinutes: expectedMinutes(ordered) };
  const next = base.status === 'open' ? ordered.find((s) => s.state === 'open') : undefined;
  if (next) walk.nextStepId = next.id;
  return walk;
}

export interface StartOptions extends LearnOptions {
  confirmedCases?: ConfirmedCase[];
}

/** A new walk over one tree: priors from the evidence, raised by the shop's confirmed fixes. */
export function startWalk(tree: Tree, ev: WalkEvidence, options: StartOptions = {}): Walk {
  const priors = learnFromCases(priorsFor(tree, ev), options.confirmedCases ?? [], options);
  return assemble(
    { version: 1, treeId: tree.id, treeTitle: tree.title, status: 'open', marks: 0 },
    priors.map(stepFromPrior),
  );
}

/** Rebuild order, probabilities and expected minutes (e.g. after loading a walk saved by an older build). */
export function refreshWalk(walk: Walk): Walk {
  const { steps, nextStepId: _next, expectedMinutes: _minutes, ...base } = walk;
  return assemble(base, steps);
}

function validateMark(walk: Walk, step: Step, mark: StepMark): void {
  const reopeningConfirmed = mark.state === 'open' && step.id === walk.confirmedStepId;
  if (walk.status === 'finished' && !reopeningConfirmed) {
    throw new WalkError('walk_finished', 'this walk is finished: set the confirmed step back to open to carry on');
  }
  if (mark.state === 'tested' && mark.outcome === undefined) {
    throw new WalkError('outcome_required', 'a tested step needs an outcome: fault_found or no_fault');
  }
  if (mark.state !== 'tested' && mark.outcome !== undefined) {
    throw new WalkError('outcome_not_allowed', `an outcome is only given for a tested step, not ${mark.state}`);
  }
  if (mark.state !== 'tested' && mark.measurement !== undefined) {
    throw new WalkError('measurement_not_allowed', 'a measurement is only recorded with a test');
  }
  if (mark.state === 'ruled_out' && !mark.note?.trim()) {
    throw new WalkError('reason_required', 'say why the cause is ruled out without a test');
  }
}

function checkMeasurement(step: Step, measurement: Reading): ReadingCheck | undefined {
  if (!Number.isFinite(measurement.value) || !(UNITS as readonly string[]).includes(measurement.unit)) {
    throw new WalkError('invalid_measurement', 'a measurement needs a finite value and a known unit');
  }
  if (!step.spec) return undefined;
  try {
    return checkReading(measurement, step.spec);
  } catch (error) {
    if (error instanceof UnitError) {
      throw new WalkError(
        'wrong_unit',
        `${error.message}: this step expects ${quantityOf(step.spec.unit)} in ${unitLabel(step.spec.unit)}`,
      );
    }
    throw error;
  }
}

function applyMark(step: Step, mark: StepMark, order: number): Step {
  const { outcome: _o, measurement: _m, verdict: _v, note: _n, markOrder: _k, ...rest } = step;
  if (mark.state === 'open') return { ...rest, state: 'open' };
  const next: Step = { ...rest, state: mark.state, markOrder: order };
  if (mark.outcome !== undefined) next.outcome = mark.outcome;
  if (mark.measurement !== undefined) {
    next.measurement = { value: mark.measurement.value, unit: mark.measurement.unit };
    const verdict = checkMeasurement(step, mark.measurement);
    if (verdict) next.verdict = verdict;
  }
  const note = mark.note?.trim();
  if (note) next.note = note;
  return next;
}

/**
 * Mark one step. `fault_found` finishes the walk with that cause confirmed;
 * `no_fault` and `ruled_out` take the cause out and renormalise the rest;
 * `open` puts a step back (on a finished walk, only the confirmed step may be
 * reopened, which reopens the walk).
 */
export function markStep(walk: Walk, stepId: string, mark: StepMark): Walk {
  const step = walk.steps.find((s) => s.id === stepId);
  if (!step) throw new WalkError('unknown_step', `no step "${stepId}" in this walk`);
  validateMark(walk, step, mark);
  const marks = walk.marks + 1;
  const marked = applyMark(step, mark, marks);
  const steps = walk.steps.map((s) => (s.id === stepId ? marked : s));
  const { steps: _s, nextStepId: _n, expectedMinutes: _e, confirmedStepId: _c, status: _st, ...base } = walk;
  // A finished walk only accepts reopening its confirmed step, so at most this step is confirmed.
  const confirmedStepId = marked.outcome === 'fault_found' ? stepId : undefined;
  return assemble(
    { ...base, marks, status: confirmedStepId ? 'finished' : 'open', ...(confirmedStepId ? { confirmedStepId } : {}) },
    steps,
  );
}

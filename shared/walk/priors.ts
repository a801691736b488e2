import { stepCaution } from './cautions';
import { conditionHolds } from './conditions';
import { misfirePatterns, type MisfirePattern, type WalkEvidence } from './evidence';
import { listCauses, type Scope, type System, type TestStep, type Tree, type TreeSpec } from './tree-schema';

/** What to do, with what, and what a good part shows; the numeric spec sits beside it. */
export type TestInstructions = Omit<TestStep, 'spec'>;

export type CaseId = string | number;
export interface CaseRef {
  caseId: CaseId;
  title: string;
}

export interface CausePrior {
  /** Global id `<treeId>/<causeId>`. */
  cause: string;
  causeId: string;
  title: string;
  about?: string;
  system: System;
  test: TestInstructions;
  spec?: TreeSpec;
  minutes: number;
  caution?: string;
  /** Base weight from the tree. */
  weight: number;
  /** Product of every evidence rule that fired. */
  factor: number;
  /** weight x factor, before normalising. */
  score: number;
  /** score / sum of scores over the applicable causes. */
  probability: number;
  why: string[];
  evidence: CaseRef[];
}

interface ScopeRule {
  factor: number;
  why: string;
}

/**
 * The misfire-pattern rules every cause with a `scope` gets without writing them out.
 * Only the first pattern present, in PATTERN_PRECEDENCE order, is applied.
 */
export const SCOPE_RULES: Record<Scope, Partial<Record<MisfirePattern, ScopeRule>>> = {
  cylinder: {
    'both-banks': { factor: 0.3, why: 'misfires on both banks make a part on one cylinder unlikely' },
    'one-bank': { factor: 0.6, why: 'several cylinders misfire, so one cylinder’s part is less likely' },
    'single-cylinder': { factor: 2.5, why: 'a single misfiring cylinder points to a part on that cylinder' },
    'multi-cylinder': { factor: 0.6, why: 'several cylinders misfire, so one cylinder’s part is less likely' },
  },
  bank: {
    'both-banks': { factor: 0.6, why: 'misfires on both banks point past one bank to a shared cause' },
    'one-bank': { factor: 2, why: 'misfires on one bank only point to something that bank shares' },
    'single-cylinder': { factor: 0.6, why: 'a single misfiring cylinder makes a bank-wide cause less likely' },
  },
  shared: {
    'both-banks': { factor: 2.5, why: 'misfires on both banks point to a shared cause' },
    'one-bank': { factor: 0.7, why: 'misfires on one bank only make a cause every cylinder shares less likely' },
    'single-cylinder': { factor: 0.5, why: 'a single misfiring cylinder makes a cause every cylinder shares less likely' },
    'multi-cylinder': { factor: 1.5, why: 'several misfiring cylinders point to a shared cause' },
  },
};

export const PATTERN_PRECEDENCE: MisfirePattern[] = ['both-banks', 'one-bank', 'single-cylinder', 'multi-cylinder'];

/** Replaces a cylinder part's penalty for a spread misfire when the recent work disturbed that part. */
export const DISTURBED_SCOPE_RULE: ScopeRule = {
  factor: 1,
  why: 'work can cross or loosen this on several cylinders at once, so misfires on more than one cylinder do not make it less likely',
};

function scopeRule(scope: Scope | undefined, patterns: Set<MisfirePattern>, disturbed: boolean): ScopeRule | undefined {
  if (!scope) return undefined;
  const pattern = PATTERN_PRECEDENCE.find((p) => patterns.has(p) && SCOPE_RULES[scope][p]);
  if (!pattern) return undefined;
  const rule = SCOPE_RULES[scope][pattern];
  return disturbed && scope === 'cylinder' && rule && rule.factor < 1 ? DISTURBED_SCOPE_RULE : rule;
}

/**
 * Prior probability of each applicable cause: base weight x every evidence rule
 * that fires (scope rule, then the cause's own modifiers), normalised to sum to 1.
 */
export function priorsFor(tree: Tree, ev: WalkEvidence): CausePrior[] {
  const patterns = misfirePatterns(ev);
  const scored = listCauses(tree)
    .filter((cause) => !cause.appliesWhen || conditionHolds(cause.appliesWhen, ev, 'pass'))
    .map((cause) => {
      const modifiers = cause.modifiers.filter((m) => conditionHolds(m.when, ev, 'fail'));
      const disturbed = modifiers.some((m) => m.disturbedByWork);
      const scope = scopeRule(cause.scope, patterns, disturbed);
      // the work's own reason reads first; the lifted pattern penalty explains itself after it
      const rules = scope === DISTURBED_SCOPE_RULE ? [...modifiers, scope] : [scope, ...modifiers];
      const fired = rules.filter((r): r is ScopeRule => r !== undefined);
      const factor = fired.reduce((f, r) => f * r.factor, 1);
      const prior: CausePrior = {
        cause: cause.globalId,
        causeId: cause.id,
        title: cause.title,
        system: cause.system,
        test: { do: cause.test.do, tools: cause.test.tools, expect: cause.test.expect },
        minutes: cause.minutes,
        weight: cause.weight,
        factor,
        score: cause.weight * factor,
        probability: 0,
        why: fired.map((r) => r.why),
        evidence: [],
      };
      if (cause.about !== undefined) prior.about = cause.about;
      if (cause.test.spec !== undefined) prior.spec = cause.test.spec;
      const caution = stepCaution(cause, ev);
      if (caution) prior.caution = caution;
      return prior;
    });
  const total = scored.reduce((sum, p) => sum + p.score, 0);
  return scored.map((p) => ({ ...p, probability: total > 0 ? p.score / total : 0 }));
}

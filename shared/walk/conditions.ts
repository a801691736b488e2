import {
  anyCodeMatches,
  codeMatches,
  hasContext,
  hasSymptom,
  misfirePatterns,
  platformIs,
  type PlatformKey,
  type WalkEvidence,
} from './evidence';
import type { Condition } from './tree-schema';

/**
 * Whether a condition holds. Every key given must hold; a list inside a key
 * needs any one of its items. Platform keys depend on `unknownPlatform`:
 * an `appliesWhen` keeps a cause when the platform is not known ('pass'),
 * a modifier only fires on what the platform record actually says ('fail').
 */
export function conditionHolds(cond: Condition, ev: WalkEvidence, unknownPlatform: 'pass' | 'fail'): boolean {
  const checks: boolean[] = [];
  if (cond.codes) checks.push(anyCodeMatches(cond.codes, ev.codes));
  if (cond.allCodes) checks.push(cond.allCodes.every((p) => ev.codes.some((code) => codeMatches(p, code))));
  if (cond.symptoms) checks.push(hasSymptom(ev, cond.symptoms));
  if (cond.context) checks.push(hasContext(ev, cond.context));
  if (cond.tags) checks.push(hasSymptom(ev, cond.tags) || hasContext(ev, cond.tags));
  if (cond.misfire) checks.push(misfirePatterns(ev).has(cond.misfire));
  for (const key of ['fuel', 'induction', 'layout'] as const satisfies readonly PlatformKey[]) {
    const allowed = cond[key];
    if (!allowed) continue;
    const is = platformIs(ev, key, allowed);
    checks.push(is ?? unknownPlatform === 'pass');
  }
  return checks.every(Boolean);
}

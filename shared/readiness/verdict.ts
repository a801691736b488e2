// Is the car ready for an emissions inspection? Rule sets are data, chosen per shop.
// Inspection rules are local: every rule here says where it comes from, and every
// verdict carries a note that the local inspection rules decide.
import type { MonitorState, ReadinessReadout } from './monitors';

export interface YearAllowance {
  fromYear: number;
  /** null: and later */
  toYear: number | null;
  /** incomplete non-continuous monitors allowed; null means no limit */
  maxIncomplete: number | null;
}

export interface ReadinessRule {
  id: string;
  name: string;
  summary: string;
  /** where the rule comes from, or that it is common practice */
  source: string;
  milFails: boolean;
  allowances: YearAllowance[];
  /** used when the model year is unknown or outside every allowance */
  fallbackMaxIncomplete: number | null;
}

export const readinessRules = [
  {
    id: 'us-common',
    name: 'Common US practice',
    summary: 'MIL commanded on fails. Model years 2001 and later: at most 1 incomplete non-continuous monitor; 1996-2000: at most 2.',
    source:
      'Common practice in US OBD-II inspection programs, recalled from memory of federal OBD inspection guidance; not checked against any program (common practice, no source).',
    milFails: true,
    allowances: [
      { fromYear: 2001, toYear: null, maxIncomplete: 1 },
      { fromYear: 1996, toYear: 2000, maxIncomplete: 2 },
    ],
    fallbackMaxIncomplete: 1,
  },
  {
    id: 'all-complete',
    name: 'Every monitor complete',
    summary: 'MIL commanded on fails, and every supported non-continuous monitor must be complete, whatever the model year.',
    source: 'A strict shop policy for regions that allow no incomplete monitor, or before handing a car back (common practice, no source).',
    milFails: true,
    allowances: [],
    fallbackMaxIncomplete: 0,
  },
  {
    id: 'mil-only',
    name: 'MIL only',
    summary: 'Only a MIL commanded on fails; incomplete monitors are listed but do not fail.',
    source: 'For regions whose inspection reads the MIL but not the monitors (common practice, no source).',
    milFails: true,
    allowances: [],
    fallbackMaxIncomplete: null,
  },
] as const satisfies readonly ReadinessRule[];

export type ReadinessRuleId = (typeof readinessRules)[number]['id'];
export const readinessRuleIds = readinessRules.map((r) => r.id) as [ReadinessRuleId, ...ReadinessRuleId[]];
export const defaultReadinessRuleId: ReadinessRuleId = 'us-common';

export const REGIONAL_NOTE =
  'Inspection rules are set locally and differ between regions, programs and vehicle types (diesels especially). This verdict follows the shop rule shown; the local inspection rules decide.';

export function readinessRule(id: string): ReadinessRule {
  return readinessRules.find((r) => r.id === id) ?? readinessRules.find((r) => r.id === defaultReadinessRuleId)!;
}

export interface ReadinessVerdict {
  rule: Pick<ReadinessRule, 'id' | 'name' | 'summary' | 'source'>;
  ready: boolean;
  reasons: string[];
  /** the limit applied, null for no limit */
  maxIncomplete: number | null;
  modelYear: number | null;
  note: string;
}

/** Supported monitors that have not run to completion, continuous first. */
export function incompleteMonitors(readout: ReadinessReadout): MonitorState[] {
  return readout.monitors.filter((m) => m.supported && !m.complete);
}

function allowanceFor(rule: ReadinessRule, modelYear: number | null): { max: number | null; why: string } {
  const band = modelYear === null ? undefined : rule.allowances.find((a) => modelYear >= a.fromYear && (a.toYear === null || modelYear <= a.toYear));
  if (band) {
    const years = band.toYear === null ? `model years ${band.fromYear} and later` : `model years ${band.fromYear}-${band.toYear}`;
    return { max: band.maxIncomplete, why: `for ${years}` };
  }
  if (rule.allowances.length > 0 && modelYear === null) return { max: rule.fallbackMaxIncomplete, why: 'as the model year is not known (the strictest band)' };
  if (rule.allowances.length > 0) return { max: rule.fallbackMaxIncomplete, why: `as this rule has no band for model year ${modelYear}` };
  return { max: rule.fallbackMaxIncomplete, why: 'for every model year' };
}

const plural = (n: number, one: string, many: string) => `${n} ${n === 1 ? one : many}`;
const names = (ms: MonitorState[]) => ms.map((m) => m.name).join(', ');

function milReasons(readout: ReadinessReadout, rule: ReadinessRule): { fails: boolean; reasons: string[] } {
  if (readout.mil === true) {
    return { fails: rule.milFails, reasons: ['The MIL is commanded on: find and fix the fault first; clearing codes resets every monitor.'] };
  }
  if (readout.mil === null) return { fails: true, reasons: ['The MIL state is not in this readout: check the lamp is off with the engine running, or read PID $01.'] };
  return { fails: false, reasons: ['The MIL is off.'] };
}

function monitorReasons(readout: ReadinessReadout, rule: ReadinessRule, modelYear: number | null) {
  const incomplete = incompleteMonitors(readout);
  const counted = incomplete.filter((m) => m.kind === 'non-continuous');
  const continuous = incomplete.filter((m) => m.kind === 'continuous');
  const { max, why } = allowanceFor(rule, modelYear);
  const fails = max !== null && counted.length > max;
  const listed = counted.length === 0 ? 'No non-continuous monitor is incomplete' : `${plural(counted.length, 'non-continuous monitor is', 'non-continuous monitors are')} incomplete (${names(counted)})`;
  const limit = max === null ? 'this rule sets no limit' : `this rule allows ${max} ${why}`;
  const reasons = [`${listed}; ${limit}.`];
  if (continuous.length > 0) reasons.push(`Continuous monitors not complete (${names(continuous)}): they are not counted, but usually finish within a short drive.`);
  return { fails, reasons, max };
}

/** Judges a readout under a rule. modelYear null: the rule's fallback limit applies. */
export function judgeReadiness(readout: ReadinessReadout, rule: ReadinessRule, modelYear: number | null): ReadinessVerdict {
  const mil = milReasons(readout, rule);
  const monitors = monitorReasons(readout, rule, modelYear);
  const reasons = [...mil.reasons, ...monitors.reasons];
  if (modelYear !== null && modelYear < 1996) reasons.push(`Model year ${modelYear} is before OBD-II: readiness inspection may not apply; check the local rules.`);
  return {
    rule: { id: rule.id, name: rule.name, summary: rule.summary, source: rule.source },
    ready: !mil.fails && !monitors.fails,
    reasons,
    maxIncomplete: monitors.max,
    modelYear,
    note: REGIONAL_NOTE,
  };
}

/** The whole answer of the decode endpoint and the scan report's readiness part. */
export interface ReadinessAssessment extends ReadinessReadout {
  incomplete: Pick<MonitorState, 'key' | 'name' | 'kind'>[];
  verdict: ReadinessVerdict;
}

export function assessReadiness(readout: ReadinessReadout, rule: ReadinessRule, modelYear: number | null): ReadinessAssessment {
  return {
    ...readout,
    incomplete: incompleteMonitors(readout).map(({ key, name, kind }) => ({ key, name, kind })),
    verdict: judgeReadiness(readout, rule, modelYear),
  };
}

/**
 * The model year a VIN stands for, when only one candidate is plausible for an
 * OBD-II car: from 1996 to next year. Otherwise null (the rule's fallback applies).
 */
export function readinessModelYear(candidates: readonly number[], now = new Date()): number | null {
  const plausible = candidates.filter((y) => y >= 1996 && y <= now.getUTCFullYear() + 1);
  return plausible.length === 1 ? plausible[0]! : null;
}

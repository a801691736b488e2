// Presentation model for readiness panels: labels and tones only, no styling.
import type { MonitorState, ReadinessReadout } from './monitors';
import type { ReadinessAssessment } from './verdict';

export type Tone = 'ok' | 'warn' | 'bad' | 'muted';

export interface MonitorRow {
  key: string;
  name: string;
  stateLabel: 'Complete' | 'Incomplete';
  tone: Tone;
}

export interface MonitorGroup {
  title: string;
  rows: MonitorRow[];
}

export interface ReadinessView {
  headline: string;
  tone: Tone;
  milLabel: string;
  milTone: Tone;
  codesLabel: string | null;
  ignitionLabel: string;
  ruleName: string;
  ruleLine: string;
  /** supported monitors, non-continuous (the ones a rule counts) first, incomplete on top */
  groups: MonitorGroup[];
  /** monitors the car does not report as supported (or a printed table did not list) */
  notSupported: string[];
}

function monitorRow(m: MonitorState): MonitorRow {
  return m.complete ? { key: m.key, name: m.name, stateLabel: 'Complete', tone: 'ok' } : { key: m.key, name: m.name, stateLabel: 'Incomplete', tone: 'warn' };
}

/** Incomplete on top: what the tech acts on comes first. */
function group(title: string, monitors: MonitorState[]): MonitorGroup[] {
  const rows = monitors.map(monitorRow).sort((x, y) => Number(x.stateLabel === 'Complete') - Number(y.stateLabel === 'Complete'));
  return rows.length ? [{ title, rows }] : [];
}

function headline(a: ReadinessAssessment): string {
  if (a.verdict.ready) return a.incomplete.length === 0 ? 'Ready: every supported monitor complete' : `Ready under the shop rule, ${a.incomplete.length} incomplete`;
  if (a.mil === true) return 'Not ready: MIL on';
  if (a.mil === null) return 'Not ready yet: MIL state unknown';
  return `Not ready: ${a.incomplete.length} incomplete`;
}

export function readinessView(a: ReadinessAssessment): ReadinessView {
  const supported = a.monitors.filter((m) => m.supported);
  return {
    headline: headline(a),
    tone: a.verdict.ready ? 'ok' : a.mil === true ? 'bad' : 'warn',
    milLabel: a.mil === null ? 'MIL: not read' : a.mil ? 'MIL: on' : 'MIL: off',
    milTone: a.mil === null ? 'muted' : a.mil ? 'bad' : 'ok',
    codesLabel: a.confirmedCodes === null ? null : `${a.confirmedCodes} confirmed ${a.confirmedCodes === 1 ? 'code' : 'codes'}`,
    ignitionLabel: a.ignition === 'spark' ? 'Spark ignition' : 'Compression ignition',
    ruleName: `Rule: ${a.verdict.rule.name}`,
    ruleLine: a.verdict.rule.summary,
    groups: [
      ...group('Non-continuous monitors (counted by the rule)', supported.filter((m) => m.kind === 'non-continuous')),
      ...group('Continuous monitors', supported.filter((m) => m.kind === 'continuous')),
    ],
    notSupported: a.monitors.filter((m) => !m.supported).map((m) => m.name),
  };
}

export interface SnapshotChange {
  finished: string[];
  stillIncomplete: string[];
  reset: string[];
}

/** What changed between two readouts (before and after a drive cycle), by monitor name. */
export function compareReadouts(before: ReadinessReadout, after: ReadinessReadout): SnapshotChange {
  const was = new Map(before.monitors.map((m) => [m.key, m]));
  const out: SnapshotChange = { finished: [], stillIncomplete: [], reset: [] };
  for (const m of after.monitors.filter((x) => x.supported)) {
    const prev = was.get(m.key);
    if (!prev?.supported) continue;
    if (!prev.complete && m.complete) out.finished.push(m.name);
    else if (!prev.complete && !m.complete) out.stillIncomplete.push(m.name);
    else if (prev.complete && !m.complete) out.reset.push(m.name);
  }
  return out;
}

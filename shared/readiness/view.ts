// Presentation model for readiness panels: labels and tones only, no styling.
import type { MonitorState, ReadinessReadout } from './monitors';
import type { ReadinessAssessment } from './verdict';

export type Tone = 'ok' | 'warn' | 'bad' | 'muted';

export interface MonitorRow {
  key: string;
  name: string;
  kindLabel: string;
  stateLabel: 'Complete' | 'Incomplete' | 'Not supported';
  tone: Tone;
}

export interface ReadinessView {
  headline: string;
  tone: Tone;
  milLabel: string;
  milTone: Tone;
  codesLabel: string | null;
  ignitionLabel: string;
  ruleLine: string;
  rows: MonitorRow[];
}

function monitorRow(m: MonitorState): MonitorRow {
  const kindLabel = m.kind === 'continuous' ? 'continuous' : 'non-continuous';
  if (!m.supported) return { key: m.key, name: m.name, kindLabel, stateLabel: 'Not supported', tone: 'muted' };
  if (m.complete) return { key: m.key, name: m.name, kindLabel, stateLabel: 'Complete', tone: 'ok' };
  return { key: m.key, name: m.name, kindLabel, stateLabel: 'Incomplete', tone: 'warn' };
}

/** Supported monitors first (incomplete on top), unsupported last: what the tech acts on comes first. */
const rank = (r: MonitorRow) => (r.stateLabel === 'Incomplete' ? 0 : r.stateLabel === 'Complete' ? 1 : 2);

function headline(a: ReadinessAssessment): string {
  if (a.verdict.ready) return a.incomplete.length === 0 ? 'Ready: every supported monitor complete' : `Ready under the shop rule, ${a.incomplete.length} incomplete`;
  if (a.mil === true) return 'Not ready: MIL on';
  if (a.mil === null) return 'Not ready yet: MIL state unknown';
  return `Not ready: ${a.incomplete.length} incomplete`;
}

export function readinessView(a: ReadinessAssessment): ReadinessView {
  const rows = a.monitors.map(monitorRow).sort((x, y) => rank(x) - rank(y));
  return {
    headline: headline(a),
    tone: a.verdict.ready ? 'ok' : a.mil === true ? 'bad' : 'warn',
    milLabel: a.mil === null ? 'MIL: not read' : a.mil ? 'MIL: on' : 'MIL: off',
    milTone: a.mil === null ? 'muted' : a.mil ? 'bad' : 'ok',
    codesLabel: a.confirmedCodes === null ? null : `${a.confirmedCodes} confirmed ${a.confirmedCodes === 1 ? 'code' : 'codes'}`,
    ignitionLabel: a.ignition === 'spark' ? 'Spark ignition' : 'Compression ignition',
    ruleLine: `Rule: ${a.verdict.rule.name}. ${a.verdict.rule.summary}`,
    rows,
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

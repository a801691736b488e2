/** Markdown body for a draft case, written from a walk so the tech only has to add the story. */
import { describeSpec, formatReading } from '../units';
import { composeCaution } from './cautions';
import { misfiringCylinders, normaliseCode, type WalkEvidence } from './evidence';
import type { Step, Walk } from './walk';

/** User text goes into list items: keep it on one line and stop it opening raw HTML. */
const inline = (text: string) => text.replace(/\s+/g, ' ').replace(/</g, '&lt;').trim();
const chip = (text: string) => `\`${text.replace(/`/g, '')}\``;

function evidenceLines(ev: WalkEvidence): string[] {
  const lines: string[] = [];
  const codes = [...new Set(ev.codes.map(normaliseCode))];
  lines.push(`- Codes: ${codes.length ? codes.map(chip).join(', ') : 'none stored'}`);
  const cylinders = misfiringCylinders(ev);
  if (cylinders.length) {
    const banks = ev.banks
      ? ` (bank 1: ${ev.banks.bank1.join(', ') || 'none'}; bank 2: ${ev.banks.bank2.join(', ') || 'none'})`
      : '';
    lines.push(`- Misfiring cylinders: ${cylinders.join(', ')}${banks}`);
  }
  lines.push(`- Symptoms: ${ev.symptoms.length ? ev.symptoms.map(inline).join(', ') : 'none recorded'}`);
  if (ev.context.length) lines.push(`- Context: ${ev.context.map(inline).join(', ')}`);
  const p = ev.platform;
  if (p) {
    const parts = [p.fuel, p.induction, p.layout, p.cylinders ? `${p.cylinders} cylinders` : undefined];
    const known = parts.filter((x): x is string => Boolean(x)).map(inline);
    if (known.length) lines.push(`- Platform: ${known.join(', ')}`);
  }
  return lines;
}

function resultOf(step: Step): string {
  if (step.state === 'ruled_out') return 'ruled out without a test';
  return step.outcome === 'fault_found' ? 'tested, fault found' : 'tested, no fault';
}

function stepLine(step: Step, n: number): string {
  const parts = [`${n}. **${inline(step.title)}** (${step.system}): ${resultOf(step)}.`];
  if (step.measurement) {
    const reading = chip(formatReading(step.measurement.value, step.measurement.unit));
    const spec = step.spec ? `, spec ${chip(describeSpec(step.spec))}` : '';
    const verdict = step.verdict ? `: ${step.verdict.verdict === 'in' ? 'in spec' : 'out of spec'}` : '';
    parts.push(`Reading ${reading}${spec}${verdict}.`);
  }
  if (step.note) parts.push(`${step.state === 'ruled_out' ? 'Reason' : 'Note'}: ${inline(step.note)}`);
  return parts.join(' ');
}

export function buildWriteUp(walk: Walk, ev: WalkEvidence): string {
  const done = walk.steps
    .filter((s) => s.state !== 'open')
    .sort((a, b) => (a.markOrder ?? 0) - (b.markOrder ?? 0));
  const confirmed = walk.steps.find((s) => s.id === walk.confirmedStepId);
  const cautions = [...new Set(done.filter((s) => s.state === 'tested').map((s) => composeCaution([s.caution])).filter((c): c is string => !!c).map(inline))];

  const out = [`## Evidence`, '', ...evidenceLines(ev), '', `## Steps done (${inline(walk.treeTitle)})`, ''];
  out.push(...(done.length ? done.map((s, i) => stepLine(s, i + 1)) : ['No steps marked yet.']));
  out.push('', '## Confirmed cause', '');
  out.push(confirmed ? `${inline(confirmed.title)} (${chip(confirmed.cause)})` : 'Not confirmed yet.');
  if (cautions.length) {
    out.push('', '## Cautions that applied', '', ...cautions.map((c) => `- Caution: ${c}`));
  }
  return `${out.join('\n')}\n`;
}

// One cause to test: why it is likely, the test, the spec, the caution, what to record, and the marks.
import { Link, type Href } from 'expo-router';
import { useEffect, useState } from 'react';
import { View } from 'react-native';
import type { StepMarkInput, WalkStep } from '../../shared/schemas/walks';
import { describeSpec, formatReading, quantityOf, unitLabel, UNITS, type Unit } from '../../shared/units';
import { useTheme } from '../theme/use-theme';
import { Badge, Caution } from '../ui/badges';
import { Button } from '../ui/button';
import { Choice } from '../ui/choice';
import { Notice } from '../ui/notice';
import { Card, Row } from '../ui/surfaces';
import { Heading, Text } from '../ui/text';
import { TextField } from '../ui/text-field';
import { minutes, percent, stepStatus, SYSTEM_LABELS } from './labels';
import { Icon } from '../ui/icon';

function unitsLike(unit: Unit): Unit[] {
  return UNITS.filter((u) => quantityOf(u) === quantityOf(unit));
}

const COMMON_UNITS: Unit[] = ['V', 'ohm', 'kPa', 'psi', 'deg', '%', 'ms', 'mm'];

function Section({ title, children }: { title: string; children: React.ReactNode }) {
  const t = useTheme();
  return (
    <View style={{ gap: t.space.xs }}>
      <Text variant="small" weight="semibold" tone="slate">
        {title}
      </Text>
      {children}
    </View>
  );
}

function Likelihood({ step }: { step: WalkStep }) {
  const t = useTheme();
  const why = step.why.length ? step.why : ['the tree’s base weight for this fault'];
  return (
    <View style={{ gap: t.space.xs }}>
      <Text weight="semibold">
        {step.state === 'open' ? `${percent(step.probability)} likely now` : `${percent(step.prior)} likely at the start`} · test about {minutes(step.costMinutes)}
      </Text>
      <Text variant="small" tone="slate">
        Why: {why.join('; ')}.
      </Text>
    </View>
  );
}

function Record({ step, onMark, busy }: { step: WalkStep; onMark: (m: StepMarkInput) => void; busy: boolean }) {
  const t = useTheme();
  const units = step.spec ? unitsLike(step.spec.unit) : COMMON_UNITS;
  const [value, setValue] = useState('');
  const [unit, setUnit] = useState<Unit>(step.spec?.unit ?? 'V');
  const [note, setNote] = useState('');
  const [ruling, setRuling] = useState(false);
  const [problem, setProblem] = useState<string | null>(null);
  useEffect(() => {
    setValue('');
    setNote('');
    setRuling(false);
    setProblem(null);
    setUnit(step.spec?.unit ?? 'V');
  }, [step.id, step.spec?.unit]);

  const reading = (): StepMarkInput['measurement'] | null | undefined => {
    const text = value.trim().replace(',', '.');
    if (!text) return undefined;
    const n = Number(text);
    if (!Number.isFinite(n)) return null;
    return { value: n, unit };
  };
  const tested = (outcome: 'fault_found' | 'no_fault') => {
    const m = reading();
    if (m === null) return setProblem('The reading must be a number, e.g. 14.4 or -3.');
    onMark({ state: 'tested', outcome, ...(m ? { measurement: m } : {}), ...(note.trim() ? { note: note.trim() } : {}) });
  };
  const ruleOut = () => {
    if (!ruling) return setRuling(true);
    if (!note.trim()) return setProblem('Say why you rule it out without a test (for example: part renewed last week).');
    onMark({ state: 'ruled_out', note: note.trim() });
  };

  return (
    <View style={{ gap: t.space.md }}>
      <Heading level={3}>What to record</Heading>
      <Row wrap style={{ alignItems: 'flex-end' }}>
        <View style={{ flexGrow: 1, minWidth: 140 }}>
          <TextField label={`Reading${step.spec ? ` (spec ${describeSpec(step.spec)})` : ''}`} value={value} onChangeText={setValue} inputMode="decimal" placeholder="e.g. 14.4" mono />
        </View>
      </Row>
      <Choice label="Unit" options={units.map((u) => ({ value: u, label: unitLabel(u) }))} value={unit} onChange={setUnit} />
      <TextField label={ruling ? 'Reason for ruling it out (required)' : 'Note (optional)'} value={note} onChangeText={setNote} multiline style={{ minHeight: 72 }} placeholder={ruling ? 'Why it cannot be this cause' : 'What you saw'} />
      {problem ? <Notice tone="error">{problem}</Notice> : null}
      <Row wrap>
        <Button label="Fault found" icon="found" onPress={() => tested('fault_found')} busy={busy} grow />
        <Button label="No fault" icon="check" kind="secondary" onPress={() => tested('no_fault')} disabled={busy} grow />
        <Button label={ruling ? 'Rule out with this reason' : 'Rule out'} icon="ruledOut" kind="quiet" onPress={ruleOut} disabled={busy} />
      </Row>
    </View>
  );
}

function Result({ step }: { step: WalkStep }) {
  const t = useTheme();
  return (
    <View style={{ gap: t.space.xs }}>
      {step.measurement ? (
        <Text>
          Reading: <Text mono>{formatReading(step.measurement.value, step.measurement.unit)}</Text>
          {step.verdict ? ` — ${step.verdict.verdict === 'in' ? 'in spec' : 'OUT of spec'}: ${step.verdict.reason}` : ''}
        </Text>
      ) : null}
      {step.note ? <Text>{step.state === 'ruled_out' ? 'Reason' : 'Note'}: {step.note}</Text> : null}
    </View>
  );
}

export function StepPanel({
  step,
  position,
  readOnly,
  walkFinished,
  onMark,
  busy,
}: {
  step: WalkStep;
  position: string | null;
  readOnly: boolean;
  walkFinished: boolean;
  onMark: (m: StepMarkInput) => void;
  busy: boolean;
}) {
  const t = useTheme();
  const status = stepStatus(step);
  const canReopen = !readOnly && step.state !== 'open' && (!walkFinished || step.outcome === 'fault_found');
  return (
    <Card accessibilityLabel={`Step: ${step.title}`} style={{ gap: t.space.md }}>
      <Row wrap style={{ justifyContent: 'space-between' }}>
        <Text variant="small" tone="slate">
          {position ?? 'Done'} · {SYSTEM_LABELS[step.system]}
        </Text>
        <Badge label={status.label} symbol={status.symbol} tone={status.tone} />
      </Row>
      <Heading level={2}>{step.title}</Heading>
      <Likelihood step={step} />
      {step.about ? <Text>{step.about}</Text> : null}
      {step.caution ? <Caution>{step.caution}</Caution> : null}
      <Section title="The test">
        <Text>{step.test.do}</Text>
      </Section>
      {step.test.tools.length ? (
        <Section title="Tools">
          <Text>{step.test.tools.join(', ')}</Text>
        </Section>
      ) : null}
      <Section title="A good part shows">
        <Text>{step.test.expect}</Text>
      </Section>
      {step.spec ? (
        <Section title="Spec">
          <Text>
            <Text mono weight="semibold">
              {describeSpec(step.spec)}
            </Text>
            {step.spec.text ? ` — ${step.spec.text}` : ''}
          </Text>
        </Section>
      ) : null}
      {step.evidence.length ? (
        <Section title="Confirmed fixes in this shop">
          {step.evidence.map((c) => (
            <Link key={String(c.caseId)} href={`/cases/${c.caseId}` as Href} style={{ color: t.colour.tide, minHeight: t.layout.touchTarget, paddingVertical: t.space.sm }}>
              <Row style={{ gap: t.space.xs }}>
                <Icon name="link" size={14} tone="tide" />
                <Text tone="tide" style={{ flexShrink: 1 }}>{c.title}</Text>
              </Row>
            </Link>
          ))}
        </Section>
      ) : null}
      {step.state !== 'open' ? <Result step={step} /> : null}
      {!readOnly && step.state === 'open' && !walkFinished ? <Record step={step} onMark={onMark} busy={busy} /> : null}
      {canReopen ? <Button label="Reopen" icon="recent" kind="secondary" onPress={() => onMark({ state: 'open' })} disabled={busy} /> : null}
    </Card>
  );
}

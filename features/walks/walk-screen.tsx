// A cause walk: one step at a time on a phone with the ranked list one tap away;
// on a wide screen the tree (systems, causes, probabilities, states) beside the step.
import { useLocalSearchParams, useRouter, type Href } from 'expo-router';
import { useEffect, useRef, useState } from 'react';
import { Pressable, View } from 'react-native';
import type { WalkResponse, WalkStep } from '../../shared/schemas/walks';
import { ApiError } from '../api/client';
import { useSession } from '../auth/use-session';
import { useBreakpoint, useTheme } from '../theme/use-theme';
import { Badge, CodeChip } from '../ui/badges';
import { Button } from '../ui/button';
import { Choice } from '../ui/choice';
import { Notice } from '../ui/notice';
import { EmptyState, ErrorState, Skeleton } from '../ui/states';
import { Card, Row, Screen } from '../ui/surfaces';
import { Heading, Text } from '../ui/text';
import { writeUp } from './api';
import { minutes, percent, stepStatus, SYSTEM_LABELS, tagWords } from './labels';
import { Precedents } from './precedents';
import { StepPanel } from './step-panel';
import { useOfflineWalk } from './use-offline-walk';

function EvidenceLine({ walk }: { walk: WalkResponse }) {
  const t = useTheme();
  const ev = walk.evidence;
  const banks = ev.banks ? (ev.banks.bothBanks ? 'both banks' : ev.banks.bank2.length ? 'bank 2 only' : 'bank 1 only') : null;
  return (
    <View style={{ gap: t.space.xs }}>
      <Row wrap>
        {ev.codes.map((c) => (
          <CodeChip key={c} code={c} />
        ))}
        {ev.cylinders.length ? <Text variant="small">cylinders {ev.cylinders.join(', ')}{banks ? ` (${banks})` : ''}</Text> : null}
      </Row>
      <Text variant="small" tone="slate">
        {[walk.platform ? `${walk.platform.make} ${walk.platform.model} ${walk.platform.engine}` : 'platform not given', ...ev.symptoms.map(tagWords), ...ev.context.map(tagWords)].join(' · ')}
      </Text>
    </View>
  );
}

function Minutes({ walk }: { walk: WalkResponse }) {
  const t = useTheme();
  const open = walk.steps.filter((s) => s.state === 'open').length;
  if (walk.status === 'finished' || open === 0) return null;
  const { recommended, byLikelihood } = walk.expectedMinutes;
  return (
    <Card style={{ gap: t.space.xs, padding: t.space.md }}>
      <Text weight="semibold">Expected time to find it: {minutes(recommended)} in this order</Text>
      <Text variant="small" tone="slate">
        {minutes(byLikelihood)} if you test the most likely cause first regardless of how long each test takes. This order puts quick, likely tests first.
      </Text>
    </Card>
  );
}

function CauseRow({ step, selected, onPress }: { step: WalkStep; selected: boolean; onPress: () => void }) {
  const t = useTheme();
  const status = stepStatus(step);
  return (
    <Pressable
      role="button"
      accessibilityLabel={`${step.title}, ${status.label}${step.state === 'open' ? `, ${percent(step.probability)}` : ''}`}
      onPress={onPress}
      style={{
        minHeight: t.layout.touchTarget,
        paddingVertical: t.space.sm,
        paddingHorizontal: t.space.md,
        borderRadius: t.radius.md,
        borderWidth: 1.5,
        borderColor: selected ? t.colour.tide : 'transparent',
        backgroundColor: selected ? t.colour.sand : 'transparent',
        gap: 2,
      }}
    >
      <Row style={{ justifyContent: 'space-between', alignItems: 'flex-start' }}>
        <Text weight={step.state === 'open' ? 'semibold' : 'regular'} tone={step.state === 'open' ? 'ink' : 'slate'} style={{ flexShrink: 1 }}>
          {status.symbol} {step.title}
        </Text>
        <Text mono weight="semibold" tone={step.state === 'open' ? 'ink' : 'slate'}>
          {step.state === 'open' ? percent(step.probability) : status.label}
        </Text>
      </Row>
      {step.state === 'open' ? (
        <Text variant="caption" tone="slate">
          {minutes(step.costMinutes)} test{step.why[0] ? ` · ${step.why[0]}` : ''}
        </Text>
      ) : null}
    </Pressable>
  );
}

/** Open causes in the recommended order, then the done ones. */
function RankedList({ walk, selectedId, onSelect }: { walk: WalkResponse; selectedId: string | undefined; onSelect: (id: string) => void }) {
  const t = useTheme();
  return (
    <Card style={{ gap: t.space.xs, padding: t.space.md }}>
      <Heading level={3}>All causes, in test order</Heading>
      {walk.steps.map((s, i) => (
        <View key={s.id} style={{ flexDirection: 'row', gap: t.space.xs, alignItems: 'center' }}>
          <Text variant="small" tone="slate" style={{ width: 22 }}>
            {s.state === 'open' ? `${i + 1}.` : ''}
          </Text>
          <View style={{ flex: 1 }}>
            <CauseRow step={s} selected={s.id === selectedId} onPress={() => onSelect(s.id)} />
          </View>
        </View>
      ))}
    </Card>
  );
}

/** The tree: systems with their causes, probabilities and states. */
function TreeView({ walk, selectedId, onSelect }: { walk: WalkResponse; selectedId: string | undefined; onSelect: (id: string) => void }) {
  const t = useTheme();
  const systems = [...new Set(walk.steps.map((s) => s.system))];
  const mass = (sys: string) => walk.steps.filter((s) => s.system === sys).reduce((sum, s) => sum + s.probability, 0);
  return (
    <Card style={{ gap: t.space.md, padding: t.space.md }}>
      <Heading level={3}>{walk.treeTitle}</Heading>
      {systems
        .sort((a, b) => mass(b) - mass(a))
        .map((sys) => (
          <View key={sys} style={{ gap: t.space.xxs }}>
            <Row style={{ justifyContent: 'space-between' }}>
              <Text weight="semibold">{SYSTEM_LABELS[sys]}</Text>
              <Text variant="small" tone="slate">
                {percent(mass(sys))}
              </Text>
            </Row>
            <View style={{ borderLeftWidth: 2, borderColor: t.colour.line, paddingLeft: t.space.sm }}>
              {walk.steps
                .filter((s) => s.system === sys)
                .map((s) => (
                  <CauseRow key={s.id} step={s} selected={s.id === selectedId} onPress={() => onSelect(s.id)} />
                ))}
            </View>
          </View>
        ))}
    </Card>
  );
}

function Finished({ walk, readOnly }: { walk: WalkResponse; readOnly: boolean }) {
  const router = useRouter();
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const confirmed = walk.steps.find((s) => s.id === walk.confirmedStepId);
  const go = async () => {
    setBusy(true);
    setError(null);
    try {
      const { caseId } = await writeUp(walk.id);
      router.push(`/cases/${caseId}/edit` as Href);
    } catch (err) {
      setError(err instanceof ApiError ? err.message : 'Could not write it up.');
      setBusy(false);
    }
  };
  return (
    <Card>
      <Notice tone="success">{`Fault found: ${confirmed?.title ?? 'cause confirmed'}.`}</Notice>
      <Text>Write it up so the next tech finds it: a draft case with the codes, the steps you did with their readings and the confirmed cause. You add the story and the fix.</Text>
      {error ? <Notice tone="error">{error}</Notice> : null}
      {readOnly ? null : walk.caseId ? (
        <Button label="Open the write-up" icon="edit" onPress={() => router.push(`/cases/${walk.caseId}/edit` as Href)} />
      ) : (
        <Button label="Write up" icon="edit" onPress={go} busy={busy} />
      )}
    </Card>
  );
}

/** After a mark or a pick the next step starts at the top, not where the buttons were. */
function ScrollBack({ target, moved, stepKey }: { target: React.RefObject<View | null>; moved: React.RefObject<boolean>; stepKey: string }) {
  useEffect(() => {
    if (!moved.current) return;
    moved.current = false;
    // On the web a View is a DOM element.
    (target.current as unknown as { scrollIntoView?: (o: object) => void } | null)?.scrollIntoView?.({ block: 'start' });
  }, [stepKey, target, moved]);
  return null;
}

function WalkBody({ id }: { id: number }) {
  const t = useTheme();
  const { isWide } = useBreakpoint();
  const { user } = useSession();
  const w = useOfflineWalk(id);
  const [selected, setSelected] = useState<string | undefined>(undefined);
  const [view, setView] = useState<'step' | 'list'>('step');
  const top = useRef<View>(null);
  const moved = useRef(false);
  if (w.error) return <ErrorState error={w.error} onRetry={w.retry} />;
  const walk = w.walk;
  if (!walk) return <Skeleton lines={4} label="Loading the walk" />;
  const readOnly = user ? walk.owner.id !== user.id : true;
  const finished = walk.status === 'finished';
  const fallbackId = finished ? walk.confirmedStepId : walk.nextStepId;
  const step = walk.steps.find((s) => s.id === selected) ?? walk.steps.find((s) => s.id === fallbackId) ?? walk.steps[0];
  const openSteps = walk.steps.filter((s) => s.state === 'open');
  const index = step ? openSteps.findIndex((s) => s.id === step.id) : -1;
  const position = index >= 0 ? `Step ${index + 1} of ${openSteps.length} open` : null;
  const select = (sid: string) => {
    moved.current = true;
    setSelected(sid);
    setView('step');
  };
  const onMark = (m: Parameters<typeof w.mark>[1]) => {
    if (!step) return;
    moved.current = true;
    w.mark(step.id, m);
    setSelected(undefined);
  };

  const header = (
    <View style={{ gap: t.space.sm }}>
      <Row wrap style={{ justifyContent: 'space-between' }}>
        <Heading>{walk.treeTitle}</Heading>
        <Badge label={finished ? 'Finished' : 'Open'} symbol={finished ? 'found' : 'open'} tone={finished ? 'moss' : 'tide'} />
      </Row>
      <EvidenceLine walk={walk} />
      <Precedents precedents={walk.precedents} />
      {readOnly ? <Notice tone="info">{`You are looking over ${walk.owner.name}'s walk. Only they can mark its steps.`}</Notice> : null}
      {finished ? null : <Minutes walk={walk} />}
    </View>
  );
  const panel = step ? (
    <View ref={top} style={{ gap: t.space.md }}>
      <ScrollBack target={top} moved={moved} stepKey={`${step.id}:${walk.marks}:${view}`} />
      {w.banner ? <Notice tone="info">{w.banner}</Notice> : null}
      {w.refused.map((msg, i) => (
        <Notice key={i} tone="error">{`A mark made offline was not accepted: ${msg}`}</Notice>
      ))}
      {finished ? <Finished walk={walk} readOnly={readOnly} /> : null}
      <StepPanel step={step} position={position} readOnly={readOnly} walkFinished={finished} onMark={onMark} busy={false} />
    </View>
  ) : (
    <EmptyState title="No causes left" hint="Every cause in this tree has been tested or ruled out. Reopen one, or start a new walk with more evidence." />
  );

  if (isWide) {
    return (
      <>
        {header}
        <View style={{ flexDirection: 'row', gap: t.space.lg, alignItems: 'flex-start' }}>
          <View style={{ flex: 2, minWidth: 0 }}>
            <TreeView walk={walk} selectedId={step?.id} onSelect={select} />
          </View>
          <View style={{ flex: 3, minWidth: 0 }}>{panel}</View>
        </View>
      </>
    );
  }
  return (
    <>
      {header}
      <Choice
        label="Show"
        options={[
          { value: 'step', label: finished ? 'Confirmed cause' : 'This step' },
          { value: 'list', label: `All causes (${walk.steps.length})` },
        ]}
        value={view}
        onChange={setView}
      />
      {view === 'list' ? <RankedList walk={walk} selectedId={step?.id} onSelect={select} /> : panel}
    </>
  );
}

export function WalkScreen() {
  const params = useLocalSearchParams<{ id: string }>();
  const id = Number(params.id);
  return <Screen>{Number.isInteger(id) && id > 0 ? <WalkBody id={id} /> : <EmptyState title="No such walk" hint="The link is not a walk. Open one from the Walks list." />}</Screen>;
}

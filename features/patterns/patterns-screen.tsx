// The shop-patterns dashboard (senior and manager): figures, charts with their tables, comebacks,
// repeat faults, the review queue, CSV per table and, for managers, "Send digest now".
import type { Href } from 'expo-router';
import { useState, type ReactNode } from 'react';
import { View } from 'react-native';
import { z } from 'zod';
import { allows } from '../../shared/policy';
import { defaultPeriod } from '../../shared/patterns';
import { shopToday } from '../shell/shop-clock';
import type { CsvTable, PatternsResponse } from '../../shared/schemas/patterns';
import { ApiError } from '../api/client';
import { useSession } from '../auth/use-session';
import { useBreakpoint, useTheme } from '../theme/use-theme';
import { Badge, CodeChip } from '../ui/badges';
import { Button } from '../ui/button';
import { Choice } from '../ui/choice';
import { Notice } from '../ui/notice';
import { Sheet } from '../ui/sheet';
import { EmptyState, Loaded } from '../ui/states';
import { Card, Row, Screen } from '../ui/surfaces';
import { Heading, Text } from '../ui/text';
import { LinkText } from '../ui/link-text';
import { TextField } from '../ui/text-field';
import { downloadCsv, sendDigestNow, usePatterns, type PeriodQuery } from './api';
import { BarsChart, TrendChart } from './charts';
import { DataTable } from './data-table';
import { longDay, percent, plural, shortDay } from './format';

type Preset = '30' | '90' | '365' | 'custom';
const presets = [
  { value: '30', label: 'Last 30 days' },
  { value: '90', label: 'Last 90 days' },
  { value: '365', label: 'Last 365 days' },
  { value: 'custom', label: 'Custom' },
] as const;

const daySchema = z.iso.date({ error: 'Write the date as YYYY-MM-DD.' });
const engineOf = (label: string) => label.split(' ').at(-1) ?? label;

/** The period being chosen: a preset, or custom dates checked before they apply. Kept by the screen so the sheet can close. */
function usePeriodChoice() {
  const today = shopToday();
  const [period, setPeriod] = useState(() => defaultPeriod(today));
  const [preset, setPreset] = useState<Preset>('90');
  const [from, setFrom] = useState(defaultPeriod(today).from);
  const [to, setTo] = useState(today);
  const [errors, setErrors] = useState<{ from?: string; to?: string }>({});
  const pick = (p: Preset) => {
    setPreset(p);
    if (p !== 'custom') setPeriod(defaultPeriod(today, Number(p)));
  };
  const apply = () => {
    const f = daySchema.safeParse(from);
    const tt = daySchema.safeParse(to);
    const next = { from: f.success ? undefined : f.error.issues[0]?.message, to: tt.success ? undefined : tt.error.issues[0]?.message };
    if (!next.from && !next.to && from > to) next.from = 'The start is after the end.';
    setErrors(next);
    if (!next.from && !next.to) setPeriod({ from, to });
  };
  const label = preset === 'custom' ? 'Custom period' : (presets.find((x) => x.value === preset)?.label ?? '');
  return { period, preset, label, pick, from, setFrom, to, setTo, errors, apply };
}
type PeriodChoice = ReturnType<typeof usePeriodChoice>;

function PeriodChooser({ choice }: { choice: PeriodChoice }) {
  const t = useTheme();
  return (
    <View style={{ gap: t.space.sm }}>
      <Choice label="Period" options={presets} value={choice.preset} onChange={choice.pick} />
      {choice.preset === 'custom' ? (
        <Row wrap style={{ alignItems: 'flex-end' }}>
          <View style={{ flexGrow: 1, minWidth: 140 }}>
            <TextField label="From" value={choice.from} onChangeText={choice.setFrom} error={choice.errors.from} inputMode="numeric" mono />
          </View>
          <View style={{ flexGrow: 1, minWidth: 140 }}>
            <TextField label="To" value={choice.to} onChangeText={choice.setTo} error={choice.errors.to} inputMode="numeric" mono />
          </View>
          <Button label="Show period" kind="secondary" onPress={choice.apply} />
        </Row>
      ) : null}
    </View>
  );
}

function Figure({ value, title, words }: { value: string; title: string; words: string }) {
  const t = useTheme();
  return (
    <Card style={{ flexGrow: 1, flexBasis: 160, minWidth: 150, gap: t.space.xs }}>
      <Text variant="small" weight="semibold" tone="slate">
        {title}
      </Text>
      <Text serif weight="bold" style={{ fontSize: 40, lineHeight: 46 }}>
        {value}
      </Text>
      <Text variant="small">{words}</Text>
    </Card>
  );
}

function Figures({ data }: { data: PatternsResponse }) {
  const { cases, confirmed, comebacks } = data.totals;
  const median = data.medianDaysToConfirm;
  return (
    <Row wrap style={{ alignItems: 'stretch' }}>
      <Figure title="Confirmed-fix rate" value={percent(data.confirmedRate)} words={cases ? `${confirmed} of ${plural(cases, 'case')} had the fix confirmed.` : 'No cases in this period.'} />
      <Figure title="Comeback rate" value={percent(data.comebackRate)} words={cases ? `${comebacks} of ${plural(cases, 'case')} came back after a confirmed fix.` : 'No cases in this period.'} />
      <Figure
        title="Median days to confirmed fix"
        value={median === null ? '–' : String(Math.round(median * 10) / 10)}
        words={median === null ? 'No confirmed fixes in this period.' : `${median === 1 ? 'day' : 'days'} from the visit to the confirmation.`}
      />
      <Figure title="Waiting for review" value={String(data.waitingForReview.length)} words={data.waitingForReview.length === 1 ? 'case sent for review.' : 'cases sent for review.'} />
    </Row>
  );
}

/** A chart and its table: side by side on a wide screen, stacked on a phone; CSV under the table. */
function Section({ title, hint, chart, table, csv, query }: { title: string; hint?: string; chart?: ReactNode; table: ReactNode; csv?: CsvTable; query: PeriodQuery }) {
  const t = useTheme();
  const { isWide } = useBreakpoint();
  return (
    <Card>
      <Heading level={2}>{title}</Heading>
      {hint ? <Text tone="slate" variant="small">{hint}</Text> : null}
      <View style={{ flexDirection: isWide && chart ? 'row' : 'column', gap: t.space.lg, alignItems: 'flex-start' }}>
        {chart ? <View style={{ flex: isWide ? 1 : undefined, width: isWide ? undefined : '100%', minWidth: 0 }}>{chart}</View> : null}
        <View style={{ flex: isWide && chart ? 1 : undefined, width: isWide && chart ? undefined : '100%', minWidth: 0, gap: t.space.sm }}>
          {table}
          {csv ? <Button compact kind="secondary" icon="download" label={`Download CSV: ${title}`} onPress={() => downloadCsv(csv, query)} /> : null}
        </View>
      </View>
    </Card>
  );
}

const caseHref = (id: number) => `/cases/${id}` as Href;
const vehicleHref = (id: number) => `/vehicles/${id}` as Href;

function Comebacks({ data }: { data: PatternsResponse }) {
  const t = useTheme();
  if (data.comebacks.length === 0) return <Text tone="slate">No comebacks in this period: every confirmed fix held.</Text>;
  return (
    <View style={{ gap: t.space.md }}>
      {data.comebacks.map((c) => (
        <View key={c.repeatCaseId} style={{ gap: t.space.xs, paddingBottom: t.space.md, borderBottomWidth: 1, borderColor: t.colour.line }}>
          <Row wrap>
            <Badge label="Comeback" symbol="comeback" tone="brick" />
            {c.code ? <CodeChip code={c.code} /> : null}
            <Text variant="small" tone="slate">
              back after {plural(c.days, 'day')}
              {c.km !== null ? `, ${Math.round(c.km).toLocaleString('en-GB')} km` : ''} · {c.reason}
            </Text>
          </Row>
          <Row wrap>
            <Text variant="small">Vehicle:</Text>
            <LinkText href={vehicleHref(c.vehicle.id)}>{c.vehicle.plate ? `${c.vehicle.plate} (${c.vehicle.vin})` : c.vehicle.vin}</LinkText>
          </Row>
          <Text variant="small">
            First fix: <LinkText href={caseHref(c.firstCaseId)}>{c.firstTitle}</LinkText>
          </Text>
          <Text variant="small">
            Came back as: <LinkText href={caseHref(c.repeatCaseId)}>{c.repeatTitle}</LinkText> ({longDay(c.repeatDay)})
          </Text>
        </View>
      ))}
    </View>
  );
}

function Dashboard({ data, query }: { data: PatternsResponse; query: PeriodQuery }) {
  const t = useTheme();
  const { isPhone } = useBreakpoint();
  const codeBars = data.topCodes.slice(0, isPhone ? 6 : 10).map((c) => ({ label: c.code, value: c.count, display: String(c.count) }));
  // A phone has room for six legible bars; the table beside lists every platform.
  const platformBars = [...data.byPlatform]
    .filter((p) => p.platformId !== null)
    .sort((a, b) => (b.comebackRate ?? 0) - (a.comebackRate ?? 0) || b.cases - a.cases)
    .slice(0, isPhone ? 6 : 12)
    .map((p) => ({ label: engineOf(p.label), value: Math.round((p.comebackRate ?? 0) * 1000) / 10, display: percent(p.comebackRate) }));
  const weeks = data.trend.map((w) => ({ label: shortDay(w.week), cases: w.cases, comebacks: w.comebacks }));
  return (
    <>
      <Figures data={data} />
      {data.totals.cases === 0 ? <EmptyState title="No cases in this period" hint="Choose a longer period or another platform. Drafts do not count until they are sent for review." /> : null}
      <Section
        title="Top trouble codes"
        hint="Cases carrying each code (a case counts once per code)."
        query={query}
        csv="topCodes"
        chart={codeBars.length ? <BarsChart bars={codeBars} label={`Bar chart of top codes: ${codeBars.map((b) => `${b.label} ${b.display}`).join(', ')}`} /> : undefined}
        table={
          <DataTable
            label="Top trouble codes"
            empty="No trouble codes in this period."
            columns={[{ label: 'Code', flex: 1 }, { label: 'Title', flex: 3 }, { label: 'Cases', flex: 1, numeric: true }]}
            rows={data.topCodes.map((c) => [<CodeChip key="c" code={c.code} />, c.title || '(no generic title)', c.count])}
          />
        }
      />
      <Section
        title="Comeback rate by platform"
        hint={`Return visits after a confirmed fix, out of the platform's cases in the period.${isPhone && data.byPlatform.length > 6 ? ' The chart shows the six highest; the table lists all.' : ''}`}
        query={query}
        csv="byPlatform"
        chart={platformBars.length ? <BarsChart bars={platformBars} suffix="%" floor={10} label={`Bar chart of comeback rate by platform: ${platformBars.map((b) => `${b.label} ${b.display}`).join(', ')}`} /> : undefined}
        table={
          <DataTable
            label="Platforms"
            empty="No cases in this period."
            columns={[{ label: 'Platform', flex: 3 }, { label: 'Cases', numeric: true }, { label: 'Come-backs', numeric: true }, { label: 'Rate', numeric: true }, { label: 'Fix confirmed', numeric: true }]}
            rows={data.byPlatform.map((p) => [p.label, p.cases, p.comebacks, percent(p.comebackRate), percent(p.confirmedRate)])}
          />
        }
      />
      <Card>
        <Heading level={2}>Cases and comebacks per week</Heading>
        <Text tone="slate" variant="small">
          Weeks start on Monday; a comeback counts in the week of the return visit.
        </Text>
        <TrendChart points={weeks} label={`Line chart per week: ${weeks.filter((w) => w.cases).map((w) => `${w.label} ${w.cases} cases, ${w.comebacks} comebacks`).join('; ') || 'no cases'}`} />
      </Card>
      <Section title="Comebacks" hint={`The same vehicle back with the same code or system within ${data.window.days} days and ${data.window.km.toLocaleString('en-GB')} km of a confirmed fix.`} query={query} csv="comebacks" table={<Comebacks data={data} />} />
      <Section
        title="Which fixes held"
        hint="Confirmed fixes in the period by root cause, and how many came back since."
        query={query}
        csv="byRootCause"
        table={
          <DataTable
            label="Root causes"
            empty="No confirmed fixes in this period."
            columns={[{ label: 'Root cause', flex: 4 }, { label: 'Fixes', numeric: true }, { label: 'Came back', numeric: true }, { label: 'Rate', numeric: true }]}
            rows={data.byRootCause.slice(0, 12).map((r) => [r.label, r.fixes, r.cameBack, percent(r.comebackRate)])}
          />
        }
      />
      <Section
        title="Top symptoms"
        query={query}
        csv="topSymptoms"
        table={<DataTable label="Top symptoms" empty="No symptoms in this period." columns={[{ label: 'Symptom', flex: 3 }, { label: 'Cases', numeric: true }]} rows={data.topSymptoms.map((s) => [s.tag, s.count])} />}
      />
      <Card>
        <Heading level={2}>Repeat faults across vehicles</Heading>
        <Text tone="slate" variant="small">
          The same root cause on the same platform on different vehicles.
        </Text>
        {data.repeatPatterns.length === 0 ? (
          <Text tone="slate">No root cause has turned up on two vehicles of one platform.</Text>
        ) : (
          data.repeatPatterns.map((p) => (
            <View key={`${p.platformId}-${p.causeKey}`} style={{ gap: t.space.xs, paddingBottom: t.space.sm, borderBottomWidth: 1, borderColor: t.colour.line }}>
              <Row wrap>
                <Badge label={`${plural(p.vehicles, 'vehicle')}`} symbol="code" tone="amber" />
                <Text weight="semibold">{p.platform}</Text>
              </Row>
              <Text variant="small">{p.causeLabel}</Text>
              {p.cases.map((c) => (
                <Text key={c.id} variant="small">
                  {longDay(c.day)} · <LinkText href={caseHref(c.id)}>{c.title}</LinkText>
                </Text>
              ))}
            </View>
          ))
        )}
      </Card>
      <Card>
        <Heading level={2}>Waiting for review</Heading>
        {data.waitingForReview.length === 0 ? (
          <Text tone="slate">Nothing is waiting for review.</Text>
        ) : (
          data.waitingForReview.map((w) => (
            <Text key={w.id} variant="small">
              <LinkText href={caseHref(w.id)}>{w.title}</LinkText> · {w.author}, sent {longDay(w.submittedAt.slice(0, 10))}
            </Text>
          ))
        )}
      </Card>
    </>
  );
}

function DigestButton() {
  const [state, setState] = useState<{ busy: boolean; message: { tone: 'success' | 'error'; text: string } | null }>({ busy: false, message: null });
  const send = async () => {
    setState({ busy: true, message: null });
    try {
      const { sent } = await sendDigestNow();
      setState({ busy: false, message: { tone: 'success', text: sent ? `Digest sent to ${plural(sent, 'manager')}. It is in the Outbox.` : 'No active manager to send it to.' } });
    } catch (err) {
      setState({ busy: false, message: { tone: 'error', text: err instanceof ApiError ? err.message : 'Could not send the digest.' } });
    }
  };
  return (
    <View style={{ gap: 8, alignItems: 'flex-start' }}>
      <Button label="Send digest now" icon="mail" kind="secondary" busy={state.busy} onPress={send} />
      {state.message ? <Notice tone={state.message.tone}>{state.message.text}</Notice> : null}
    </View>
  );
}

function PlatformChooser({ platforms, value, onChange }: { platforms: PatternsResponse['platforms'] | undefined; value: string; onChange: (v: string) => void }) {
  if (!platforms?.length) return null;
  return <Choice label="Platform" options={[{ value: 'all', label: 'All platforms' }, ...platforms.map((p) => ({ value: String(p.id), label: p.label }))]} value={value} onChange={onChange} />;
}

export function PatternsScreen() {
  const t = useTheme();
  const { user } = useSession();
  const { isWide } = useBreakpoint();
  const choice = usePeriodChoice();
  const { period } = choice;
  const [platformId, setPlatformId] = useState<string>('all');
  const [sheet, setSheet] = useState(false);
  const query: PeriodQuery = { ...period, platformId: platformId === 'all' ? null : Number(platformId) };
  const { data, error, mutate } = usePatterns(user ? query : null);
  const platformLabel = platformId === 'all' ? 'All platforms' : (data?.platforms.find((p) => String(p.id) === platformId)?.label ?? 'One platform');
  const range = (
    <Text variant="small" tone="slate">
      {longDay(period.from)} to {longDay(period.to)}, both days included.
    </Text>
  );
  // A phone shows the figures first: the period and platform sit behind one button.
  const filters = isWide ? (
    <Card style={{ gap: t.space.md }}>
      <PeriodChooser choice={choice} />
      <PlatformChooser platforms={data?.platforms} value={platformId} onChange={setPlatformId} />
      {range}
    </Card>
  ) : (
    <View style={{ gap: t.space.xs }}>
      <Row wrap style={{ justifyContent: 'space-between' }}>
        <Text weight="semibold" style={{ flexShrink: 1 }}>
          {choice.label} · {platformLabel}
        </Text>
        <Button label="Change" kind="secondary" compact icon="filter" onPress={() => setSheet(true)} />
      </Row>
      {range}
      <Sheet open={sheet} title="Period and platform" onClose={() => setSheet(false)} footer={<Button label="Show figures" onPress={() => setSheet(false)} />}>
        <PeriodChooser choice={choice} />
        <PlatformChooser platforms={data?.platforms} value={platformId} onChange={setPlatformId} />
      </Sheet>
    </View>
  );
  return (
    <Screen>
      <Heading>Shop patterns</Heading>
      <Text tone="slate">Which faults come back, on which platforms, which fixes hold, and what waits for review. Drafts do not count.</Text>
      {user && allows(user, 'digest.send') ? <DigestButton /> : null}
      {filters}
      <Loaded data={data} error={error} retry={() => void mutate()} lines={4}>
        {(d) => <Dashboard data={d} query={query} />}
      </Loaded>
    </Screen>
  );
}

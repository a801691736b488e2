// The start of the day, under the search field: what waits for me, by role. Each panel
// lists at most a few items with the total, links to each, and says what to do when empty.
import { Link, type Href } from 'expo-router';
import type { ReactNode } from 'react';
import { View } from 'react-native';
import type { HomeResponse } from '../../shared/schemas/home';
import { useBreakpoint, useTheme } from '../theme/use-theme';
import { CodeChip } from '../ui/badges';
import { ErrorState, Skeleton } from '../ui/states';
import { Card, Row } from '../ui/surfaces';
import { Heading, Text } from '../ui/text';
import { shortDate } from '../walks/labels';
import { useHome } from './api';

interface PanelProps<T> {
  title: string;
  list: { total: number; items: T[] };
  empty: string;
  all: { href: Href; label: string };
  children: (item: T) => ReactNode;
}

/** Side by side on a wide screen (wrapping at 320 px); stacked at their own height on a phone. */
function usePanelStyle() {
  const t = useTheme();
  const { isWide } = useBreakpoint();
  return { gap: t.space.sm, ...(isWide ? { flexBasis: 320, flexGrow: 1 } : {}) };
}

function Panel<T>({ title, list, empty, all, children }: PanelProps<T>) {
  const t = useTheme();
  const panelStyle = usePanelStyle();
  const more = list.total > list.items.length;
  return (
    <Card style={panelStyle} accessibilityLabel={title}>
      <Row style={{ justifyContent: 'space-between' }}>
        <Heading level={3}>{title}</Heading>
        <Text variant="small" tone="slate">
          {list.total}
        </Text>
      </Row>
      {list.items.length === 0 ? <Text tone="slate">{empty}</Text> : <View style={{ gap: t.space.xs }}>{list.items.map(children)}</View>}
      {list.total > 0 ? (
        <Link href={all.href} style={{ color: t.colour.tide, minHeight: t.layout.touchTarget, paddingVertical: t.space.sm }}>
          {more ? `${all.label} (${list.total})` : all.label}
        </Link>
      ) : null}
    </Card>
  );
}

function ItemLink({ href, title, detail, children }: { href: Href; title: string; detail: string; children?: ReactNode }) {
  const t = useTheme();
  return (
    <Link href={href} style={{ minHeight: t.layout.touchTarget, paddingVertical: t.space.xs }}>
      <View style={{ gap: 2 }}>
        <Text weight="semibold" tone="tide">
          {title}
        </Text>
        {children}
        <Text variant="caption" tone="slate">
          {detail}
        </Text>
      </View>
    </Link>
  );
}

const caseHref = (id: number) => `/cases/${id}` as Href;

function TechnicianPanels({ home }: { home: HomeResponse }) {
  return (
    <>
      <Panel title="Sent back to you" list={home.returned} empty="Nothing sent back: no reviewer is waiting on you." all={{ href: '/cases?status=draft&mine=1' as Href, label: 'All my drafts' }}>
        {(c) => (
          <ItemLink key={c.id} href={`/cases/${c.id}/edit` as Href} title={c.title} detail={`Returned by ${c.returnedBy} · ${shortDate(c.updatedAt)}`}>
            <Text variant="small">“{c.comment}”</Text>
          </ItemLink>
        )}
      </Panel>
      <Panel title="My open walks" list={home.openWalks} empty="No walk open. Type the codes of the car in front of you above, then start a walk from a result." all={{ href: '/walks' as Href, label: 'All walks' }}>
        {(w) => (
          <ItemLink key={w.id} href={`/walks/${w.id}` as Href} title={w.treeTitle} detail={`${w.platform ?? 'Platform not given'} · ${w.nextStep ? `next: ${w.nextStep}` : 'no causes left open'}`}>
            {w.codes.length ? (
              <Row wrap>
                {w.codes.slice(0, 4).map((c) => (
                  <CodeChip key={c} code={c} />
                ))}
              </Row>
            ) : null}
          </ItemLink>
        )}
      </Panel>
      <Panel title="My drafts" list={home.drafts} empty="No drafts. Write up what you found while it is fresh: Cases, then New case." all={{ href: '/cases?status=draft&mine=1' as Href, label: 'All my drafts' }}>
        {(c) => <ItemLink key={c.id} href={caseHref(c.id)} title={c.title} detail={`Edited ${shortDate(c.updatedAt)}`} />}
      </Panel>
    </>
  );
}

function ReviewPanel({ review }: { review: NonNullable<HomeResponse['review']> }) {
  return (
    <Panel title="Waiting for your review" list={review} empty="No case waits for review." all={{ href: '/cases?status=review' as Href, label: 'All waiting' }}>
      {(c) => <ItemLink key={c.id} href={caseHref(c.id)} title={c.title} detail={`${c.author} · sent ${shortDate(c.submittedAt)}`} />}
    </Panel>
  );
}

function ManagerPanels({ comebacks, digest }: { comebacks: NonNullable<HomeResponse['comebacks']>; digest: NonNullable<HomeResponse['digest']> }) {
  const t = useTheme();
  const panelStyle = usePanelStyle();
  return (
    <>
      <Panel title="Comebacks this week" list={comebacks} empty={`No car came back between ${shortDate(comebacks.from)} and ${shortDate(comebacks.to)}.`} all={{ href: '/patterns' as Href, label: 'Patterns' }}>
        {(c) => (
          <ItemLink key={c.repeatCaseId} href={caseHref(c.repeatCaseId)} title={c.repeatTitle} detail={`${c.vehicle.plate ?? c.vehicle.vin} · ${c.days} days after “${c.firstTitle}” · ${c.reason}`} />
        )}
      </Panel>
      <Card style={panelStyle} accessibilityLabel="Weekly digest">
        <Heading level={3}>Weekly digest</Heading>
        <Text>{digest.lastSentAt ? `Last sent ${shortDate(digest.lastSentAt)} (${digest.lastKind === 'manual' ? 'by hand' : 'on schedule'}) to ${digest.recipients ?? 0} people.` : 'Not sent yet.'}</Text>
        <Text variant="small" tone="slate">
          {digest.nextRunAt ? `Next on ${shortDate(digest.nextRunAt)}.` : 'No schedule set.'}
        </Text>
        <Link href={'/patterns' as Href} style={{ color: t.colour.tide, minHeight: t.layout.touchTarget, paddingVertical: t.space.sm }}>
          Open patterns to send it now
        </Link>
      </Card>
    </>
  );
}

export function HomePanels() {
  const t = useTheme();
  const { isWide } = useBreakpoint();
  const { data, error, mutate } = useHome();
  if (error) return <ErrorState error={error} onRetry={() => void mutate()} />;
  if (!data) return <Skeleton lines={3} label="Loading what waits for you" />;
  return (
    <View accessibilityLabel="Waiting for you" style={{ gap: t.space.md, flexDirection: isWide ? 'row' : 'column', flexWrap: 'wrap' }}>
      {data.review ? <ReviewPanel review={data.review} /> : null}
      {data.comebacks && data.digest ? <ManagerPanels comebacks={data.comebacks} digest={data.digest} /> : null}
      <TechnicianPanels home={data} />
    </View>
  );
}

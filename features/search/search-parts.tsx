// Pieces of the search screen: removable chips, result cards, the selected case pane.
import { type Href, useRouter } from 'expo-router';
import { Pressable, View } from 'react-native';
import type { SearchChip, SearchResponse, SearchResult } from '../../shared/schemas/search';
import { useCase } from '../cases/api';
import { platformName, statusLabel } from '../cases/labels';
import { MarkdownView } from '../markdown/markdown-view';
import { useTheme } from '../theme/use-theme';
import { Badge, CodeChip } from '../ui/badges';
import { Button } from '../ui/button';
import { Loaded } from '../ui/states';
import { Card, Row } from '../ui/surfaces';
import { Heading, Text } from '../ui/text';
import { Icon } from '../ui/icon';

const KIND_WORD: Record<SearchChip['kind'] | 'filter', string> = {
  code: 'Code',
  cylinder: 'Cylinder',
  tag: 'Symptom',
  context: 'Recent work',
  platform: 'Platform',
  term: 'Read as',
  filter: 'Filter',
};

/** A chip showing how the query was read; the cross drops it and searches again. 44 px tall. */
export function Chip({ kind, label, onRemove }: { kind: SearchChip['kind'] | 'filter'; label: string; onRemove?: () => void }) {
  const t = useTheme();
  const body = (
    <View style={{ flexDirection: 'row', alignItems: 'center', gap: t.space.xs, flexShrink: 1 }}>
      <Text variant="caption" tone="slate">
        {KIND_WORD[kind]}
      </Text>
      <Text variant="small" weight="semibold" mono={kind === 'code'} style={{ flexShrink: 1 }}>
        {label}
      </Text>
      {onRemove ? (
        <Icon name="close" size={14} tone="slate" />
      ) : null}
    </View>
  );
  const style = {
    minHeight: t.layout.touchTarget,
    justifyContent: 'center' as const,
    paddingHorizontal: t.space.md,
    borderRadius: t.radius.pill,
    borderWidth: 1,
    borderColor: t.colour.line,
    backgroundColor: kind === 'filter' ? t.colour.sand : t.colour.card,
    maxWidth: '100%' as const,
  };
  if (!onRemove) return <View style={style}>{body}</View>;
  return (
    <Pressable role="button" accessibilityLabel={`Remove ${KIND_WORD[kind].toLowerCase()} ${label}`} onPress={onRemove} style={style}>
      {body}
    </Pressable>
  );
}

export function StatusBadges({ status, fixConfirmed }: { status: SearchResult['status']; fixConfirmed: boolean }) {
  const s = statusLabel[status];
  return (
    <Row wrap>
      <Badge label={s.label} symbol={s.symbol} tone={s.tone} />
      {fixConfirmed ? <Badge label="Fix confirmed" symbol="check" tone="moss" /> : <Badge label="Fix not confirmed" symbol="open" tone="slate" />}
    </Row>
  );
}

export const caseHref = (id: number) => `/cases/${id}` as Href;

/** Open the case, or start a cause walk from the same evidence. */
function CaseActions({ id, walk, primary }: { id: number; walk: Href; primary: boolean }) {
  const router = useRouter();
  return (
    <Row wrap>
      <Button label="Open case" kind={primary ? 'primary' : 'secondary'} compact onPress={() => router.push(caseHref(id))} />
      <Button label="Start cause walk" kind={primary ? 'secondary' : 'quiet'} compact icon="next" onPress={() => router.push(walk)} />
    </Row>
  );
}

export function ResultCard({
  result,
  selected,
  onSelect,
  walk,
}: {
  result: SearchResult;
  selected: boolean;
  onSelect?: () => void;
  walk: Href;
}) {
  const t = useTheme();
  const head = (
    <View style={{ gap: t.space.xs }}>
      <Text serif weight="semibold" variant="lead">
        {result.title}
      </Text>
      <Text variant="small" tone="slate">
        {platformName(result.platform)}
      </Text>
    </View>
  );
  return (
    <Card style={selected ? { borderColor: t.colour.tide, borderWidth: 2 } : undefined}>
      {onSelect ? (
        <Pressable role="button" accessibilityLabel={`Show ${result.title}`} aria-pressed={selected} onPress={onSelect}>
          {head}
        </Pressable>
      ) : (
        head
      )}
      <StatusBadges status={result.status} fixConfirmed={result.fixConfirmed} />
      {result.codes.length ? (
        <Row wrap>
          {result.codes.map((c) => (
            <CodeChip key={c} code={c} />
          ))}
        </Row>
      ) : null}
      <View accessibilityLabel="Why it ranks here" style={{ gap: 2 }}>
        {result.why.map((w) => (
          <Text key={w} variant="small">
            <Text variant="small" tone="tide" aria-hidden>
              ›{' '}
            </Text>
            {w}
          </Text>
        ))}
      </View>
      <CaseActions id={result.id} walk={walk} primary={false} />
    </Card>
  );
}

/** Wide screens: the selected case beside the results. */
export function CasePane({ id, walk }: { id: number; walk: Href }) {
  const t = useTheme();
  const { data, error, mutate } = useCase(id);
  return (
    <Loaded data={data} error={error} retry={() => void mutate()} lines={5}>
      {({ case: c }) => (
        <Card style={{ gap: t.space.md }}>
          <Heading level={2}>{c.title}</Heading>
          <Text variant="small" tone="slate">
            {platformName(c.platform)}
          </Text>
          <StatusBadges status={c.status} fixConfirmed={c.fixConfirmed} />
          {c.codes.length ? (
            <Row wrap>
              {c.codes.map((code) => (
                <CodeChip key={code} code={code} />
              ))}
            </Row>
          ) : null}
          {c.symptoms.length ? <Text variant="small">Symptoms: {c.symptoms.map((s) => s.replace(/-/g, ' ')).join(', ')}</Text> : null}
          {c.rootCause ? (
            <View style={{ gap: 2 }}>
              <Text weight="semibold">Root cause</Text>
              <Text>{c.rootCause}</Text>
            </View>
          ) : null}
          {c.fix ? (
            <View style={{ gap: 2 }}>
              <Text weight="semibold">Fix</Text>
              <Text>{c.fix}</Text>
            </View>
          ) : null}
          <CaseActions id={c.id} walk={walk} primary />
          <MarkdownView body={c.body} attachments={c.attachments} />
        </Card>
      )}
    </Loaded>
  );
}

export type SearchData = SearchResponse;

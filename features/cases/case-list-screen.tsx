// The case list: cards on a phone, a sortable table on wide screens; filters and page live in the URL.
import { Link, useLocalSearchParams, useRouter, type Href } from 'expo-router';
import { useState } from 'react';
import { Pressable, View } from 'react-native';
import type { CaseSummary } from '../../shared/schemas/cases';
import { useBreakpoint, useTheme } from '../theme/use-theme';
import { Badge, CodeChip } from '../ui/badges';
import { Button } from '../ui/button';
import { EmptyState, Loaded } from '../ui/states';
import { Card, Row, Screen } from '../ui/surfaces';
import { Heading, Text } from '../ui/text';
import { useCaseList } from './api';
import { FilterFields, FilterSheet } from './case-filters';
import { platformName, shortDate, statusLabel } from './labels';
import { activeFilterCount, FILTER_KEYS, filtersFromParams, pageCount, toggleSort, toQueryString, withFilter, type ListFilters, type SortKey } from './list-query';
import { Icon } from '../ui/icon';

const PAGE_SIZE = 20;
export const caseHref = (id: number) => `/cases/${id}` as Href;

function StatusBadge({ status }: { status: CaseSummary['status'] }) {
  const s = statusLabel[status];
  return <Badge label={s.label} symbol={s.symbol} tone={s.tone} />;
}

export function ConfirmedBadge() {
  return <Badge label="Fix confirmed" symbol="check" tone="moss" />;
}

function Codes({ codes, max = 4 }: { codes: string[]; max?: number }) {
  const t = useTheme();
  if (codes.length === 0) return <Text variant="small" tone="slate">No codes</Text>;
  return (
    <Row wrap style={{ gap: t.space.xs }}>
      {codes.slice(0, max).map((c) => (
        <CodeChip key={c} code={c} />
      ))}
      {codes.length > max ? <Text variant="small" tone="slate">+{codes.length - max}</Text> : null}
    </Row>
  );
}

function CaseCard({ item }: { item: CaseSummary }) {
  const t = useTheme();
  return (
    <Link href={caseHref(item.id)} accessibilityLabel={item.title}>
      <Card style={{ gap: t.space.sm, width: '100%' }}>
        <Text serif weight="semibold" variant="lead">
          {item.title}
        </Text>
        <Codes codes={item.codes} />
        <Text variant="small">{platformName(item.platform)}</Text>
        <Row wrap>
          <StatusBadge status={item.status} />
          {item.fixConfirmed ? <ConfirmedBadge /> : null}
        </Row>
        <Text variant="small" tone="slate">
          {item.author.name} · updated {shortDate(item.updatedAt)}
        </Text>
      </Card>
    </Link>
  );
}

const columns: { key: SortKey; label: string; flex: number }[] = [
  { key: 'updated', label: 'Updated', flex: 1.3 },
  { key: 'title', label: 'Title', flex: 3 },
  { key: 'platform', label: 'Platform', flex: 2 },
  { key: 'codes', label: 'Codes', flex: 1.6 },
  { key: 'status', label: 'Status', flex: 1.3 },
  { key: 'confirmed', label: 'Confirmed', flex: 1.3 },
];

function SortHeader({ filters, onChange }: { filters: ListFilters; onChange: (f: ListFilters) => void }) {
  const t = useTheme();
  const sort = filters.sort ?? 'updated';
  const dir = filters.dir ?? 'desc';
  return (
    <View role="row" style={{ flexDirection: 'row', backgroundColor: t.colour.sand, borderTopLeftRadius: t.radius.lg, borderTopRightRadius: t.radius.lg }}>
      {columns.map((c) => {
        const active = sort === c.key;
        return (
          <Pressable
            key={c.key}
            role="columnheader"
            aria-sort={active ? (dir === 'asc' ? 'ascending' : 'descending') : 'none'}
            accessibilityLabel={`Sort by ${c.label}`}
            onPress={() => onChange(toggleSort(filters, c.key))}
            style={{ flex: c.flex, minHeight: t.layout.touchTarget, justifyContent: 'center', paddingHorizontal: t.space.md }}
          >
            <View style={{ flexDirection: 'row', alignItems: 'center', gap: 4 }}>
              <Text variant="small" weight="semibold" tone={active ? 'tide' : 'ink'}>
                {c.label}
              </Text>
              {active ? <Icon name={dir === 'asc' ? 'collapse' : 'expand'} size={14} tone="tide" /> : null}
            </View>
          </Pressable>
        );
      })}
    </View>
  );
}

function CaseTable({ cases, filters, onChange }: { cases: CaseSummary[]; filters: ListFilters; onChange: (f: ListFilters) => void }) {
  const t = useTheme();
  const cell = (flex: number) => ({ flex, paddingHorizontal: t.space.md, paddingVertical: t.space.sm, justifyContent: 'center' as const });
  return (
    <View role="table" aria-label="Cases" style={{ borderWidth: 1, borderColor: t.colour.line, borderRadius: t.radius.lg, backgroundColor: t.colour.card }}>
      <SortHeader filters={filters} onChange={onChange} />
      {cases.map((item) => (
        <Link key={item.id} href={caseHref(item.id)} accessibilityLabel={item.title} style={{ borderTopWidth: 1, borderColor: t.colour.line }}>
          <View role="row" style={{ flexDirection: 'row', minHeight: 52, width: '100%' }}>
            <View style={cell(1.3)}>
              <Text variant="small" mono>{shortDate(item.updatedAt)}</Text>
            </View>
            <View style={cell(3)}>
              <Text weight="semibold" tone="tide">{item.title}</Text>
              <Text variant="caption" tone="slate">{item.author.name}</Text>
            </View>
            <View style={cell(2)}>
              <Text variant="small">{platformName(item.platform)}</Text>
            </View>
            <View style={cell(1.6)}>
              <Codes codes={item.codes} max={3} />
            </View>
            <View style={cell(1.3)}>
              <StatusBadge status={item.status} />
            </View>
            <View style={cell(1.3)}>{item.fixConfirmed ? <ConfirmedBadge /> : <Text variant="small" tone="slate">— not yet</Text>}</View>
          </View>
        </Link>
      ))}
    </View>
  );
}

function Pager({ page, total, onPage }: { page: number; total: number; onPage: (p: number) => void }) {
  const pages = pageCount(total, PAGE_SIZE);
  if (pages <= 1) return null;
  return (
    <Row style={{ justifyContent: 'space-between' }}>
      <Button kind="secondary" compact label="‹ Previous" disabled={page <= 1} onPress={() => onPage(page - 1)} />
      <Text variant="small" tone="slate">
        Page {page} of {pages}
      </Text>
      <Button kind="secondary" compact label="Next ›" disabled={page >= pages} onPress={() => onPage(page + 1)} />
    </Row>
  );
}

export function CaseListScreen() {
  const t = useTheme();
  const router = useRouter();
  const { isWide } = useBreakpoint();
  const params = useLocalSearchParams();
  const filters = filtersFromParams(params);
  const [sheetOpen, setSheetOpen] = useState(false);
  const query = toQueryString(filters, PAGE_SIZE);
  const { data, error, mutate } = useCaseList(query);
  const page = Number(filters.page ?? 1) || 1;
  // setParams keeps the screen mounted (an open filter sheet stays open) and the URL shareable.
  const onChange = (next: ListFilters) => router.setParams(Object.fromEntries(FILTER_KEYS.map((k) => [k, next[k]])));
  const filterCount = activeFilterCount(filters);
  const newCase = () => router.push('/cases/new' as Href);
  const footer = isWide ? undefined : (
    <>
      <Button kind="secondary" label={filterCount ? `Filters (${filterCount})` : 'Filters'} icon="filter" onPress={() => setSheetOpen(true)} />
      <Button grow label="New case" icon="add" onPress={newCase} />
    </>
  );
  return (
    <Screen footer={footer}>
      <Row style={{ justifyContent: 'space-between' }}>
        <View style={{ gap: t.space.xxs, flexShrink: 1 }}>
          <Heading>Cases</Heading>
          <Text tone="slate">{data ? `${data.total} case${data.total === 1 ? '' : 's'}${filterCount ? ' match these filters' : ''}` : 'The shop’s case notes'}</Text>
        </View>
        {isWide ? <Button label="New case" icon="add" onPress={newCase} /> : null}
      </Row>
      {isWide ? (
        <Card>
          <FilterFields compact filters={filters} onChange={onChange} />
          {filterCount ? <Button kind="quiet" compact label="Clear filters" onPress={() => onChange({ sort: filters.sort, dir: filters.dir })} /> : null}
        </Card>
      ) : null}
      <Loaded data={data} error={error} retry={() => void mutate()} lines={5}>
        {(list) =>
          list.cases.length === 0 ? (
            filterCount ? (
              <EmptyState title="No cases match these filters" hint="Loosen a filter, or clear them all to see every case." action={{ label: 'Clear filters', onPress: () => onChange({}) }} />
            ) : (
              <EmptyState title="No cases yet" hint="Write up the last job you finished: what the car did, what you tested, what fixed it." action={{ label: 'Write the first case', onPress: newCase }} />
            )
          ) : (
            <View style={{ gap: t.space.md }}>
              {isWide ? <CaseTable cases={list.cases} filters={filters} onChange={onChange} /> : list.cases.map((c) => <CaseCard key={c.id} item={c} />)}
              <Pager page={page} total={list.total} onPage={(p) => onChange(withFilter(filters, 'page', p > 1 ? String(p) : undefined))} />
            </View>
          )
        }
      </Loaded>
      {isWide ? null : <FilterSheet open={sheetOpen} onClose={() => setSheetOpen(false)} filters={filters} onChange={onChange} total={data?.total} />}
    </Screen>
  );
}

// Home: one search field at the top; below it (beside it on a wide screen) what waits for
// this person today (features/home). The query comes back as chips (how it was
// read; each removable), then result cards with their reasons. Wide screens
// show the selected case beside the results.
import { useEffect, useState } from 'react';
import { View } from 'react-native';
import { caseStatuses } from '../../shared/roles';
import type { SearchResponse } from '../../shared/schemas/search';
import { statusLabel } from '../cases/labels';
import { usePlatforms } from '../platforms/api';
import { useBreakpoint, useTheme } from '../theme/use-theme';
import { Button } from '../ui/button';
import { Notice } from '../ui/notice';
import { EmptyState, ErrorState, Skeleton } from '../ui/states';
import { Card, Row, Screen } from '../ui/surfaces';
import { Heading, Text } from '../ui/text';
import { TextField } from '../ui/text-field';
import { HomePanels } from '../home/home-panels';
import { useSearch } from './api';
import { FilterSheet, type Filters } from './filter-sheet';
import { clearRecent, readRecent, rememberSearch } from './recent';
import { CasePane, Chip, ResultCard } from './search-parts';
import { walkHref } from './walk-link';

const EXAMPLE = "Try a code like P0302, or 'misfire cyl 2 and 5 after timing work'.";
const TYPING_PAUSE_MS = 300;

function useDebounced(value: string, ms: number): [string, (v: string) => void] {
  const [settled, setSettled] = useState(value);
  useEffect(() => {
    const id = setTimeout(() => setSettled(value), ms);
    return () => clearTimeout(id);
  }, [value, ms]);
  return [settled, setSettled];
}

function filterChips(f: Filters, remove: (k: keyof Filters) => void, platformLabel: (id: string) => string) {
  const chips: { key: keyof Filters; label: string }[] = [];
  if (f.status) chips.push({ key: 'status', label: statusLabel[f.status as (typeof caseStatuses)[number]]?.label ?? f.status });
  if (f.platformId) chips.push({ key: 'platformId', label: platformLabel(f.platformId) });
  if (f.code) chips.push({ key: 'code', label: f.code.toUpperCase() });
  if (f.tag) chips.push({ key: 'tag', label: f.tag });
  return chips.map((c) => <Chip key={c.key} kind="filter" label={c.label} onRemove={() => remove(c.key)} />);
}

/** A cylinder whose misfire code has its own chip says nothing new: the code chip covers it (and removes it). */
function visibleChips(chips: SearchResponse['query']['chips']) {
  const coded = new Set(chips.filter((c) => c.kind === 'code').map((c) => c.label.match(/cylinder (\d+) misfire/)?.[1] ?? (/^P03(0[1-9]|1[0-2])$/.test(c.value) ? String(Number(c.value.slice(3))) : null)));
  return chips.filter((c) => !(c.kind === 'cylinder' && coded.has(c.value)));
}

function Recent({ list, onPick, onClear }: { list: string[]; onPick: (q: string) => void; onClear: () => void }) {
  const t = useTheme();
  if (list.length === 0) return null;
  return (
    <Card style={{ gap: t.space.xs }}>
      <Row style={{ justifyContent: 'space-between' }}>
        <Text weight="semibold">Recent searches</Text>
        <Button label="Clear" kind="quiet" compact onPress={onClear} />
      </Row>
      {list.map((q) => (
        <Button key={q} label={q} kind="quiet" icon="recent" onPress={() => onPick(q)} />
      ))}
    </Card>
  );
}

function Results({ data, q, filters, selected, onSelect }: { data: SearchResponse; q: string; filters: Filters; selected: number | null; onSelect: ((id: number) => void) | null }) {
  const t = useTheme();
  if (data.results.length === 0) {
    return <EmptyState title="No cases match" hint="Remove a chip or a filter, or use fewer words. Codes and symptoms find the most." />;
  }
  return (
    <View style={{ gap: t.space.md }}>
      <Text variant="small" tone="slate" role="status">
        {data.total === 1 ? '1 case matches' : `${data.total} cases match`}
        {data.total > data.results.length ? `, best ${data.results.length} shown` : ''} · {data.tookMs} ms
      </Text>
      {data.results.map((r) => (
        <ResultCard
          key={r.id}
          result={r}
          selected={selected === r.id}
          onSelect={onSelect ? () => onSelect(r.id) : undefined}
          walk={walkHref(data.query, r, q, filters.platformId)}
        />
      ))}
    </View>
  );
}

export function SearchScreen() {
  const t = useTheme();
  const { isWide } = useBreakpoint();
  const [text, setText] = useState('');
  const [q, setQ] = useDebounced(text, TYPING_PAUSE_MS);
  const [filters, setFilters] = useState<Filters>({});
  const [sheet, setSheet] = useState(false);
  const [recent, setRecent] = useState<string[]>([]);
  const [selected, setSelected] = useState<number | null>(null);
  useEffect(() => setRecent(readRecent()), []);

  const { data, error, isLoading, mutate } = useSearch({ q, ...filters });
  const searching = Boolean(q.trim() || Object.values(filters).some(Boolean));
  const first = data?.results[0]?.id ?? null;
  const shown = selected !== null && data?.results.some((r) => r.id === selected) ? selected : first;

  const run = (next: string) => {
    setText(next);
    setQ(next);
    setSelected(null);
    if (next.trim()) setRecent(rememberSearch(next));
  };
  const removeFilter = (k: keyof Filters) => setFilters((f) => ({ ...f, [k]: undefined }));
  const filterCount = Object.values(filters).filter(Boolean).length;
  const { data: platformList } = usePlatforms();
  const platformLabel = (id: string) => {
    const p = platformList?.platforms.find((x) => String(x.id) === id);
    return p ? `${p.make} ${p.model} ${p.engine}` : 'chosen platform';
  };

  const top = (
    <View style={{ gap: t.space.md }}>
      <Heading>Search</Heading>
      <TextField
        label="What is the car doing?"
        value={text}
        onChangeText={setText}
        onSubmitEditing={() => run(text)}
        placeholder="P0302, misfire cyl 2 and 5 after timing work"
        returnKeyType="search"
        inputMode="search"
        autoCapitalize="none"
        autoCorrect={false}
        maxLength={500}
      />
      <Row wrap>
        <Button label="Search" icon="search" onPress={() => run(text)} />
        <Button label={filterCount ? `Filters (${filterCount})` : 'Filters'} kind="secondary" onPress={() => setSheet(true)} />
        {text ? <Button label="Clear" kind="quiet" onPress={() => run('')} /> : null}
      </Row>
      {data && searching && (data.query.chips.length || filterCount) ? (
        <View accessibilityLabel="How your search was read" style={{ flexDirection: 'row', flexWrap: 'wrap', gap: t.space.xs }}>
          {visibleChips(data.query.chips).map((c) => (
            <Chip key={`${c.kind}:${c.value}`} kind={c.kind} label={c.label} onRemove={c.removable ? () => run(c.without) : undefined} />
          ))}
          {filterChips(filters, removeFilter, platformLabel)}
        </View>
      ) : null}
      {data?.index === 'building' ? <Notice tone="info">The search index is still being built; results may be incomplete for a few seconds.</Notice> : null}
    </View>
  );

  const body = !searching ? (
    <View style={{ gap: t.space.md }}>
      <Text tone="slate">{EXAMPLE}</Text>
      <Recent list={recent} onPick={run} onClear={() => setRecent(clearRecent())} />
      {isWide ? null : <HomePanels />}
    </View>
  ) : error ? (
    <ErrorState error={error} onRetry={() => void mutate()} />
  ) : !data || (isLoading && !data) ? (
    <Skeleton lines={4} label="Searching" />
  ) : (
    <Results data={data} q={q} filters={filters} selected={isWide ? shown : null} onSelect={isWide ? setSelected : null} />
  );

  const sheetEl = (
    <FilterSheet
      open={sheet}
      value={filters}
      onClose={() => setSheet(false)}
      onApply={(f) => {
        setFilters(f);
        setSheet(false);
        setSelected(null);
      }}
    />
  );

  if (!isWide) {
    return (
      <Screen width="reading">
        {top}
        {body}
        {sheetEl}
      </Screen>
    );
  }
  return (
    <Screen width="full">
      <View style={{ flexDirection: 'row', gap: t.space.xl, alignItems: 'flex-start', width: '100%' }}>
        <View style={{ flex: 1, minWidth: 0, maxWidth: 560, gap: t.space.lg }}>
          {top}
          {body}
        </View>
        <View style={{ flex: 1.3, minWidth: 0, gap: t.space.md }}>
          {!searching ? (
            <HomePanels />
          ) : data && shown !== null ? (
            <CasePane id={shown} walk={walkHref(data.query, data.results.find((r) => r.id === shown) ?? null, q, filters.platformId)} />
          ) : (
            <Card>
              <Text tone="slate">Pick a result to read the case here.</Text>
            </Card>
          )}
        </View>
      </View>
      {sheetEl}
    </Screen>
  );
}

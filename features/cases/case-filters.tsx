// Filters for the case list: a sheet on a phone, a bar on wide screens. Values come from and go to the URL.
import { useEffect, useState } from 'react';
import { Modal, Pressable, ScrollView, View } from 'react-native';
import { parseDtc } from '../../shared/codes';
import { tagSchema } from '../../shared/schemas/cases';
import { useTheme } from '../theme/use-theme';
import { Button } from '../ui/button';
import { Choice } from '../ui/choice';
import { Sheet } from '../ui/sheet';
import { Row } from '../ui/surfaces';
import { Heading, Text } from '../ui/text';
import { TextField } from '../ui/text-field';
import { usePlatforms } from './api';
import { platformName } from './labels';
import { withFilter, type FilterKey, type ListFilters } from './list-query';

const statusOptions = [
  { value: '', label: 'All' },
  { value: 'draft', label: 'Draft' },
  { value: 'review', label: 'In review' },
  { value: 'published', label: 'Published' },
] as const;
const confirmedOptions = [
  { value: '', label: 'Any' },
  { value: 'yes', label: 'Fix confirmed' },
  { value: 'no', label: 'Not confirmed' },
] as const;
const mineOptions = [
  { value: '', label: 'Everyone' },
  { value: '1', label: 'Mine' },
] as const;

/** A text filter applied on Enter or "Apply", checked first so a typo gets a reason, not an empty list. */
function TextFilter({ label, value, hint, check, onApply }: { label: string; value: string; hint: string; check: (s: string) => { ok: true; value: string } | { ok: false; reason: string }; onApply: (v: string | undefined) => void }) {
  const [text, setText] = useState(value);
  const [error, setError] = useState<string | undefined>();
  useEffect(() => setText(value), [value]);
  const apply = () => {
    if (!text.trim()) {
      setError(undefined);
      return onApply(undefined);
    }
    const result = check(text);
    if (!result.ok) return setError(result.reason);
    setError(undefined);
    onApply(result.value);
  };
  return (
    <View style={{ flexGrow: 1, flexBasis: 160 }}>
      <TextField label={label} value={text} onChangeText={setText} onSubmitEditing={apply} onBlur={apply} error={error} hint={hint} autoCapitalize="none" returnKeyType="search" />
    </View>
  );
}

const checkCode = (s: string) => {
  const parsed = parseDtc(s);
  return parsed.ok ? ({ ok: true, value: parsed.dtc.full } as const) : ({ ok: false, reason: `Not a trouble code: ${parsed.reason}.` } as const);
};
const checkTag = (s: string) => {
  const parsed = tagSchema.safeParse(s);
  return parsed.success ? ({ ok: true, value: parsed.data } as const) : ({ ok: false, reason: parsed.error.issues[0]?.message ?? 'Not a tag.' } as const);
};

export function FilterFields({ filters, onChange, compact }: { filters: ListFilters; onChange: (f: ListFilters) => void; compact?: boolean }) {
  const t = useTheme();
  const platforms = usePlatforms();
  const [platformOpen, setPlatformOpen] = useState(Boolean(filters.platformId));
  const set = (key: FilterKey) => (value: string | undefined) => onChange(withFilter(filters, key, value));
  const list = platforms.data?.platforms ?? [];
  const platformOptions = [{ value: '', label: 'All platforms' }, ...list.map((p) => ({ value: String(p.id), label: platformName(p) }))];
  const chosen = list.find((p) => String(p.id) === filters.platformId);
  const platformChoice = platforms.data ? <Choice label="Platform" options={platformOptions} value={filters.platformId ?? ''} onChange={set('platformId')} /> : null;
  return (
    <View style={{ gap: t.space.md }}>
      <Row wrap style={{ alignItems: 'flex-start', gap: t.space.lg }}>
        <Choice label="Status" options={statusOptions} value={(filters.status ?? '') as (typeof statusOptions)[number]['value']} onChange={set('status')} />
        <Choice label="Fix" options={confirmedOptions} value={(filters.confirmed ?? '') as (typeof confirmedOptions)[number]['value']} onChange={set('confirmed')} />
        <Choice label="Written by" options={mineOptions} value={(filters.mine ?? '') as (typeof mineOptions)[number]['value']} onChange={set('mine')} />
      </Row>
      {platforms.error ? <Text tone="slate" variant="small">Platforms could not be loaded; the platform filter is unavailable.</Text> : null}
      {compact ? null : platformChoice}
      <Row wrap style={{ alignItems: 'flex-start', gap: t.space.md }}>
        <TextFilter label="Trouble code" value={filters.code ?? ''} hint="e.g. P0302; Enter applies" check={checkCode} onApply={set('code')} />
        <TextFilter label="Symptom tag" value={filters.tag ?? ''} hint="e.g. rough-idle; Enter applies" check={checkTag} onApply={set('tag')} />
        {compact && platforms.data ? (
          <View style={{ paddingTop: 24 }}>
            <Button kind="secondary" compact label={`Platform: ${chosen ? platformName(chosen) : 'all'}`} icon={platformOpen ? 'collapse' : 'expand'} onPress={() => setPlatformOpen(!platformOpen)} />
          </View>
        ) : null}
      </Row>
      {compact && platformOpen ? platformChoice : null}
    </View>
  );
}

// Phone cards have no column headers, so the sheet offers the table's orders as one choice.
const sortOptions = [
  { value: 'updated:desc', label: 'Newest first' },
  { value: 'updated:asc', label: 'Oldest first' },
  { value: 'title:asc', label: 'Title A–Z' },
  { value: 'platform:asc', label: 'Platform' },
  { value: 'status:desc', label: 'Status' },
  { value: 'confirmed:desc', label: 'Confirmed first' },
] as const;
type SortValue = (typeof sortOptions)[number]['value'];
const sortValue = (f: ListFilters): SortValue => {
  const v = `${f.sort ?? 'updated'}:${f.dir ?? 'desc'}`;
  return (sortOptions.some((o) => o.value === v) ? v : 'updated:desc') as SortValue;
};

const withSort = (f: ListFilters, v: SortValue): ListFilters => {
  const [sort, dir] = v.split(':');
  return { ...f, sort, dir, page: undefined };
};

/** Phone: filters in a bottom sheet, closed with the button that says how many cases match. */
export function FilterSheet({ open, onClose, filters, onChange, total }: { open: boolean; onClose: () => void; filters: ListFilters; onChange: (f: ListFilters) => void; total: number | undefined }) {
  const t = useTheme();
  return (
    <Sheet
      open={open}
      title="Filters"
      onClose={onClose}
      action={<Button kind="quiet" compact label="Clear all" onPress={() => onChange({ sort: filters.sort, dir: filters.dir })} />}
      footer={<Button label={total === undefined ? 'Show cases' : `Show ${total} case${total === 1 ? '' : 's'}`} onPress={onClose} />}
    >
      <Choice label="Order" options={sortOptions} value={sortValue(filters)} onChange={(v) => onChange(withSort(filters, v))} />
      <FilterFields filters={filters} onChange={onChange} />
    </Sheet>
  );
}

// Look up or browse the trouble-code reference: a code, a prefix or words from the titles.
import { Link } from 'expo-router';
import { useState } from 'react';
import { View } from 'react-native';
import type { CodeListResponse } from '../../shared/schemas/codes';
import { useBreakpoint, useTheme } from '../theme/use-theme';
import { CodeChip } from '../ui/badges';
import { Button } from '../ui/button';
import { Choice } from '../ui/choice';
import { EmptyState, Loaded } from '../ui/states';
import { Card, Row, Screen } from '../ui/surfaces';
import { Heading, Text } from '../ui/text';
import { TextField } from '../ui/text-field';
import { useCodeList } from './api';
import { DecodeTool } from './decode-tool';
import { Icon } from '../ui/icon';

const systemOptions = [
  { value: '', label: 'All' },
  { value: 'powertrain', label: 'P Powertrain' },
  { value: 'chassis', label: 'C Chassis' },
  { value: 'body', label: 'B Body' },
  { value: 'network', label: 'U Network' },
] as const;
type SystemFilter = (typeof systemOptions)[number]['value'];

function CodeRow({ code, title }: { code: string; title: string }) {
  const t = useTheme();
  return (
    <Link href={`/codes/${code}`} accessibilityLabel={`${code} ${title}`}>
      <View style={{ minHeight: t.layout.touchTarget, flexDirection: 'row', alignItems: 'center', gap: t.space.md, paddingVertical: t.space.xs, width: '100%' }}>
        <CodeChip code={code} />
        <Text style={{ flex: 1 }}>{title}</Text>
      </View>
    </Link>
  );
}

function Results({ data, onPage }: { data: CodeListResponse; onPage: (p: number) => void }) {
  const t = useTheme();
  const pages = Math.max(1, Math.ceil(data.total / data.pageSize));
  const exactWithoutRow = data.exact && !data.codes.some((c) => c.code === data.exact);
  return (
    <View style={{ gap: t.space.md }}>
      {exactWithoutRow ? (
        <Card>
          <Row wrap>
            <CodeChip code={data.exact!} />
            <Text style={{ flex: 1 }}>{data.total ? 'This exact code has its own page.' : 'Not in the generic list (manufacturer codes have no generic title), but its structure can still be read.'}</Text>
          </Row>
          <Link href={`/codes/${data.exact}`}>
            <View style={{ minHeight: t.layout.touchTarget, flexDirection: 'row', alignItems: 'center', gap: t.space.xs }}>
              <Text tone="tide" weight="semibold">Open {data.exact}</Text>
              <Icon name="next" size={16} tone="tide" />
            </View>
          </Link>
        </Card>
      ) : null}
      {data.codes.length === 0 ? (
        exactWithoutRow ? null : <EmptyState title="No codes match" hint="Try a code such as P0302, a start such as P03, or words from a title such as lean bank 2." />
      ) : (
        <Card style={{ gap: 0, paddingVertical: t.space.sm }}>
          <Text variant="small" tone="slate" aria-live="polite">
            {data.total} {data.total === 1 ? 'code' : 'codes'} · page {data.page} of {pages}
          </Text>
          {data.codes.map((c) => (
            <CodeRow key={c.code} code={c.code} title={c.title} />
          ))}
        </Card>
      )}
      {pages > 1 ? (
        <Row style={{ justifyContent: 'space-between' }}>
          <Button label="‹ Previous" kind="secondary" compact disabled={data.page <= 1} onPress={() => onPage(data.page - 1)} />
          <Text variant="small" tone="slate">
            {data.page} / {pages}
          </Text>
          <Button label="Next ›" kind="secondary" compact disabled={data.page >= pages} onPress={() => onPage(data.page + 1)} />
        </Row>
      ) : null}
      <Text variant="caption" tone="slate">
        {data.note}
      </Text>
    </View>
  );
}

export function CodesScreen() {
  const t = useTheme();
  const { isWide } = useBreakpoint();
  const [q, setQ] = useState('');
  const [system, setSystem] = useState<SystemFilter>('');
  const [page, setPage] = useState(1);
  const { data, error, mutate } = useCodeList({ q, system, page });
  const lookup = (
    <View style={{ gap: t.space.md }}>
      <TextField
        label="Look up a code or words"
        value={q}
        onChangeText={(v) => {
          setQ(v);
          setPage(1);
        }}
        placeholder="P0302, P03 or lean bank 2"
        autoCapitalize="none"
        autoCorrect={false}
        inputMode="search"
      />
      <Choice
        label="System"
        options={systemOptions}
        value={system}
        onChange={(v) => {
          setSystem(v);
          setPage(1);
        }}
      />
      <Loaded data={data} error={error} retry={() => void mutate()} lines={5}>
        {(d) => <Results data={d} onPage={setPage} />}
      </Loaded>
    </View>
  );
  return (
    <Screen>
      <Heading>Trouble codes</Heading>
      <Text tone="slate">The generic codes (SAE J2012): what each character says and what the code is called. Open a code to see the shop&apos;s cases that carry it.</Text>
      {isWide ? (
        <View style={{ flexDirection: 'row', gap: t.space.xl, alignItems: 'flex-start' }}>
          <View style={{ flex: 3 }}>{lookup}</View>
          <View style={{ flex: 2 }}>
            <DecodeTool />
          </View>
        </View>
      ) : (
        <>
          {lookup}
          <DecodeTool />
        </>
      )}
    </Screen>
  );
}

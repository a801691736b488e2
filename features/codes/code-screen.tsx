// One trouble code: what its characters say, its title, its J1979 bytes and the shop's cases with it.
import { Link, useLocalSearchParams, type Href } from 'expo-router';
import { View } from 'react-native';
import { codeCaution } from '../../shared/codes/code-cautions';
import type { CodeDetail } from '../../shared/schemas/codes';
import { ApiError } from '../api/client';
import { platformName, statusLabel } from '../cases/labels';
import { useBreakpoint, useTheme } from '../theme/use-theme';
import { Badge, Caution, CodeChip } from '../ui/badges';
import { Notice } from '../ui/notice';
import { EmptyState, ErrorState, Loaded, Skeleton } from '../ui/states';
import { Card, Row, Screen } from '../ui/surfaces';
import { Heading, Text } from '../ui/text';
import { useCasesWithCode, useCodeDetail } from './api';
import { DecodeTool } from './decode-tool';
import { BackLink } from '../ui/back-link';

function spaced(pair: string): string {
  return `${pair.slice(0, 2)} ${pair.slice(2)}`;
}

function Structure({ d }: { d: CodeDetail }) {
  const t = useTheme();
  return (
    <Card>
      <Heading level={2}>What the code says</Heading>
      {d.structure.map((part) => (
        <Row key={part.position} style={{ alignItems: 'flex-start', gap: t.space.md }}>
          <View style={{ width: 56, alignItems: 'flex-start' }}>
            <CodeChip code={part.chars} />
          </View>
          <View style={{ flex: 1, gap: 2 }}>
            <Text variant="caption" tone="slate">
              {part.position}
            </Text>
            <Text>{part.meaning}</Text>
          </View>
        </Row>
      ))}
      {d.ftb ? (
        <Notice tone="info">{`Failure type byte ${d.ftb.value}: ${d.ftb.meaning ?? 'no specific meaning listed'}. Its first digit (${d.ftb.value.charAt(0)}) puts it under ${d.ftb.category}.`}</Notice>
      ) : null}
      <View style={{ gap: 2 }}>
        <Text variant="small" weight="semibold">
          On the bus (SAE J1979 mode $03)
        </Text>
        <Text>
          {d.code} travels as the two bytes <Text mono weight="semibold">{spaced(d.pair)}</Text>
          {d.ftb ? (
            <>
              {' '}
              and, with its failure type byte, as <Text mono weight="semibold">{`${spaced(d.pair)} ${d.ftb.value}`}</Text> in a three-byte report
            </>
          ) : null}
          .
        </Text>
      </View>
    </Card>
  );
}

function CaseList({ code }: { code: string }) {
  const t = useTheme();
  const { data, error, mutate } = useCasesWithCode(code);
  if (error instanceof ApiError && error.status === 404) return <Notice tone="info">The shop&apos;s case list is not available yet.</Notice>;
  if (error) return <ErrorState error={error} onRetry={() => void mutate()} />;
  if (!data) return <Skeleton lines={2} label="Loading cases" />;
  if (data.cases.length === 0) return <EmptyState title={`No cases with ${code} yet`} hint="When a case note lists this code it shows up here. Write one up when you find the cause." />;
  return (
    <View style={{ gap: t.space.sm }}>
      <Text variant="small" tone="slate">
        {data.total} {data.total === 1 ? 'case' : 'cases'} in the shop
      </Text>
      {data.cases.map((c) => {
        const s = statusLabel[c.status];
        return (
          <Link key={c.id} href={`/cases/${c.id}` as Href} accessibilityLabel={c.title}>
            <Card style={{ gap: t.space.xs, width: '100%' }}>
              <Text weight="semibold" tone="tide">
                {c.title}
              </Text>
              <Text variant="small" tone="slate">
                {platformName(c.platform)}
              </Text>
              <Row wrap>
                <Badge label={s.label} symbol={s.symbol} tone={s.tone} />
                {c.fixConfirmed ? <Badge label="Fix confirmed" symbol="check" tone="moss" /> : null}
                {c.codes.map((k) => (
                  <CodeChip key={k} code={k} />
                ))}
              </Row>
            </Card>
          </Link>
        );
      })}
    </View>
  );
}

function CodeBody({ d }: { d: CodeDetail }) {
  const t = useTheme();
  const { isWide } = useBreakpoint();
  // Caution first, before anyone reads on and starts work (rows and sources: shared/codes/code-cautions.ts).
  const caution = codeCaution(d.code);
  const left = (
    <View style={{ gap: t.space.lg }}>
      {caution ? (
        <View style={{ gap: 2 }}>
          <Caution>{caution.caution}</Caution>
          <Text variant="caption" tone="slate">{`Why this caution: ${d.code} is in ${caution.from}-${caution.to}, ${caution.covers} (${caution.source}).`}</Text>
        </View>
      ) : null}
      <Card>
        <Row wrap>
          <Badge label={d.systemLabel} />
          <Badge label={d.scopeLabel} />
          {d.misfire ? <Badge label={d.misfire.cylinder ? `Misfire, cylinder ${d.misfire.cylinder}` : 'Misfire, random or multiple'} symbol="misfire" tone="brick" /> : null}
        </Row>
        <Text serif variant="lead">
          {d.title ?? (d.scope === 'generic' ? 'Not in our list of generic titles.' : 'A manufacturer code: its title comes from the vehicle maker’s information.')}
        </Text>
        <Text variant="caption" tone="slate" accessibilityHint={d.titleNote}>
          Title written from memory of the public code list (SAE J2012); wording varies by edition and by vehicle.
        </Text>
      </Card>
      <Structure d={d} />
    </View>
  );
  const right = (
    <View style={{ gap: t.space.lg }}>
      <Heading level={2}>Cases with {d.code}</Heading>
      <CaseList code={d.code} />
      <DecodeTool />
    </View>
  );
  if (!isWide) return <>{left}{right}</>;
  return (
    <View style={{ flexDirection: 'row', gap: t.space.xl, alignItems: 'flex-start' }}>
      <View style={{ flex: 1 }}>{left}</View>
      <View style={{ flex: 1 }}>{right}</View>
    </View>
  );
}

export function CodeScreen() {
  const t = useTheme();
  const params = useLocalSearchParams<{ code: string }>();
  const code = typeof params.code === 'string' ? params.code : null;
  const { data, error, mutate } = useCodeDetail(code);
  const bad = error instanceof ApiError && error.status === 400;
  return (
    <Screen>
      <BackLink href="/codes" label="All codes" />
      <Row wrap>
        <Heading>{data?.full ?? code ?? 'Code'}</Heading>
      </Row>
      {bad ? (
        <EmptyState title="That is not a trouble code" hint={`${error.fields.code ?? error.message} Codes look like P0302, or P0302-13 with a failure type byte.`} />
      ) : (
        <Loaded data={data} error={error} retry={() => void mutate()} lines={4}>
          {(d) => <CodeBody d={d} />}
        </Loaded>
      )}
    </Screen>
  );
}

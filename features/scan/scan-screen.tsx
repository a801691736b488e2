// Paste or upload what the scan tool printed; review the codes, VIN and mileage; start a case or a walk.
import { useRouter, type Href } from 'expo-router';
import { useState } from 'react';
import { View } from 'react-native';
import type { ScanReportView } from '../../shared/schemas/codes';
import { ApiError } from '../api/client';
import { CodeLink } from '../codes/code-link';
import type { ColourName } from '../theme/tokens';
import { useBreakpoint, useTheme } from '../theme/use-theme';
import { Badge } from '../ui/badges';
import { Button } from '../ui/button';
import { Notice } from '../ui/notice';
import { EmptyState } from '../ui/states';
import { Card, Row, Screen } from '../ui/surfaces';
import { Heading, Text } from '../ui/text';
import { TextField } from '../ui/text-field';
import { readPastedReport, readUploadedReport } from './api';
import { pickTextFile } from './pick-file';
import type { IconName } from '../ui/icon';
import { ReadinessCard } from '../readiness/readiness-card';

type Status = NonNullable<ScanReportView['codes'][number]['status']>;
const statusWords: Record<Status, { label: string; symbol: IconName; tone: ColourName }> = {
  active: { label: 'Active now', symbol: 'active', tone: 'brick' },
  confirmed: { label: 'Confirmed', symbol: 'published', tone: 'brick' },
  permanent: { label: 'Permanent', symbol: 'permanent', tone: 'brick' },
  pending: { label: 'Pending', symbol: 'waiting', tone: 'amber' },
  history: { label: 'History', symbol: 'open', tone: 'slate' },
};

/** Links into the case and walk forms, which read these URL parameters. */
export function caseLinkFor(r: ScanReportView): string {
  const params = new URLSearchParams();
  if (r.codes.length) params.set('codes', r.codes.map((c) => (c.ftb ? `${c.code}-${c.ftb}` : c.code)).join(','));
  if (r.vin) params.set('vin', r.vin);
  if (r.mileage) {
    params.set('mileage', String(Math.round(r.mileage.value)));
    params.set('mileageUnit', r.mileage.unit);
  }
  return `/cases/new?${params.toString()}`;
}

export function walkLinkFor(r: ScanReportView): string {
  const codes = [...new Set(r.codes.map((c) => c.code))];
  return `/walks/new?${new URLSearchParams({ codes: codes.join(',') }).toString()}`;
}

function Found({ report }: { report: ScanReportView }) {
  const t = useTheme();
  const router = useRouter();
  return (
    <View style={{ gap: t.space.lg }}>
      <Card>
        <Heading level={2}>
          {report.codes.length} {report.codes.length === 1 ? 'code' : 'codes'} found
        </Heading>
        {report.codes.length === 0 ? <Text tone="slate">No trouble codes in this report.</Text> : null}
        {report.codes.map((c) => {
          const s = c.status ? statusWords[c.status] : null;
          const full = c.ftb ? `${c.code}-${c.ftb}` : c.code;
          return (
            <View key={full} style={{ gap: t.space.xs, borderTopWidth: 1, borderColor: t.colour.line, paddingTop: t.space.sm }}>
              <Row wrap>
                <CodeLink code={full} />
                <View>{s ? <Badge label={s.label} symbol={s.symbol} tone={s.tone} /> : <Badge label="Status not given" symbol="unknown" />}</View>
              </Row>
              <Text>{c.title ?? 'No generic title (manufacturer code or not in our list).'}</Text>
              {c.ftbMeaning ? (
                <Text variant="small" tone="slate">
                  Failure type {c.ftb}: {c.ftbMeaning}
                </Text>
              ) : null}
            </View>
          );
        })}
      </Card>
      <Card>
        <Heading level={2}>Vehicle</Heading>
        {report.vin ? (
          <View style={{ gap: t.space.xs }}>
            <Row wrap>
              <Text mono weight="semibold" selectable>
                {report.vin}
              </Text>
              {vinBadge(report.vinCheck)}
            </Row>
            {report.vinCheck?.modelYears.length ? (
              <Text variant="small" tone="slate">
                Model year {report.vinCheck.modelYears.join(' or ')} (position 10)
              </Text>
            ) : null}
            {[...(report.vinCheck?.errors ?? []), ...(report.vinCheck?.warnings ?? [])].map((e) => (
              <Text key={e} variant="small" tone={report.vinCheck?.valid ? 'slate' : 'brick'}>
                {e}
              </Text>
            ))}
          </View>
        ) : (
          <Text tone="slate">No VIN in this report.</Text>
        )}
        <Text>
          {report.mileage ? (
            <>
              Odometer <Text mono weight="semibold">{`${report.mileage.value.toLocaleString()} ${report.mileage.unit}`}</Text>
            </>
          ) : (
            'No odometer reading in this report.'
          )}
        </Text>
      </Card>
      {report.readiness ? (
        <Card aria-label="Emissions readiness">
          <Heading level={2}>Emissions readiness</Heading>
          <ReadinessCard answer={report.readiness} />
          <Text variant="small" tone="slate">
            To keep this with the job, paste the same printout into the readiness panel of the case.
          </Text>
        </Card>
      ) : null}
      <Row wrap>
        <Button label="Start a case" icon="edit" onPress={() => router.push(caseLinkFor(report) as Href)} />
        {report.codes.length ? <Button label="Start a cause walk" icon="next" kind="secondary" onPress={() => router.push(walkLinkFor(report) as Href)} /> : null}
      </Row>
    </View>
  );
}

export function ScanScreen() {
  const t = useTheme();
  const { isWide } = useBreakpoint();
  const [text, setText] = useState('');
  const [report, setReport] = useState<ScanReportView | null>(null);
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState<'paste' | 'file' | null>(null);
  const [fileName, setFileName] = useState<string | null>(null);

  const run = async (kind: 'paste' | 'file', read: () => Promise<ScanReportView>) => {
    setBusy(kind);
    setError(null);
    try {
      setReport(await read());
    } catch (err) {
      setReport(null);
      setError(err instanceof ApiError || err instanceof Error ? err.message : 'Could not read the report.');
    } finally {
      setBusy(null);
    }
  };
  const upload = async () => {
    const file = await pickTextFile();
    if (!file) return;
    setFileName(file.name);
    if (file.size > 1024 * 1024) {
      setError('That file is over 1 MB. Export only the trouble code part of the report.');
      return;
    }
    await run('file', () => readUploadedReport(file));
  };

  const input = (
    <Card>
      <TextField
        label="Scan tool printout"
        multiline
        mono
        value={text}
        onChangeText={setText}
        placeholder={'P0302-13 confirmed\nP0171 pending\nVIN: …'}
        style={{ minHeight: 180 }}
        autoCapitalize="none"
        autoCorrect={false}
        hint="Plain text or CSV, as the tool printed or exported it. At most 1 MB."
      />
      <Row wrap>
        <Button label="Read report" onPress={() => run('paste', () => readPastedReport(text))} busy={busy === 'paste'} disabled={text.trim() === '' || busy !== null} />
        <Button label="Upload a file" icon="upload" kind="secondary" onPress={upload} busy={busy === 'file'} disabled={busy !== null} />
      </Row>
      {fileName ? (
        <Text variant="small" tone="slate">
          File: {fileName}
        </Text>
      ) : null}
      {error ? <Notice tone="error">{error}</Notice> : null}
    </Card>
  );
  const result = report ? <Found report={report} /> : <EmptyState title="Nothing read yet" hint="Paste the printout or upload the file; the codes, their status, the VIN and the odometer reading show here to check before you start a case." />;

  return (
    <Screen>
      <Heading>Scan report</Heading>
      <Text tone="slate">Bring in what the scan tool read, then start a case or a cause walk from it.</Text>
      {isWide ? (
        <View style={{ flexDirection: 'row', gap: t.space.xl, alignItems: 'flex-start' }}>
          <View style={{ flex: 1 }}>{input}</View>
          <View style={{ flex: 1 }}>{result}</View>
        </View>
      ) : (
        <>
          {input}
          {result}
        </>
      )}
    </Screen>
  );
}

function vinBadge(check: ScanReportView['vinCheck']) {
  if (!check?.valid) return <Badge label="Not a VIN" symbol="close" tone="brick" />;
  if (check.warnings.length) return <Badge label="VIN outside North American rules" symbol="alert" tone="amber" />;
  return <Badge label="Check digit OK" symbol="check" tone="moss" />;
}

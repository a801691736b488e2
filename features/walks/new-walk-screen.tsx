// Start a walk from the evidence: codes, symptoms, recent work, the platform, free text.
// Reads codes, symptoms, context, platformId and query from the URL so search can hand over its evidence.
import { useLocalSearchParams, useRouter, type Href } from 'expo-router';
import { useState } from 'react';
import { View } from 'react-native';
import { parseDtc } from '../../shared/codes';
import { CONTEXT_LABELS, CONTEXT_TAGS } from '../../shared/search';
import { ApiError } from '../api/client';
import { usePlatforms } from '../platforms/api';
import { useTheme } from '../theme/use-theme';
import { CodeChip } from '../ui/badges';
import { Button } from '../ui/button';
import { Choice } from '../ui/choice';
import { Notice } from '../ui/notice';
import { Skeleton } from '../ui/states';
import { Card, Row, Screen } from '../ui/surfaces';
import { Heading, Text } from '../ui/text';
import { TextField } from '../ui/text-field';
import { startWalk } from './api';

const list = (v: string | string[] | undefined): string[] =>
  (Array.isArray(v) ? v : v ? [v] : []).flatMap((x) => x.split(',')).map((x) => x.trim()).filter(Boolean);

const tags = (text: string) => text.split(/[,;\n]/).map((s) => s.trim()).filter(Boolean);

function PlatformPicker({ value, onChange }: { value: string; onChange: (v: string) => void }) {
  const { data, error } = usePlatforms();
  if (error) return <Text tone="slate">The platform list could not be loaded. Name the engine in the description instead (e.g. VT27).</Text>;
  if (!data) return <Skeleton lines={1} label="Loading platforms" />;
  const options = [{ value: '', label: 'Not known' }, ...data.platforms.map((p) => ({ value: String(p.id), label: `${p.make} ${p.model} ${p.engine}` }))];
  return <Choice label="Platform" options={options} value={value} onChange={onChange} />;
}

export function NewWalkScreen() {
  const t = useTheme();
  const router = useRouter();
  const params = useLocalSearchParams<{ codes?: string; symptoms?: string; context?: string; platformId?: string; query?: string }>();
  const [codes, setCodes] = useState<string[]>(() => list(params.codes).map((c) => c.toUpperCase()));
  const [codeText, setCodeText] = useState('');
  const [codeError, setCodeError] = useState<string | undefined>();
  const [symptoms, setSymptoms] = useState(() => list(params.symptoms).join(', '));
  const [context, setContext] = useState<string[]>(() => list(params.context));
  const [platformId, setPlatformId] = useState(() => (params.platformId && /^\d+$/.test(params.platformId) ? params.platformId : ''));
  const [query, setQuery] = useState(() => (typeof params.query === 'string' ? params.query : ''));
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<{ message: string; fields: Record<string, string> } | null>(null);

  const addCodes = () => {
    const typed = codeText.split(/[\s,;]+/).filter(Boolean);
    const bad = typed.find((c) => !parseDtc(c).ok);
    if (bad) return setCodeError(`"${bad}" is not a trouble code. Codes look like P0302 or U0100.`);
    setCodes((cs) => [...new Set([...cs, ...typed.map((c) => c.toUpperCase())])]);
    setCodeText('');
    setCodeError(undefined);
  };
  const toggleContext = (tag: string) => setContext((cs) => (cs.includes(tag) ? cs.filter((c) => c !== tag) : [...cs, tag]));

  const submit = async () => {
    setBusy(true);
    setError(null);
    const pending = codeText.trim() ? codeText.split(/[\s,;]+/).filter((c) => parseDtc(c).ok).map((c) => c.toUpperCase()) : [];
    try {
      const walk = await startWalk({
        codes: [...new Set([...codes, ...pending])],
        symptoms: tags(symptoms),
        context,
        ...(platformId ? { platformId: Number(platformId) } : {}),
        ...(query.trim() ? { query: query.trim() } : {}),
      });
      router.replace(`/walks/${walk.id}` as Href);
    } catch (err) {
      setError(err instanceof ApiError ? { message: err.message, fields: err.fields } : { message: 'Could not start the walk.', fields: {} });
      setBusy(false);
    }
  };

  return (
    <Screen width="reading" footer={<Button grow label="Start the walk" icon="walk" onPress={submit} busy={busy} />}>
      <Heading>New cause walk</Heading>
      <Text tone="slate">Give what the car shows. Causeway picks the cause tree, ranks the likely causes with the shop’s confirmed fixes and puts quick, likely tests first.</Text>
      {error ? <Notice tone="error">{[error.message, ...Object.entries(error.fields).map(([k, v]) => `${k}: ${v}`)].join(' ')}</Notice> : null}
      <Card>
        <View style={{ gap: t.space.sm }}>
          <Row style={{ alignItems: 'flex-end' }}>
            <View style={{ flex: 1 }}>
              <TextField label="Trouble codes" value={codeText} onChangeText={setCodeText} onSubmitEditing={addCodes} placeholder="P0302 P0305" autoCapitalize="characters" mono error={codeError} />
            </View>
            <Button label="Add" kind="secondary" compact onPress={addCodes} />
          </Row>
          {codes.length ? (
            <Row wrap>
              {codes.map((c) => (
                <CodeChip key={c} code={c} onRemove={() => setCodes((cs) => cs.filter((x) => x !== c))} />
              ))}
            </Row>
          ) : null}
        </View>
        <TextField label="Symptoms" value={symptoms} onChangeText={setSymptoms} placeholder="rough-idle, misfire" hint="Separate with commas." autoCapitalize="none" />
        <View style={{ gap: t.space.xs }}>
          <Text variant="small" weight="semibold">
            Recent work on the car
          </Text>
          <Row wrap>
            {CONTEXT_TAGS.map((tag) => {
              const on = context.includes(tag);
              return <Button key={tag} compact kind={on ? 'primary' : 'secondary'} icon={on ? 'check' : undefined} label={CONTEXT_LABELS[tag]} aria-pressed={on} onPress={() => toggleContext(tag)} />;
            })}
          </Row>
        </View>
        <PlatformPicker value={platformId} onChange={setPlatformId} />
        <TextField label="What the car does (optional)" value={query} onChangeText={setQuery} multiline style={{ minHeight: 72 }} placeholder="misfire cyl 2 and 5 after timing work" hint="Cylinders, banks and recent work written here count as evidence too." />
      </Card>
    </Screen>
  );
}

// Revision history: pick two saved versions and see what changed, lines marked + and − as well as by fill.
import { useState } from 'react';
import { View } from 'react-native';
import { useTheme } from '../theme/use-theme';
import { Choice } from '../ui/choice';
import { Loaded } from '../ui/states';
import { Card } from '../ui/surfaces';
import { Heading, Text } from '../ui/text';
import { useDiff, useRevisions } from './api';
import { dateTime } from './labels';

function DiffView({ caseId, from, to }: { caseId: number; from: number; to: number }) {
  const t = useTheme();
  const { data, error, mutate } = useDiff(caseId, from, to);
  return (
    <Loaded data={data} error={error} retry={() => void mutate()} lines={2}>
      {(diff) => (
        <View style={{ gap: t.space.md }}>
          {diff.fields.map((f) => (
            <View key={f.field} style={{ gap: t.space.xxs }}>
              <Text variant="small" weight="semibold">
                {f.field}
              </Text>
              <Text variant="small" style={{ backgroundColor: t.colour.brickFill, padding: t.space.xs }}>− {f.before || '(empty)'}</Text>
              <Text variant="small" style={{ backgroundColor: t.colour.mossFill, padding: t.space.xs }}>+ {f.after || '(empty)'}</Text>
            </View>
          ))}
          {diff.body.some((l) => l.kind !== 'same') ? (
            <View accessibilityLabel="Changes to the note" style={{ borderWidth: 1, borderColor: t.colour.line, borderRadius: t.radius.sm }}>
              {diff.body.map((line, i) => (
                <Text
                  key={i}
                  mono
                  variant="small"
                  style={{
                    paddingHorizontal: t.space.sm,
                    backgroundColor: line.kind === 'added' ? t.colour.mossFill : line.kind === 'removed' ? t.colour.brickFill : undefined,
                    color: line.kind === 'same' ? t.colour.slate : t.colour.ink,
                  }}
                >
                  {line.kind === 'added' ? '+ ' : line.kind === 'removed' ? '− ' : '  '}
                  {line.text || ' '}
                </Text>
              ))}
            </View>
          ) : (
            <Text tone="slate" variant="small">The note text is the same in both versions.</Text>
          )}
          {diff.fields.length === 0 && diff.body.every((l) => l.kind === 'same') ? <Text tone="slate">No differences.</Text> : null}
        </View>
      )}
    </Loaded>
  );
}

export function RevisionHistory({ caseId }: { caseId: number }) {
  const t = useTheme();
  const { data, error, mutate } = useRevisions(caseId);
  const [picked, setPicked] = useState<{ from?: string; to?: string }>({});
  return (
    <Card style={{ gap: t.space.md }}>
      <Heading level={3}>Revision history</Heading>
      <Loaded data={data} error={error} retry={() => void mutate()} lines={2}>
        {({ revisions }) => {
          if (revisions.length === 0) return <Text tone="slate">No saved versions yet.</Text>;
          const sorted = [...revisions].sort((a, b) => b.version - a.version);
          const latest = sorted[0]!;
          const options = sorted.slice(0, 12).map((r) => ({ value: String(r.version), label: `v${r.version}` }));
          const to = picked.to ?? String(latest.version);
          const from = picked.from ?? String(sorted[1]?.version ?? latest.version);
          return (
            <View style={{ gap: t.space.md }}>
              {sorted.slice(0, 8).map((r) => (
                <Text key={r.version} variant="small">
                  <Text variant="small" weight="semibold">v{r.version}</Text> · {r.author.name} · {dateTime(r.createdAt)}
                </Text>
              ))}
              {revisions.length > 1 ? (
                <>
                  <Choice label="Compare from" options={options} value={from} onChange={(v) => setPicked((p) => ({ ...p, from: v, to }))} />
                  <Choice label="to" options={options} value={to} onChange={(v) => setPicked((p) => ({ ...p, to: v, from }))} />
                  {from === to ? <Text tone="slate">Pick two different versions to see what changed.</Text> : <DiffView caseId={caseId} from={Number(from)} to={Number(to)} />}
                </>
              ) : (
                <Text tone="slate" variant="small">Only one version so far; changes show here after the next save.</Text>
              )}
            </View>
          );
        }}
      </Loaded>
    </Card>
  );
}

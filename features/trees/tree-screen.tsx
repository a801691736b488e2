// One cause tree: read it by system, or edit it as YAML (validated on save, every problem listed).
import { useLocalSearchParams } from 'expo-router';
import { useState } from 'react';
import { View } from 'react-native';
import type { TreeDetail } from '../../shared/schemas/walks';
import { describeSpec } from '../../shared/units';
import { ApiError } from '../api/client';
import { useBreakpoint, useTheme } from '../theme/use-theme';
import { Badge } from '../ui/badges';
import { Button } from '../ui/button';
import { Notice } from '../ui/notice';
import { Loaded } from '../ui/states';
import { Card, Row, Screen } from '../ui/surfaces';
import { Heading, Text } from '../ui/text';
import { TextField } from '../ui/text-field';
import { SYSTEM_LABELS } from '../walks/labels';
import { saveTree, useTree } from './api';
import { Icon } from '../ui/icon';

function TreeRead({ detail }: { detail: TreeDetail }) {
  const t = useTheme();
  return (
    <View style={{ gap: t.space.md }}>
      <Text>{detail.tree.description}</Text>
      {detail.tree.branches.map((branch, b) => (
        <Card key={`${branch.system}-${b}`} style={{ gap: t.space.sm }}>
          <Heading level={2}>{branch.title ?? SYSTEM_LABELS[branch.system]}</Heading>
          {branch.causes.map((c) => (
            <View key={c.id} style={{ gap: t.space.xxs, borderTopWidth: 1, borderColor: t.colour.line, paddingTop: t.space.sm }}>
              <Text weight="semibold">{c.title}</Text>
              <Text variant="small" tone="slate">
                {c.id} · weight {c.weight} · {c.minutes} min{c.scope ? ` · scope ${c.scope}` : ''}
                {c.test.spec ? ` · spec ${describeSpec(c.test.spec)}` : ''}
              </Text>
              {c.caution ? <Badge label="Has a caution" symbol="warning" tone="amber" /> : null}
            </View>
          ))}
        </Card>
      ))}
    </View>
  );
}

function TreeEdit({ detail, onSaved, onCancel }: { detail: TreeDetail; onSaved: (d: TreeDetail) => void; onCancel: () => void }) {
  const [yaml, setYaml] = useState(detail.yaml);
  const [busy, setBusy] = useState(false);
  const [problems, setProblems] = useState<string[]>([]);
  const [error, setError] = useState<string | null>(null);
  const save = async () => {
    setBusy(true);
    setProblems([]);
    setError(null);
    try {
      const { tree } = await saveTree(detail.id, yaml);
      onSaved(tree);
    } catch (err) {
      if (err instanceof ApiError) {
        const body = err.body as { problems?: unknown } | null;
        setError(err.message);
        setProblems(Array.isArray(body?.problems) ? body.problems.map(String) : []);
      } else setError('Could not save the tree.');
    } finally {
      setBusy(false);
    }
  };
  return (
    <View style={{ gap: 12 }}>
      <Text tone="slate">The format is described in content/trees/README.md. Never rename or remove a cause id that cases point at; change its title, text or numbers instead.</Text>
      {error ? <Notice tone="error">{error}</Notice> : null}
      {problems.length ? (
        <Card accessibilityLabel="Problems">
          {problems.map((p, i) => (
            <Row key={i} style={{ gap: 4, alignItems: 'flex-start' }}>
              <Icon name="close" size={14} tone="brick" />
              <Text mono variant="small" style={{ flexShrink: 1 }}>
                {p}
              </Text>
            </Row>
          ))}
        </Card>
      ) : null}
      <TextField label="Tree as YAML" value={yaml} onChangeText={setYaml} multiline mono autoCapitalize="none" autoCorrect={false} spellCheck={false} style={{ minHeight: 480 }} />
      <Row wrap>
        <Button label="Save tree" icon="check" onPress={save} busy={busy} />
        <Button label="Cancel" kind="quiet" onPress={onCancel} disabled={busy} />
      </Row>
    </View>
  );
}

export function TreeScreen() {
  const { treeId } = useLocalSearchParams<{ treeId: string }>();
  const { isWide } = useBreakpoint();
  const { data, error, mutate } = useTree(typeof treeId === 'string' ? treeId : null);
  const [editing, setEditing] = useState(false);
  const [saved, setSaved] = useState(false);
  return (
    <Screen width={isWide ? 'content' : 'reading'}>
      <Loaded data={data} error={error} retry={() => void mutate()} lines={6}>
        {({ tree }) => (
          <>
            <Row wrap style={{ justifyContent: 'space-between' }}>
              <Heading>{tree.title}</Heading>
              {editing ? null : <Button label="Edit as YAML" icon="edit" kind="secondary" onPress={() => { setSaved(false); setEditing(true); }} />}
            </Row>
            <Row wrap>
              {tree.source === 'shop' ? <Badge label={`Edited by ${tree.updatedBy?.name ?? 'this shop'}`} symbol="edit" tone="amber" /> : <Badge label="As shipped" symbol="open" />}
              <Text variant="small" tone="slate">
                {tree.causes} causes
              </Text>
            </Row>
            {saved ? <Notice tone="success">Saved. New walks in this shop use this version.</Notice> : null}
            {editing ? (
              <TreeEdit
                detail={tree}
                onCancel={() => setEditing(false)}
                onSaved={(d) => {
                  void mutate({ tree: d }, { revalidate: false });
                  setEditing(false);
                  setSaved(true);
                }}
              />
            ) : (
              <TreeRead detail={tree} />
            )}
          </>
        )}
      </Loaded>
    </Screen>
  );
}

// Cause trees for seniors: the authored trees and which ones this shop has edited.
import { Link, type Href } from 'expo-router';
import { View } from 'react-native';
import type { TreeSummary } from '../../shared/schemas/walks';
import { useTheme } from '../theme/use-theme';
import { Badge, CodeChip } from '../ui/badges';
import { EmptyState, Loaded } from '../ui/states';
import { Card, Row, Screen } from '../ui/surfaces';
import { Heading, Text } from '../ui/text';
import { SYSTEM_LABELS } from '../walks/labels';
import { useTrees } from './api';

function TreeCard({ tree }: { tree: TreeSummary }) {
  const t = useTheme();
  return (
    <Link href={`/trees/${tree.id}` as Href} accessibilityLabel={tree.title}>
      <Card style={{ gap: t.space.sm, width: '100%' }}>
        <Row wrap style={{ justifyContent: 'space-between' }}>
          <Text serif weight="semibold" variant="lead" style={{ flexShrink: 1 }}>
            {tree.title}
          </Text>
          {tree.source === 'shop' ? <Badge label="Edited by this shop" symbol="edit" tone="amber" /> : <Badge label="As shipped" symbol="open" />}
        </Row>
        <Text variant="small" tone="slate">
          {tree.causes} causes · {tree.systems.map((s) => SYSTEM_LABELS[s as keyof typeof SYSTEM_LABELS] ?? s).join(', ')}
        </Text>
        {tree.codes.length ? (
          <Row wrap>
            {tree.codes.slice(0, 8).map((c) => (
              <CodeChip key={c} code={c} />
            ))}
            {tree.codes.length > 8 ? <Text variant="small">+{tree.codes.length - 8} more</Text> : null}
          </Row>
        ) : null}
        {tree.updatedBy ? (
          <Text variant="caption" tone="slate">
            Edited by {tree.updatedBy.name}
          </Text>
        ) : null}
      </Card>
    </Link>
  );
}

export function TreesScreen() {
  const t = useTheme();
  const { data, error, mutate } = useTrees();
  return (
    <Screen>
      <Heading>Cause trees</Heading>
      <Text tone="slate">One tree per kind of fault: systems, the causes in each, their tests, minutes and base weights. Walks start from these; an edit here applies to this shop only.</Text>
      <Loaded data={data} error={error} retry={() => void mutate()} lines={5}>
        {({ trees }) =>
          trees.length === 0 ? (
            <EmptyState title="No cause trees" hint="The trees ship in content/trees; none were found on this server." />
          ) : (
            <View style={{ gap: t.space.md }}>
              {trees.map((tree) => (
                <TreeCard key={tree.id} tree={tree} />
              ))}
            </View>
          )
        }
      </Loaded>
    </Screen>
  );
}

// "Seen before": the shop's confirmed cases closest to this walk, shown before the first step,
// with the cause they found and a link to the case (docs/cause-walk.md §4).
import type { Href } from 'expo-router';
import { View } from 'react-native';
import type { PrecedentView } from '../../shared/schemas/walks';
import { useTheme } from '../theme/use-theme';
import { LinkText } from '../ui/link-text';
import { Card } from '../ui/surfaces';
import { Heading, Text } from '../ui/text';
import { percent } from './labels';

function PrecedentLine({ p }: { p: PrecedentView }) {
  const t = useTheme();
  const found = p.causeTitle ?? (p.cause ? p.cause : null);
  return (
    <View style={{ gap: 2 }}>
      <LinkText href={`/cases/${p.caseId}` as Href}>{p.title}</LinkText>
      <Text variant="small">{found ? `Found: ${found}` : 'Confirmed fix; no tree cause linked yet'}</Text>
      <Text variant="caption" tone="slate" style={{ marginBottom: t.space.xxs }}>
        {`${percent(p.similarity)} alike (codes, platform, symptoms and recent work)`}
      </Text>
    </View>
  );
}

export function Precedents({ precedents }: { precedents: PrecedentView[] }) {
  const t = useTheme();
  if (precedents.length === 0) return null;
  const heading = precedents[0]!.sameEngine ? 'Seen before on this engine' : 'Seen before in this shop';
  return (
    <Card accessibilityLabel={heading} style={{ gap: t.space.xs, padding: t.space.md, borderLeftWidth: 4, borderLeftColor: t.colour.moss }}>
      <Heading level={3}>{heading}</Heading>
      {precedents.map((p) => (
        <PrecedentLine key={p.caseId} p={p} />
      ))}
    </Card>
  );
}

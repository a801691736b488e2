import type { ReactNode } from 'react';
import { ScrollView, View } from 'react-native';
import { useTheme } from '../theme/use-theme';
import { Card } from '../ui/surfaces';
import { Heading, Text } from '../ui/text';

/** The calm single card that every signed-out page sits in. */
export function AuthFrame({ title, intro, children }: { title: string; intro?: string; children: ReactNode }) {
  const t = useTheme();
  return (
    <ScrollView style={{ backgroundColor: t.colour.paper }} contentContainerStyle={{ flexGrow: 1, justifyContent: 'center', alignItems: 'center', padding: t.space.lg }}>
      <View style={{ width: '100%', maxWidth: 440, gap: t.space.lg }}>
        <View style={{ gap: t.space.xs }}>
          <Text serif weight="bold" variant="title" tone="tide" accessibilityLabel="Causeway">
            ═ Causeway
          </Text>
          <Text tone="slate" variant="small">
            The shop&apos;s fault-finding knowledge base
          </Text>
        </View>
        <Card style={{ gap: t.space.lg }}>
          <Heading level={1} variant="title">
            {title}
          </Heading>
          {intro ? <Text tone="slate">{intro}</Text> : null}
          {children}
        </Card>
      </View>
    </ScrollView>
  );
}

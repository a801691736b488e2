import type { ErrorBoundaryProps } from 'expo-router';
import { View } from 'react-native';
import { useTheme } from '../theme/use-theme';
import { Button } from '../ui/button';
import { Card } from '../ui/surfaces';
import { Heading, Text } from '../ui/text';

/** Shown by Expo Router when a screen throws while rendering. */
export function ScreenErrorBoundary({ error, retry }: ErrorBoundaryProps) {
  const t = useTheme();
  return (
    <View style={{ flex: 1, backgroundColor: t.colour.paper, padding: t.space.lg, justifyContent: 'center', alignItems: 'center' }}>
      <Card style={{ maxWidth: 520, width: '100%', borderColor: t.colour.brick }}>
        <Heading level={2}>This screen hit a problem</Heading>
        <Text>Nothing you saved is lost. Try again; if it keeps happening, reload the page.</Text>
        <Text variant="small" tone="slate" mono>
          {error.message}
        </Text>
        <Button label="Try again" onPress={retry} />
      </Card>
    </View>
  );
}

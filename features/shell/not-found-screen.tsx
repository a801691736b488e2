import { Link } from 'expo-router';
import { Card, Screen } from '../ui/surfaces';
import { Heading, Text } from '../ui/text';

export function NotFoundScreen() {
  return (
    <Screen width="reading">
      <Card>
        <Heading level={2}>No page here</Heading>
        <Text>The link may be old, or the case was removed.</Text>
        <Link href="/">
          <Text tone="tide" weight="semibold">
            Back to search
          </Text>
        </Link>
      </Card>
    </Screen>
  );
}

import { useSession } from '../auth/use-session';
import { Card, Screen } from '../ui/surfaces';
import { Heading, Text } from '../ui/text';

export function HomeScreen() {
  const { user } = useSession();
  return (
    <Screen width="reading">
      <Heading>Morning, {user?.name.split(' ')[0]}</Heading>
      <Card>
        <Text serif variant="lead">
          {user?.shopName}
        </Text>
        <Text tone="slate">Search the shop&apos;s case notes by code, cylinder, symptom or platform.</Text>
      </Card>
    </Screen>
  );
}

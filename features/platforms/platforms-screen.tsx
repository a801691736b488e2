// The shop's vehicle platforms: senior techs and managers add them; everyone reads them.
import { Link, useRouter, type Href } from 'expo-router';
import { View } from 'react-native';
import { allows } from '../../shared/policy';
import { useSession } from '../auth/use-session';
import { useBreakpoint, useTheme } from '../theme/use-theme';
import { Badge } from '../ui/badges';
import { Button } from '../ui/button';
import { EmptyState, Loaded } from '../ui/states';
import { Card, Row, Screen } from '../ui/surfaces';
import { Heading, Text } from '../ui/text';
import { usePlatforms } from './api';
import { fuelLabels, inductionLabels, platformSummary, platformTitle } from './labels';

export function PlatformsScreen() {
  const t = useTheme();
  const router = useRouter();
  const { isTablet } = useBreakpoint();
  const { user } = useSession();
  const { data, error, mutate } = usePlatforms();
  const canManage = user ? allows(user, 'platforms.manage') : false;
  const add = () => router.push('/platforms/new' as Href);
  return (
    <Screen>
      <Row wrap style={{ justifyContent: 'space-between' }}>
        <Heading>Platforms</Heading>
        {canManage ? <Button label="Add a platform" icon="add" compact onPress={add} /> : null}
      </Row>
      <Text tone="slate">The engines the shop works on: which cylinders sit on which bank and the firing order, so misfires on several cylinders can be read at a glance.</Text>
      <Loaded data={data} error={error} retry={() => void mutate()} lines={4}>
        {({ platforms }) =>
          platforms.length === 0 ? (
            <EmptyState
              title="No platforms yet"
              hint={canManage ? 'Add the engines the shop sees most, with banks and firing order.' : 'A senior tech or manager adds platforms; ask one to add the engines you work on.'}
              action={canManage ? { label: 'Add a platform', onPress: add } : undefined}
            />
          ) : (
            <View style={{ flexDirection: isTablet ? 'row' : 'column', flexWrap: 'wrap', gap: t.space.md }}>
              {platforms.map((p) => (
                <Link key={p.id} href={`/platforms/${p.id}` as Href} accessibilityLabel={`${platformTitle(p)} ${p.engine}`} style={{ width: isTablet ? '48%' : '100%' }}>
                  <Card style={{ gap: t.space.xs, width: '100%' }}>
                    <Text weight="semibold" tone="tide" variant="lead">
                      {platformTitle(p)}
                    </Text>
                    <Text mono>{platformSummary(p)}</Text>
                    <Row wrap>
                      {p.fuel ? <Badge label={fuelLabels[p.fuel]} /> : null}
                      {p.induction ? <Badge label={inductionLabels[p.induction]} /> : null}
                      {p.firingOrder ? <Badge label={`Firing ${p.firingOrder.join('-')}`} /> : null}
                    </Row>
                  </Card>
                </Link>
              ))}
            </View>
          )
        }
      </Loaded>
    </Screen>
  );
}

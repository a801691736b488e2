// My walks (open first) and, for seniors and managers, the shop's walks to look over.
import { Link, useRouter, type Href } from 'expo-router';
import { View } from 'react-native';
import { isSeniorOrAbove } from '../../shared/policy';
import type { WalkSummary } from '../../shared/schemas/walks';
import { useSession } from '../auth/use-session';
import { useBreakpoint, useTheme } from '../theme/use-theme';
import { Badge, CodeChip } from '../ui/badges';
import { Button } from '../ui/button';
import { EmptyState, Loaded } from '../ui/states';
import { Card, Row, Screen } from '../ui/surfaces';
import { Heading, Text } from '../ui/text';
import { useMyWalks, useShopWalks } from './api';
import { shortDate } from './labels';

function WalkCard({ walk, showOwner }: { walk: WalkSummary; showOwner: boolean }) {
  const t = useTheme();
  const finished = walk.status === 'finished';
  return (
    <Link href={`/walks/${walk.id}` as Href} accessibilityLabel={`${walk.treeTitle}, ${finished ? 'finished' : 'open'}`}>
      <Card style={{ gap: t.space.sm, width: '100%' }}>
        <Row wrap style={{ justifyContent: 'space-between' }}>
          <Text serif weight="semibold" variant="lead" style={{ flexShrink: 1 }}>
            {walk.treeTitle}
          </Text>
          <Badge label={finished ? 'Finished' : 'Open'} symbol={finished ? 'found' : 'open'} tone={finished ? 'moss' : 'tide'} />
        </Row>
        {walk.codes.length ? (
          <Row wrap>
            {walk.codes.map((c) => (
              <CodeChip key={c} code={c} />
            ))}
          </Row>
        ) : null}
        <Text variant="small">
          {walk.platform ? `${walk.platform.make} ${walk.platform.model} ${walk.platform.engine}` : 'Platform not given'}
          {walk.symptoms.length ? ` · ${walk.symptoms.join(', ')}` : ''}
        </Text>
        <Text variant="small">{finished ? `Fault found: ${walk.confirmedCause ?? '—'}` : walk.nextStep ? `Next: ${walk.nextStep}` : 'No causes left open'}</Text>
        <Text variant="caption" tone="slate">
          {showOwner ? `${walk.owner.name} · ` : ''}
          {walk.marks} mark{walk.marks === 1 ? '' : 's'} · updated {shortDate(walk.updatedAt)}
          {walk.caseId ? ' · written up' : ''}
        </Text>
      </Card>
    </Link>
  );
}

export function WalksScreen() {
  const t = useTheme();
  const router = useRouter();
  const { user } = useSession();
  const { isWide } = useBreakpoint();
  const senior = user ? isSeniorOrAbove(user) : false;
  const mine = useMyWalks();
  const shop = useShopWalks(senior);
  const start = () => router.push('/walks/new' as Href);
  return (
    <Screen footer={isWide ? undefined : <Button grow label="New walk" icon="walk" onPress={start} />}>
      <Row wrap style={{ justifyContent: 'space-between' }}>
        <Heading>Walks</Heading>
        {isWide ? <Button label="New walk" icon="walk" onPress={start} /> : null}
      </Row>
      <Text tone="slate">Ranked causes to test, step by step. Open walks come first; they carry on where you left them, on any device.</Text>
      <Heading level={2}>My walks</Heading>
      <Loaded data={mine.data} error={mine.error} retry={() => void mine.mutate()}>
        {({ walks }) =>
          walks.length === 0 ? (
            <EmptyState title="No walks yet" hint="Start one from the codes and symptoms of the car in front of you." action={{ label: 'Start a walk', onPress: start }} />
          ) : (
            <View style={{ gap: t.space.md }}>
              {walks.map((w) => (
                <WalkCard key={w.id} walk={w} showOwner={false} />
              ))}
            </View>
          )
        }
      </Loaded>
      {senior ? (
        <>
          <Heading level={2}>The shop’s walks to look over</Heading>
          <Loaded data={shop.data} error={shop.error} retry={() => void shop.mutate()}>
            {({ walks }) => {
              const others = walks.filter((w) => w.owner.id !== user?.id);
              return others.length === 0 ? (
                <EmptyState title="Nobody else is walking a fault" hint="Walks your apprentices and technicians start appear here for you to look over." />
              ) : (
                <View style={{ gap: t.space.md }}>
                  {others.map((w) => (
                    <WalkCard key={w.id} walk={w} showOwner />
                  ))}
                </View>
              );
            }}
          </Loaded>
        </>
      ) : null}
    </Screen>
  );
}

import { Link, useRouter } from 'expo-router';
import { useState } from 'react';
import { View } from 'react-native';
import { roleLabels } from '../../shared/roles';
import { navFor } from '../shell/nav-items';
import { useTheme } from '../theme/use-theme';
import { Button } from '../ui/button';
import { Card, Screen } from '../ui/surfaces';
import { Heading, Text } from '../ui/text';
import { useSession, useSignOut } from './use-session';

const roleSummary = {
  apprentice: 'You can search, follow cause walks and write drafts; a senior tech reviews them.',
  technician: 'You can search, walk causes, write cases and send them for review.',
  senior: 'You review, publish and confirm fixes, and manage platforms and cause trees.',
  manager: 'You have every senior right, plus the team, shop settings and patterns.',
} as const;

export function AccountScreen() {
  const t = useTheme();
  const router = useRouter();
  const { user } = useSession();
  const signOut = useSignOut();
  const [busy, setBusy] = useState(false);
  if (!user) return null;
  const more = navFor(user).filter((i) => !i.primary);
  return (
    <Screen width="reading">
      <Heading>{user.name}</Heading>
      <Card>
        <Text>
          <Text weight="semibold">{roleLabels[user.role]}</Text> at {user.shopName}
        </Text>
        <Text tone="slate">{user.email}</Text>
        <Text>{roleSummary[user.role]}</Text>
      </Card>
      {more.length > 0 ? (
        <Card style={{ gap: t.space.xs }}>
          <Text weight="semibold">Shop</Text>
          {more.map((item) => (
            <Link key={item.label} href={item.href}>
              <View style={{ minHeight: t.layout.touchTarget, justifyContent: 'center' }}>
                <Text tone="tide">
                  {item.symbol} {item.label}
                </Text>
              </View>
            </Link>
          ))}
        </Card>
      ) : null}
      <Button
        label="Sign out"
        kind="secondary"
        busy={busy}
        onPress={async () => {
          setBusy(true);
          await signOut();
          router.replace('/sign-in');
        }}
      />
    </Screen>
  );
}

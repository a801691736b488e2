import { Link, useRouter, type Href } from 'expo-router';
import { View } from 'react-native';
import { allows } from '../../shared/policy';
import { useSession } from '../auth/use-session';
import { useTheme } from '../theme/use-theme';
import { EmptyState } from '../ui/states';
import { Screen } from '../ui/surfaces';
import { Text } from '../ui/text';
import { createPlatform } from './api';
import { PlatformForm } from './platform-form';

export function NewPlatformScreen() {
  const t = useTheme();
  const router = useRouter();
  const { user } = useSession();
  const canManage = user ? allows(user, 'platforms.manage') : false;
  return (
    <Screen width="reading">
      <Link href={'/platforms' as Href}>
        <View style={{ minHeight: t.layout.touchTarget, justifyContent: 'center' }}>
          <Text tone="tide">‹ All platforms</Text>
        </View>
      </Link>
      {canManage ? (
        <PlatformForm save={async (rec) => (await createPlatform(rec)).id} onSaved={(id) => router.replace(`/platforms/${id}` as Href)} onCancel={() => router.back()} />
      ) : (
        <EmptyState title="Senior techs add platforms" hint="Ask a senior tech or your manager to add this engine." />
      )}
    </Screen>
  );
}

import { useRouter, type Href } from 'expo-router';
import { allows } from '../../shared/policy';
import { useSession } from '../auth/use-session';
import { EmptyState } from '../ui/states';
import { Screen } from '../ui/surfaces';
import { createPlatform } from './api';
import { PlatformForm } from './platform-form';
import { BackLink } from '../ui/back-link';

export function NewPlatformScreen() {
  const router = useRouter();
  const { user } = useSession();
  const canManage = user ? allows(user, 'platforms.manage') : false;
  return (
    <Screen width="reading">
      <BackLink href={'/platforms' as Href} label="All platforms" />
      {canManage ? (
        <PlatformForm save={async (rec) => (await createPlatform(rec)).id} onSaved={(id) => router.replace(`/platforms/${id}` as Href)} onCancel={() => router.back()} />
      ) : (
        <EmptyState title="Senior techs add platforms" hint="Ask a senior tech or your manager to add this engine." />
      )}
    </Screen>
  );
}

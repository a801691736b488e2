// First import: Expo Router evaluates group layouts before app/_layout.tsx, and zod must be
// told not to probe eval (our CSP forbids it) before any schema is built.
import '@/features/api/zod-setup';
import { Redirect, Slot } from 'expo-router';
import { useSession } from '@/features/auth/use-session';
import { AppShell } from '@/features/shell/app-shell';
import { setShopZone } from '@/features/shell/shop-clock';
import { ErrorState, Skeleton } from '@/features/ui/states';
import { Screen } from '@/features/ui/surfaces';

export default function SignedInLayout() {
  const { user, error, refresh } = useSession();
  if (user === null) return <Redirect href="/sign-in" />;
  if (!user)
    return <Screen>{error ? <ErrorState error={error} onRetry={refresh} /> : <Skeleton lines={4} label="Opening Causeway" />}</Screen>;
  setShopZone(user.shopTimeZone);
  return (
    <AppShell user={user}>
      <Slot />
    </AppShell>
  );
}

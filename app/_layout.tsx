import '@/features/api/zod-setup';
import { Slot } from 'expo-router';
import { RootProviders } from '@/features/shell/root-providers';

export { ScreenErrorBoundary as ErrorBoundary } from '@/features/shell/error-boundary';

export default function RootLayout() {
  return (
    <RootProviders>
      <Slot />
    </RootProviders>
  );
}

// First import: Expo Router evaluates group layouts before app/_layout.tsx, and zod must be
// told not to probe eval (our CSP forbids it) before any schema is built.
import '@/features/api/zod-setup';
import { Redirect, Slot, useSegments } from 'expo-router';
import { useSession } from '@/features/auth/use-session';

export default function SignedOutLayout() {
  const { user } = useSession();
  const segments = useSegments();
  // set-password stays reachable while signed in (a manager testing an invite link).
  if (user && !segments.includes('set-password' as never)) return <Redirect href="/" />;
  return <Slot />;
}

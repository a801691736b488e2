import { useCallback } from 'react';
import { useSWRConfig } from 'swr';
import { meResponseSchema, type UserView } from '../../shared/schemas/auth';
import { api, ApiError, resetCsrfToken } from '../api/client';
import { useApi } from '../api/use-api';

export const ME_KEY = '/api/auth/me';

/** The signed-in user, null when signed out, undefined while loading. */
export function useSession(): { user: UserView | null | undefined; error: unknown; refresh: () => void } {
  const { data, error, mutate } = useApi(ME_KEY, meResponseSchema, { shouldRetryOnError: false, revalidateOnFocus: true });
  const signedOut = error instanceof ApiError && error.status === 401;
  return {
    user: signedOut ? null : data?.user,
    error: signedOut ? null : error,
    refresh: () => void mutate(),
  };
}

export function useSignOut() {
  const { mutate } = useSWRConfig();
  return useCallback(async () => {
    await api('/api/auth/logout', { method: 'POST' });
    resetCsrfToken();
    // Drop every cached response so nothing of the last user lingers.
    await mutate(() => true, undefined, { revalidate: false });
    await mutate(ME_KEY);
  }, [mutate]);
}

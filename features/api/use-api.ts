import useSWR, { type SWRConfiguration } from 'swr';
import type { z } from 'zod';
import { api } from './client';

/** SWR keyed by the API path; the response is parsed with the given shared/ schema. */
export function useApi<T>(path: string | null, schema: z.ZodType<T>, options?: SWRConfiguration<T>) {
  return useSWR<T>(path, (p: string) => api(p, {}, schema), options);
}

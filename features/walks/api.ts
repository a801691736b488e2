import { walkListSchema, walkResponseSchema, writeUpResponseSchema, type StepMarkInput, type WalkStart } from '../../shared/schemas/walks';
import { api } from '../api/client';
import { useApi } from '../api/use-api';

export const WALKS_KEY = '/api/walks';
export const walkKey = (id: number) => `${WALKS_KEY}/${id}`;

export const useMyWalks = () => useApi(`${WALKS_KEY}?mine=1`, walkListSchema);
/** The shop's walks; only fetched for seniors and managers. */
export const useShopWalks = (enabled: boolean) => useApi(enabled ? WALKS_KEY : null, walkListSchema);
export const useWalk = (id: number | null) => useApi(id ? walkKey(id) : null, walkResponseSchema, { shouldRetryOnError: false, revalidateOnFocus: true });

export type WalkStartBody = Omit<Partial<WalkStart>, 'context'> & { codes: string[]; symptoms: string[]; context?: string[] };
export const startWalk = (body: WalkStartBody) => api(WALKS_KEY, { method: 'POST', body }, walkResponseSchema);
export const sendMark = (id: number, stepId: string, mark: StepMarkInput) =>
  api(`${walkKey(id)}/steps/${encodeURIComponent(stepId)}`, { method: 'PATCH', body: mark }, walkResponseSchema);
export const writeUp = (id: number) => api(`${walkKey(id)}/write-up`, { method: 'POST' }, writeUpResponseSchema);


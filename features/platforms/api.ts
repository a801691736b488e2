import type { PlatformPatch } from '../../shared/schemas/platforms';
import { platformCreatedSchema, platformDetailResponseSchema, platformListResponseSchema } from '../../shared/schemas/platforms';
import { api } from '../api/client';
import { useApi } from '../api/use-api';

export const PLATFORMS_KEY = '/api/platforms';
export const usePlatforms = () => useApi(PLATFORMS_KEY, platformListResponseSchema);
export const usePlatform = (id: string | null) => useApi(id ? `${PLATFORMS_KEY}/${encodeURIComponent(id)}` : null, platformDetailResponseSchema, { shouldRetryOnError: false });

export const createPlatform = (body: unknown) => api(PLATFORMS_KEY, { method: 'POST', body }, platformCreatedSchema);
export const patchPlatform = (id: number, body: PlatformPatch) => api(`${PLATFORMS_KEY}/${id}`, { method: 'PATCH', body }, platformDetailResponseSchema);

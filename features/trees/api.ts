import { treeListSchema, treeResponseSchema } from '../../shared/schemas/walks';
import { api } from '../api/client';
import { useApi } from '../api/use-api';

export const TREES_KEY = '/api/trees';
export const useTrees = () => useApi(TREES_KEY, treeListSchema);
export const useTree = (id: string | null) => useApi(id ? `${TREES_KEY}/${encodeURIComponent(id)}` : null, treeResponseSchema, { shouldRetryOnError: false });
export const saveTree = (id: string, yaml: string) => api(`${TREES_KEY}/${encodeURIComponent(id)}`, { method: 'PUT', body: { yaml } }, treeResponseSchema);

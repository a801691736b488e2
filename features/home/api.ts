import { homeResponseSchema } from '../../shared/schemas/home';
import { useApi } from '../api/use-api';

export const useHome = () => useApi('/api/home', homeResponseSchema, { revalidateOnFocus: true });

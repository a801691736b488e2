import { z } from 'zod';
import { shopUserSchema, usersResponseSchema } from '../../shared/schemas/auth';
import { api } from '../api/client';
import { useApi } from '../api/use-api';

export const USERS_KEY = '/api/users';
export const useShopUsers = () => useApi(USERS_KEY, usersResponseSchema);

const userResponse = z.object({ user: shopUserSchema });
export const inviteUser = (body: { name: string; email: string; role: string }) => api(USERS_KEY, { method: 'POST', body }, userResponse);
export const patchUser = (id: number, body: { role?: string; disabled?: boolean }) => api(`${USERS_KEY}/${id}`, { method: 'PATCH', body }, userResponse);

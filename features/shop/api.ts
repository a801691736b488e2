import { shopResponseSchema, type ShopPatch } from '../../shared/schemas/shop';
import { api } from '../api/client';
import { useApi } from '../api/use-api';

export const SHOP_KEY = '/api/shop';
export const useShop = () => useApi(SHOP_KEY, shopResponseSchema);
export const saveShop = (body: ShopPatch) => api(SHOP_KEY, { method: 'PATCH', body }, shopResponseSchema);

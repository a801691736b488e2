import type { Role } from '../../shared/roles';

/** What req.user holds for a signed-in request. */
export interface SessionUser {
  id: number;
  name: string;
  email: string;
  role: Role;
  shopId: number;
  shopName: string;
  shopCountry: string | null;
  shopTimeZone: string;
}

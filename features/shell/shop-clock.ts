// Dates on screen are read in the signed-in shop's time zone, not the phone's: a case written
// at 23:30 in Auckland shows as that day on every device the shop uses. One shop per session,
// so the shell sets the zone once when the session loads and every formatter reads it.
import { dayIn, formatDate, formatDateTime } from '../../shared/shop-time';

let shopZone: string | undefined;

export function setShopZone(zone: string | undefined) {
  shopZone = zone;
}

/** "2 Dec 2026" in the shop's zone. */
export const shortDate = (iso: string) => formatDate(iso, shopZone);
/** "2 Dec 2026, 18:40" in the shop's zone. */
export const dateTime = (iso: string) => formatDateTime(iso, shopZone);
/** The shop's day now, 'YYYY-MM-DD'. */
export const shopToday = () => dayIn(shopZone ?? 'UTC');

import type { Href } from 'expo-router';
import { allows, type Permission } from '../../shared/policy';
import type { UserView } from '../../shared/schemas/auth';
import type { IconName } from '../ui/icon';

export interface NavItem {
  href: Href;
  /** Path prefix that marks this item active. */
  match: string;
  label: string;
  symbol: IconName;
  permission: Permission;
  /** Shown in the phone's bottom bar; the rest live under "More". */
  primary: boolean;
}

export const NAV_ITEMS: NavItem[] = [
  { href: '/', match: '/', label: 'Search', symbol: 'search', permission: 'search.read', primary: true },
  { href: '/cases', match: '/cases', label: 'Cases', symbol: 'cases', permission: 'cases.read', primary: true },
  { href: '/walks', match: '/walks', label: 'Walks', symbol: 'walk', permission: 'walks.use', primary: true },
  { href: '/codes', match: '/codes', label: 'Codes', symbol: 'code', permission: 'codes.read', primary: true },
  { href: '/scan', match: '/scan', label: 'Scan report', symbol: 'upload', permission: 'cases.write', primary: false },
  { href: '/platforms', match: '/platforms', label: 'Platforms', symbol: 'platform', permission: 'platforms.read', primary: false },
  { href: '/trees', match: '/trees', label: 'Cause trees', symbol: 'tree', permission: 'trees.manage', primary: false },
  { href: '/patterns', match: '/patterns', label: 'Patterns', symbol: 'patterns', permission: 'patterns.read', primary: false },
  { href: '/vehicles', match: '/vehicles', label: 'Vehicles', symbol: 'vehicle', permission: 'cases.read', primary: false },
  { href: '/team', match: '/team', label: 'Team', symbol: 'team', permission: 'users.manage', primary: false },
  { href: '/settings', match: '/settings', label: 'Shop settings', symbol: 'shop', permission: 'shop.settings', primary: false },
  { href: '/outbox', match: '/outbox', label: 'Outbox', symbol: 'mail', permission: 'outbox.read', primary: false },
  { href: '/account', match: '/account', label: 'Account', symbol: 'account', permission: 'auth.self', primary: true },
];

export function navFor(user: UserView): NavItem[] {
  return NAV_ITEMS.filter((item) => allows(user, item.permission));
}

export function isActive(item: NavItem, pathname: string): boolean {
  return item.match === '/' ? pathname === '/' : pathname === item.match || pathname.startsWith(item.match + '/');
}

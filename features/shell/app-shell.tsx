// Signed-in frame: bottom tabs on a phone, side navigation from 1024 px.
import { Link, usePathname } from 'expo-router';
import type { ReactNode } from 'react';
import { View } from 'react-native';
import { useSafeAreaInsets } from 'react-native-safe-area-context';
import { roleLabels } from '../../shared/roles';
import type { UserView } from '../../shared/schemas/auth';
import { useBreakpoint, useTheme } from '../theme/use-theme';
import { Text } from '../ui/text';
import { isActive, navFor, type NavItem } from './nav-items';
import { Icon } from '../ui/icon';

function NavLink({ item, active, compact }: { item: NavItem; active: boolean; compact: boolean }) {
  const t = useTheme();
  const tone = active ? 'tide' : 'slate';
  return (
    <Link href={item.href} aria-current={active ? 'page' : undefined} accessibilityLabel={item.label} style={{ flex: compact ? 1 : undefined }}>
      <View
        style={{
          minHeight: compact ? 56 : t.layout.touchTarget,
          flexDirection: compact ? 'column' : 'row',
          alignItems: 'center',
          justifyContent: compact ? 'center' : 'flex-start',
          gap: compact ? 2 : t.space.md,
          paddingHorizontal: compact ? t.space.xs : t.space.md,
          borderRadius: t.radius.md,
          backgroundColor: active && !compact ? t.colour.sand : 'transparent',
          borderTopWidth: compact ? 3 : 0,
          borderColor: active ? t.colour.tide : 'transparent',
        }}
      >
        <Icon name={item.symbol} size={compact ? 22 : 18} tone={tone} />
        <Text tone={active ? 'ink' : 'slate'} variant={compact ? 'caption' : 'body'} weight={active ? 'semibold' : 'regular'}>
          {item.label}
        </Text>
      </View>
    </Link>
  );
}

export function AppShell({ user, children }: { user: UserView; children: ReactNode }) {
  const t = useTheme();
  const { isWide } = useBreakpoint();
  const pathname = usePathname();
  const insets = useSafeAreaInsets();
  const items = navFor(user);
  if (isWide) {
    return (
      <View style={{ flex: 1, flexDirection: 'row', backgroundColor: t.colour.paper }}>
        <View role="navigation" aria-label="Main" style={{ width: t.layout.sideNavWidth, borderRightWidth: 1, borderColor: t.colour.line, backgroundColor: t.colour.card, padding: t.space.md, gap: t.space.xs }}>
          <Text serif weight="bold" variant="title" tone="tide" style={{ paddingHorizontal: t.space.md, paddingVertical: t.space.md }}>
            ═ Causeway
          </Text>
          {items.map((item) => (
            <NavLink key={item.label} item={item} active={isActive(item, pathname)} compact={false} />
          ))}
          <View style={{ flex: 1 }} />
          <View style={{ paddingHorizontal: t.space.md, gap: 2 }}>
            <Text weight="semibold" numberOfLines={1}>{user.name}</Text>
            <Text variant="small" tone="slate" numberOfLines={1}>{roleLabels[user.role]} · {user.shopName}</Text>
          </View>
        </View>
        <View role="main" style={{ flex: 1 }}>{children}</View>
      </View>
    );
  }
  const primary = items.filter((i) => i.primary);
  const secondary = items.filter((i) => !i.primary);
  const moreActive = secondary.some((i) => isActive(i, pathname));
  return (
    <View style={{ flex: 1, backgroundColor: t.colour.paper }}>
      <View role="main" style={{ flex: 1 }}>{children}</View>
      <View role="navigation" aria-label="Main" style={{ flexDirection: 'row', borderTopWidth: 1, borderColor: t.colour.line, backgroundColor: t.colour.card, paddingBottom: insets.bottom }}>
        {primary.map((item) => (
          <NavLink key={item.label} item={item} active={isActive(item, pathname) || (item.match === '/account' && moreActive)} compact />
        ))}
      </View>
    </View>
  );
}

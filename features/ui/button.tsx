import { ActivityIndicator, Pressable, type PressableProps, StyleSheet, View } from 'react-native';
import { useTheme } from '../theme/use-theme';
import { Icon, type IconName } from './icon';
import { Text } from './text';

export interface ButtonProps extends Omit<PressableProps, 'children' | 'style'> {
  label: string;
  kind?: 'primary' | 'secondary' | 'danger' | 'quiet';
  busy?: boolean;
  icon?: IconName;
  compact?: boolean;
  grow?: boolean;
}

export function Button({ label, kind = 'primary', busy, icon, compact, grow, disabled, ...rest }: ButtonProps) {
  const t = useTheme();
  const c = t.colour;
  const fills = {
    primary: { bg: c.tide, fg: c.tideInk, border: c.tide },
    secondary: { bg: c.card, fg: c.tide, border: c.tide },
    danger: { bg: c.card, fg: c.brick, border: c.brick },
    quiet: { bg: 'transparent', fg: c.tide, border: 'transparent' },
  }[kind];
  const off = disabled || busy;
  return (
    <Pressable
      role="button"
      accessibilityLabel={label}
      disabled={off}
      aria-disabled={off}
      aria-busy={busy}
      style={({ pressed, hovered, focused }: { pressed: boolean; hovered?: boolean; focused?: boolean }) => [
        styles.base,
        {
          minHeight: t.layout.touchTarget,
          paddingHorizontal: compact ? t.space.md : t.space.lg,
          borderRadius: t.radius.md,
          backgroundColor: fills.bg,
          borderColor: fills.border,
          opacity: off ? 0.55 : pressed ? 0.85 : 1,
          outlineColor: c.focus,
          outlineWidth: focused ? 2 : 0,
          outlineStyle: 'solid',
          flexGrow: grow ? 1 : 0,
        },
        hovered && !off ? { transform: [{ translateY: -1 }] } : null,
      ]}
      {...rest}
    >
      <View style={styles.row}>
        {busy ? <ActivityIndicator size="small" color={fills.fg} /> : icon ? <Icon name={icon} colour={fills.fg} /> : null}
        <Text weight="semibold" style={{ color: fills.fg }}>
          {label}
        </Text>
      </View>
    </Pressable>
  );
}

const styles = StyleSheet.create({
  base: { borderWidth: 1.5, justifyContent: 'center', alignItems: 'center' },
  row: { flexDirection: 'row', alignItems: 'center', gap: 8 },
});

import { View } from 'react-native';
import { useTheme } from '../theme/use-theme';
import { Text } from './text';
import { Icon } from './icon';

/** An inline message: an error that says what happened, or a quiet confirmation. */
export function Notice({ tone, children }: { tone: 'error' | 'success' | 'info'; children: string }) {
  const t = useTheme();
  const colours = {
    error: { fg: 'brick', bg: t.colour.brickFill, symbol: 'close' },
    success: { fg: 'moss', bg: t.colour.mossFill, symbol: 'check' },
    info: { fg: 'tide', bg: t.colour.sand, symbol: 'info' },
  } as const;
  const c = colours[tone];
  return (
    <View role={tone === 'error' ? 'alert' : 'status'} style={{ flexDirection: 'row', gap: t.space.sm, padding: t.space.md, borderRadius: t.radius.md, backgroundColor: c.bg }}>
      <Icon name={c.symbol} tone={c.fg} />
      <Text style={{ flex: 1 }}>{children}</Text>
    </View>
  );
}

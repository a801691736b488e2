import { Pressable, View } from 'react-native';
import { composeCaution } from '../../shared/walk/cautions';
import type { ColourName } from '../theme/tokens';
import { useTheme } from '../theme/use-theme';
import { Icon, type IconName } from './icon';
import { Text } from './text';

/** A status word with a symbol; colour is never the only signal. */
export function Badge({ label, symbol, tone = 'slate' }: { label: string; symbol?: IconName; tone?: ColourName }) {
  const t = useTheme();
  return (
    <View
      style={{
        flexDirection: 'row',
        alignItems: 'center',
        gap: 4,
        paddingHorizontal: t.space.sm,
        paddingVertical: 2,
        borderRadius: t.radius.pill,
        borderWidth: 1,
        borderColor: t.colour[tone],
        alignSelf: 'flex-start',
      }}
    >
      {symbol ? <Icon name={symbol} size={13} tone={tone} /> : null}
      <Text variant="caption" weight="semibold" tone={tone}>
        {label}
      </Text>
    </View>
  );
}

/** Trouble codes and readings in a monospace chip so they scan at a glance. */
export function CodeChip({ code, onRemove }: { code: string; onRemove?: () => void }) {
  const t = useTheme();
  return (
    <View style={{ flexDirection: 'row', alignItems: 'center', backgroundColor: t.colour.sand, borderRadius: t.radius.sm, paddingHorizontal: t.space.sm, paddingVertical: 2, gap: 4 }}>
      <Text mono variant="small" weight="semibold">
        {code}
      </Text>
      {onRemove ? (
        <Pressable role="button" accessibilityLabel={`Remove ${code}`} onPress={onRemove} style={{ paddingHorizontal: 4 }}>
          <Icon name="close" size={14} tone="slate" />
        </Pressable>
      ) : null}
    </View>
  );
}

/** Caution for work that can hurt someone: the word, an icon and amber, and the deferral. */
/** A safety caution: the text worded once ("Caution:" is drawn here) with the one standard deferral at the end. */
export function Caution({ children }: { children: string }) {
  const t = useTheme();
  return (
    <View role="note" style={{ flexDirection: 'row', gap: t.space.sm, padding: t.space.md, borderRadius: t.radius.md, borderLeftWidth: 4, borderColor: t.colour.amber, backgroundColor: t.colour.amberFill }}>
      <Icon name="warning" tone="amber" />
      <Text style={{ flex: 1 }}>
        <Text weight="bold" tone="amber">
          Caution:{' '}
        </Text>
        {composeCaution([children])}
      </Text>
    </View>
  );
}

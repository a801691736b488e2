import { Pressable, View } from 'react-native';
import { useTheme } from '../theme/use-theme';
import { Text } from './text';
import { Icon } from './icon';

/** A row of mutually exclusive options (role pickers, filters); each at least 44 px tall. */
export function Choice<T extends string>({ label, options, value, onChange }: { label: string; options: readonly { value: T; label: string }[]; value: T; onChange: (v: T) => void }) {
  const t = useTheme();
  return (
    <View style={{ gap: t.space.xs }}>
      <Text variant="small" weight="semibold">
        {label}
      </Text>
      <View role="radiogroup" aria-label={label} style={{ flexDirection: 'row', flexWrap: 'wrap', gap: t.space.xs }}>
        {options.map((o) => {
          const selected = o.value === value;
          return (
            <Pressable
              key={o.value}
              role="radio"
              aria-checked={selected}
              onPress={() => onChange(o.value)}
              style={{
                minHeight: t.layout.touchTarget,
                justifyContent: 'center',
                paddingHorizontal: t.space.md,
                borderRadius: t.radius.pill,
                borderWidth: 1.5,
                borderColor: selected ? t.colour.tide : t.colour.line,
                backgroundColor: selected ? t.colour.tide : t.colour.card,
              }}
            >
              <View style={{ flexDirection: 'row', alignItems: 'center', gap: t.space.xs }}>
                {selected ? <Icon name="check" size={14} colour={t.colour.tideInk} /> : null}
                <Text weight={selected ? 'semibold' : 'regular'} style={{ color: selected ? t.colour.tideInk : t.colour.ink }}>
                  {o.label}
                </Text>
              </View>
            </Pressable>
          );
        })}
      </View>
    </View>
  );
}

import { Text as RNText, type TextProps } from 'react-native';
import type { ColourName } from '../theme/tokens';
import { useTheme } from '../theme/use-theme';

export interface ThemedTextProps extends TextProps {
  variant?: 'caption' | 'small' | 'body' | 'lead' | 'title' | 'display';
  tone?: ColourName;
  /** Source Serif 4 for reading text and headings; system sans otherwise. */
  serif?: boolean;
  weight?: 'regular' | 'semibold' | 'bold';
  mono?: boolean;
}

export function Text({ variant = 'body', tone = 'ink', serif, weight = 'regular', mono, style, ...rest }: ThemedTextProps) {
  const t = useTheme();
  const serifFamily = weight === 'bold' ? t.fonts.serifBold : weight === 'semibold' ? t.fonts.serifSemiBold : t.fonts.serif;
  const fontFamily = mono ? t.fonts.mono : serif ? serifFamily : t.fonts.sans;
  const fontWeight = serif ? undefined : weight === 'bold' ? '700' : weight === 'semibold' ? '600' : '400';
  return (
    <RNText
      style={[t.type[variant], { color: t.colour[tone], fontFamily, fontWeight, fontVariant: mono ? ['tabular-nums'] : undefined }, style]}
      {...rest}
    />
  );
}

export function Heading({ level = 1, ...rest }: ThemedTextProps & { level?: 1 | 2 | 3 }) {
  const variant = level === 1 ? 'display' : level === 2 ? 'title' : 'lead';
  return <Text role="heading" aria-level={level} serif weight="semibold" variant={variant} {...rest} />;
}

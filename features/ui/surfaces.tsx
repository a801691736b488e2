import type { ReactNode } from 'react';
import { ScrollView, View, type ViewProps } from 'react-native';
import { useTheme } from '../theme/use-theme';

export function Card({ style, ...rest }: ViewProps) {
  const t = useTheme();
  return (
    <View
      style={[
        { backgroundColor: t.colour.card, borderRadius: t.radius.lg, borderWidth: 1, borderColor: t.colour.line, padding: t.space.lg, gap: t.space.md },
        style,
      ]}
      {...rest}
    />
  );
}

/** A scrolling page with the content width capped; `footer` stays at the bottom within thumb reach. */
export function Screen({ children, footer, width = 'content' }: { children: ReactNode; footer?: ReactNode; width?: 'reading' | 'content' | 'full' }) {
  const t = useTheme();
  const maxWidth = width === 'reading' ? t.layout.readingWidth : width === 'content' ? t.layout.contentMax : undefined;
  return (
    <View style={{ flex: 1, backgroundColor: t.colour.paper }}>
      <ScrollView contentContainerStyle={{ padding: t.space.lg, paddingBottom: t.space.xxxl, alignItems: 'center' }} keyboardShouldPersistTaps="handled">
        <View style={{ width: '100%', maxWidth, gap: t.space.lg }}>{children}</View>
      </ScrollView>
      {footer ? (
        <View style={{ borderTopWidth: 1, borderColor: t.colour.line, backgroundColor: t.colour.card, padding: t.space.md, alignItems: 'center' }}>
          <View style={{ width: '100%', maxWidth, flexDirection: 'row', gap: t.space.sm }}>{footer}</View>
        </View>
      ) : null}
    </View>
  );
}

export function Row({ style, wrap, ...rest }: ViewProps & { wrap?: boolean }) {
  const t = useTheme();
  return <View style={[{ flexDirection: 'row', alignItems: 'center', gap: t.space.sm, flexWrap: wrap ? 'wrap' : 'nowrap' }, style]} {...rest} />;
}

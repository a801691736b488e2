// A plain table that wraps its text instead of scrolling sideways; the first column takes the room.
import type { ReactNode } from 'react';
import { View } from 'react-native';
import { useTheme } from '../theme/use-theme';
import { Text } from '../ui/text';

export interface Column {
  label: string;
  /** Relative width; numbers columns stay narrow. */
  flex?: number;
  numeric?: boolean;
}

export function DataTable({ label, columns, rows, empty }: { label: string; columns: Column[]; rows: ReactNode[][]; empty: string }) {
  const t = useTheme();
  const cell = (c: Column) => ({ flex: c.flex ?? 1, minWidth: 0, alignItems: c.numeric ? ('flex-end' as const) : ('flex-start' as const) });
  if (rows.length === 0)
    return (
      <Text tone="slate" variant="small">
        {empty}
      </Text>
    );
  return (
    <View role="table" aria-label={label}>
      <View role="row" style={{ flexDirection: 'row', gap: t.space.sm, paddingBottom: t.space.xs, borderBottomWidth: 1, borderColor: t.colour.line }}>
        {columns.map((c) => (
          <View key={c.label} role="columnheader" style={cell(c)}>
            <Text variant="caption" weight="semibold" tone="slate" style={{ textAlign: c.numeric ? 'right' : 'left' }}>
              {c.label}
            </Text>
          </View>
        ))}
      </View>
      {rows.map((row, i) => (
        <View key={i} role="row" style={{ flexDirection: 'row', gap: t.space.sm, paddingVertical: t.space.xs, borderBottomWidth: 1, borderColor: t.colour.line, minHeight: 32, alignItems: 'center' }}>
          {row.map((value, j) => (
            <View key={j} role="cell" style={cell(columns[j] ?? { label: '' })}>
              {typeof value === 'string' || typeof value === 'number' ? (
                <Text variant="small" mono={columns[j]?.numeric} style={{ textAlign: columns[j]?.numeric ? 'right' : 'left' }}>
                  {value}
                </Text>
              ) : (
                value
              )}
            </View>
          ))}
        </View>
      ))}
    </View>
  );
}

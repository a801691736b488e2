import { useId } from 'react';
import { TextInput, type TextInputProps, View } from 'react-native';
import { useTheme } from '../theme/use-theme';
import { Text } from './text';

export interface TextFieldProps extends TextInputProps {
  label: string;
  error?: string;
  hint?: string;
  mono?: boolean;
}

export function TextField({ label, error, hint, mono, style, multiline, ...rest }: TextFieldProps) {
  const t = useTheme();
  const id = useId();
  return (
    <View style={{ gap: t.space.xs }}>
      <Text nativeID={`${id}-label`} variant="small" weight="semibold">
        {label}
      </Text>
      <TextInput
        aria-labelledby={`${id}-label`}
        aria-invalid={Boolean(error)}
        aria-describedby={error ? `${id}-error` : hint ? `${id}-hint` : undefined}
        placeholderTextColor={t.colour.slate}
        multiline={multiline}
        style={[
          t.type.body,
          {
            minHeight: t.layout.touchTarget,
            paddingHorizontal: t.space.md,
            paddingVertical: t.space.sm,
            borderWidth: 1.5,
            borderRadius: t.radius.md,
            borderColor: error ? t.colour.brick : t.colour.line,
            backgroundColor: t.colour.card,
            color: t.colour.ink,
            fontFamily: mono ? t.fonts.mono : t.fonts.sans,
            textAlignVertical: multiline ? 'top' : 'center',
          },
          style,
        ]}
        {...rest}
      />
      {error ? (
        <Text nativeID={`${id}-error`} variant="small" tone="brick" role="alert">
          {error}
        </Text>
      ) : hint ? (
        <Text nativeID={`${id}-hint`} variant="small" tone="slate">
          {hint}
        </Text>
      ) : null}
    </View>
  );
}

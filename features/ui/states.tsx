// Loading, empty and error states: every screen shows one of these instead of a blank page.
import { useEffect, useRef } from 'react';
import { Animated, View } from 'react-native';
import { useTheme } from '../theme/use-theme';
import { Button } from './button';
import { Card } from './surfaces';
import { Text } from './text';

export function Skeleton({ lines = 3, label = 'Loading' }: { lines?: number; label?: string }) {
  const t = useTheme();
  const pulse = useRef(new Animated.Value(0.5)).current;
  useEffect(() => {
    const loop = Animated.loop(
      Animated.sequence([
        Animated.timing(pulse, { toValue: 1, duration: 700, useNativeDriver: false }),
        Animated.timing(pulse, { toValue: 0.5, duration: 700, useNativeDriver: false }),
      ]),
    );
    loop.start();
    return () => loop.stop();
  }, [pulse]);
  return (
    <View aria-busy accessibilityLabel={label} role="progressbar" style={{ gap: t.space.md }}>
      {Array.from({ length: lines }, (_, i) => (
        <Animated.View
          key={i}
          style={{ height: i === 0 ? 28 : 64, borderRadius: t.radius.md, backgroundColor: t.colour.sand, opacity: pulse, width: i === 0 ? '60%' : '100%' }}
        />
      ))}
    </View>
  );
}

export function EmptyState({ title, hint, action }: { title: string; hint: string; action?: { label: string; onPress: () => void } }) {
  const t = useTheme();
  return (
    <Card style={{ alignItems: 'flex-start', gap: t.space.sm }}>
      <Text serif weight="semibold" variant="lead">
        {title}
      </Text>
      <Text tone="slate">{hint}</Text>
      {action ? <Button label={action.label} kind="secondary" onPress={action.onPress} /> : null}
    </Card>
  );
}

export function ErrorState({ error, onRetry }: { error: unknown; onRetry?: () => void }) {
  const t = useTheme();
  const message = error instanceof Error ? error.message : 'Something went wrong.';
  return (
    <Card role="alert" style={{ borderColor: t.colour.brick, backgroundColor: t.colour.brickFill }}>
      <Text weight="semibold" tone="brick">
        Could not load this
      </Text>
      <Text>{message}</Text>
      {onRetry ? <Button label="Try again" kind="secondary" onPress={onRetry} /> : null}
    </Card>
  );
}

/** The usual trio for SWR data: skeleton while loading, error with retry, else the content. */
export function Loaded<T>({ data, error, retry, children, lines }: { data: T | undefined; error: unknown; retry?: () => void; children: (data: T) => React.ReactNode; lines?: number }) {
  if (error) return <ErrorState error={error} onRetry={retry} />;
  if (data === undefined) return <Skeleton lines={lines} />;
  return <>{children(data)}</>;
}

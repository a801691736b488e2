import { Link, type Href } from 'expo-router';
import { View } from 'react-native';
import { useTheme } from '../theme/use-theme';
import { Text } from './text';

/** "‹ All cases" and the like: the way back to a list, with a full-size touch target. */
export function BackLink({ href, label }: { href: Href; label: string }) {
  const t = useTheme();
  return (
    <Link href={href}>
      <View style={{ minHeight: t.layout.touchTarget, justifyContent: 'center' }}>
        <Text tone="tide">‹ {label}</Text>
      </View>
    </Link>
  );
}

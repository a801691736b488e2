import { Link, type Href } from 'expo-router';
import { Text } from './text';

/** An in-app link inside running text: underlined, in the link colour. */
export function LinkText({ href, children }: { href: Href; children: string }) {
  return (
    <Link href={href}>
      <Text tone="tide" weight="semibold" style={{ textDecorationLine: 'underline' }}>
        {children}
      </Text>
    </Link>
  );
}

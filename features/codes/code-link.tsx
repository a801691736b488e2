// A trouble code chip that opens the code's page: use it wherever a code is shown.
import { Link } from 'expo-router';
import { View } from 'react-native';
import { useTheme } from '../theme/use-theme';
import { CodeChip } from '../ui/badges';

/** `code` may carry a failure type byte ('P0302-13'); the page explains both. */
export function CodeLink({ code, label }: { code: string; label?: string }) {
  const t = useTheme();
  return (
    <Link href={`/codes/${encodeURIComponent(code)}`} accessibilityLabel={label ?? `Trouble code ${code}`}>
      <View style={{ minHeight: t.layout.touchTarget, justifyContent: 'center' }}>
        <CodeChip code={code} />
      </View>
    </Link>
  );
}

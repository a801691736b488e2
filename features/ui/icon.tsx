// Icons from one bundled set (Feather via @expo/vector-icons; its font ships inside the app),
// named by what they mean here. An icon is decoration: every use keeps a text label beside it.
import Feather from '@expo/vector-icons/Feather';
import type { ColourName } from '../theme/tokens';
import { useTheme } from '../theme/use-theme';
import { ICONS, type IconName } from './icon-names';

export type { IconName };

export function Icon({ name, size = 18, tone, colour }: { name: IconName; size?: number; tone?: ColourName; colour?: string }) {
  const t = useTheme();
  return <Feather name={ICONS[name]} size={size} color={colour ?? t.colour[tone ?? 'ink']} aria-hidden accessibilityElementsHidden importantForAccessibility="no" />;
}

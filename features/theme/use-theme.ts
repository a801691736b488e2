import { useColorScheme, useWindowDimensions } from 'react-native';
import { fonts, layout, palette, radius, space, type, type Palette } from './tokens';

export interface Theme {
  scheme: 'light' | 'dark';
  colour: Palette;
  fonts: typeof fonts;
  type: typeof type;
  space: typeof space;
  radius: typeof radius;
  layout: typeof layout;
}

/** The theme for the system's light or dark setting. */
export function useTheme(): Theme {
  const scheme = useColorScheme() === 'dark' ? 'dark' : 'light';
  return { scheme, colour: palette[scheme], fonts, type, space, radius, layout };
}

/** Phone, tablet or wide, from the window width. */
export function useBreakpoint() {
  const { width } = useWindowDimensions();
  return {
    width,
    isWide: width >= layout.wideFrom,
    isTablet: width >= layout.tabletFrom,
    isPhone: width < layout.tabletFrom,
  };
}

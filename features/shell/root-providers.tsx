import { SourceSerif4_400Regular } from '@expo-google-fonts/source-serif-4/400Regular';
import { SourceSerif4_400Regular_Italic } from '@expo-google-fonts/source-serif-4/400Regular_Italic';
import { SourceSerif4_600SemiBold } from '@expo-google-fonts/source-serif-4/600SemiBold';
import { SourceSerif4_700Bold } from '@expo-google-fonts/source-serif-4/700Bold';
import { useFonts } from 'expo-font';
import { StatusBar } from 'expo-status-bar';
import type { ReactNode } from 'react';
import { View } from 'react-native';
import { SafeAreaProvider } from 'react-native-safe-area-context';
import { SWRConfig } from 'swr';
import { ApiError } from '../api/client';
import { useTheme } from '../theme/use-theme';

// Only the weights Causeway uses, each from its own file (the package index pulls all 16).
const FONT_FILES = { SourceSerif4_400Regular, SourceSerif4_400Regular_Italic, SourceSerif4_600SemiBold, SourceSerif4_700Bold };

export function RootProviders({ children }: { children: ReactNode }) {
  const t = useTheme();
  // Screens render at once in the fallback face and swap when the fonts arrive: on a phone
  // network, waiting for 330 KB of fonts would hold back the first screen by seconds.
  useFonts(FONT_FILES);
  return (
    <SafeAreaProvider>
      <SWRConfig value={{ shouldRetryOnError: (err) => !(err instanceof ApiError && err.status < 500 && err.status > 0), errorRetryCount: 3 }}>
        <StatusBar style={t.scheme === 'dark' ? 'light' : 'dark'} />
        <View style={{ flex: 1, backgroundColor: t.colour.paper }}>{children}</View>
      </SWRConfig>
    </SafeAreaProvider>
  );
}

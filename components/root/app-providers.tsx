import { AtkinsonHyperlegible_400Regular } from '@expo-google-fonts/atkinson-hyperlegible/400Regular';
import { AtkinsonHyperlegible_700Bold } from '@expo-google-fonts/atkinson-hyperlegible/700Bold';
import { IBMPlexMono_400Regular } from '@expo-google-fonts/ibm-plex-mono/400Regular';
import { IBMPlexMono_500Medium } from '@expo-google-fonts/ibm-plex-mono/500Medium';
import { QueryClientProvider } from '@tanstack/react-query';
import { useFonts } from 'expo-font';
import { useEffect, useState, type ReactNode } from 'react';
import { Platform } from 'react-native';
import { SafeAreaProvider } from 'react-native-safe-area-context';
import { setUnauthorizedHandler } from '../../hooks/api-client';
import { createQueryClient } from '../../hooks/queries/query-client';
import { markSignedOut } from '../../hooks/queries/session';
import { fontFiles, ThemeProvider } from '../theme';
import { iconFont } from '../ui/icon';

const FONTS = {
  [fontFiles.sans]: AtkinsonHyperlegible_400Regular,
  [fontFiles.sansBold]: AtkinsonHyperlegible_700Bold,
  [fontFiles.mono]: IBMPlexMono_400Regular,
  [fontFiles.monoMedium]: IBMPlexMono_500Medium,
  ...iconFont,
};

export function AppProviders({ children }: { children: ReactNode }) {
  const [queryClient] = useState(createQueryClient);
  const [fontsLoaded, fontError] = useFonts(FONTS);

  useEffect(() => {
    // Any 401 from a signed-in request means the session ended: the guard then shows sign-in.
    setUnauthorizedHandler(() => markSignedOut(queryClient));
    return () => setUnauthorizedHandler(null);
  }, [queryClient]);

  // The web shows text in a fallback face until the shipped files arrive; native waits for them.
  if (Platform.OS !== 'web' && !fontsLoaded && !fontError) return null;

  return (
    <SafeAreaProvider>
      <ThemeProvider>
        <QueryClientProvider client={queryClient}>{children}</QueryClientProvider>
      </ThemeProvider>
    </SafeAreaProvider>
  );
}

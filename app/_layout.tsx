import { Barlow_400Regular } from '@expo-google-fonts/barlow/400Regular';
import { Barlow_500Medium } from '@expo-google-fonts/barlow/500Medium';
import { Barlow_600SemiBold } from '@expo-google-fonts/barlow/600SemiBold';
import { Barlow_700Bold } from '@expo-google-fonts/barlow/700Bold';
import { JetBrainsMono_400Regular } from '@expo-google-fonts/jetbrains-mono/400Regular';
import { JetBrainsMono_700Bold } from '@expo-google-fonts/jetbrains-mono/700Bold';
import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { useFonts } from 'expo-font';
import { Stack } from 'expo-router';
import { useState } from 'react';

import { DemoBanner } from '@/components/ui/demo-banner';
import { GlobalStyle } from '@/components/ui/global-style';
import { Pending } from '@/components/ui/query-state';
import { colors } from '@/constants/theme';
import { useMeQuery } from '@/hooks/use-me';

function Navigator() {
  const me = useMeQuery();
  if (me.isPending) return <Pending label="Opening Lobewright…" />;
  const signedIn = Boolean(me.data);
  return (
    <Stack screenOptions={{ headerShown: false, contentStyle: { backgroundColor: colors.paper } }}>
      <Stack.Protected guard={signedIn}>
        <Stack.Screen name="(app)" />
      </Stack.Protected>
      <Stack.Protected guard={!signedIn}>
        <Stack.Screen name="(auth)" />
      </Stack.Protected>
      {/* The owner's summary opens from a share link, signed in or not. */}
      <Stack.Screen name="share/[token]" />
      <Stack.Screen name="share/back" />
      {/* Links from our mail: they work signed in or not. */}
      <Stack.Screen name="verified" />
      <Stack.Screen name="reset-password" />
      <Stack.Screen name="invitations/[id]" />
      <Stack.Screen name="+not-found" />
    </Stack>
  );
}

export default function RootLayout() {
  const [queryClient] = useState(() => new QueryClient({ defaultOptions: { queries: { refetchOnWindowFocus: true, retry: 1 } } }));
  const [fontsLoaded, fontError] = useFonts({
    Barlow_400Regular,
    Barlow_500Medium,
    Barlow_600SemiBold,
    Barlow_700Bold,
    JetBrainsMono_400Regular,
    JetBrainsMono_700Bold,
  });
  // A font that fails to load falls back to the system face rather than blocking the app.
  if (!fontsLoaded && !fontError) return null;
  return (
    <QueryClientProvider client={queryClient}>
      <GlobalStyle />
      <DemoBanner />
      <Navigator />
    </QueryClientProvider>
  );
}

import { QueryClientProvider } from '@tanstack/react-query';
import { useFonts } from 'expo-font';
import { SplashScreen, Stack } from 'expo-router';
import { StatusBar } from 'expo-status-bar';
import { useEffect, useState } from 'react';
import { SafeAreaProvider } from 'react-native-safe-area-context';
import { ErrorState, LoadingState } from '@/components/states';
import { colours, fonts } from '@/components/theme';
import { useSession } from '@/hooks/use-session';
import { makeQueryClient } from '@/lib/query-client';

SplashScreen.preventAutoHideAsync().catch(() => undefined);

export default function RootLayout() {
  const [fontsLoaded, fontError] = useFonts({
    [fonts.text]: require('@/fonts/AtkinsonHyperlegible_400Regular.ttf'),
    [fonts.textBold]: require('@/fonts/AtkinsonHyperlegible_700Bold.ttf'),
    [fonts.mono]: require('@/fonts/IBMPlexMono_400Regular.ttf'),
    [fonts.monoBold]: require('@/fonts/IBMPlexMono_600SemiBold.ttf'),
  });
  const [queryClient] = useState(makeQueryClient);
  const ready = fontsLoaded || !!fontError;
  useEffect(() => {
    if (ready) SplashScreen.hideAsync().catch(() => undefined);
  }, [ready]);
  if (!ready) return null;
  return (
    <QueryClientProvider client={queryClient}>
      <SafeAreaProvider>
        <StatusBar style="light" />
        <RootStack />
      </SafeAreaProvider>
    </QueryClientProvider>
  );
}

function RootStack() {
  const session = useSession();
  if (session.isPending) return <LoadingState what="Ampwright" />;
  if (session.isError && session.data === undefined) {
    return <ErrorState error={session.error} onRetry={() => session.refetch()} />;
  }
  const signedIn = !!session.data;
  return (
    <Stack
      screenOptions={{
        headerStyle: { backgroundColor: colours.ink },
        headerTintColor: colours.paper,
        headerTitleStyle: { fontFamily: fonts.textBold },
        contentStyle: { backgroundColor: colours.paper },
      }}
    >
      <Stack.Protected guard={signedIn}>
        <Stack.Screen name="(tabs)" options={{ headerShown: false }} />
        <Stack.Screen name="buildings/[buildingId]" options={{ title: 'Building' }} />
        <Stack.Screen name="panels/[panelId]/index" options={{ title: 'Panel schedule' }} />
        <Stack.Screen name="panels/[panelId]/edit" options={{ title: 'Edit panel' }} />
        <Stack.Screen name="panels/[panelId]/new-circuit" options={{ title: 'Add circuit' }} />
        <Stack.Screen name="panels/[panelId]/circuits/[circuitId]" options={{ title: 'Circuit' }} />
      </Stack.Protected>
      <Stack.Protected guard={!signedIn}>
        <Stack.Screen name="sign-in" options={{ headerShown: false }} />
      </Stack.Protected>
      <Stack.Screen name="+not-found" options={{ title: 'Not found' }} />
    </Stack>
  );
}

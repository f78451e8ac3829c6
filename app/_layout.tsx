import { QueryClientProvider, type QueryClient } from '@tanstack/react-query';
import { PersistQueryClientProvider } from '@tanstack/react-query-persist-client';
import { useFonts } from 'expo-font';
import { SplashScreen, Stack } from 'expo-router';
import { StatusBar } from 'expo-status-bar';
import { useEffect, useMemo, useState } from 'react';
import { Platform } from 'react-native';
import { SafeAreaProvider } from 'react-native-safe-area-context';
import { EmptyState, ErrorState, LoadingState } from '@/components/ui/states';
import { useHeaderOptions } from '@/components/ui/header-options';
import { ThemeProvider } from '@/components/ui/theme-provider';
import { colours, fonts } from '@/components/ui/theme';
import { AccountContext, useSession, type Account } from '@/hooks/use-session';
import { getActiveUser, setActiveUser, setCacheFlush, wipeUserCache } from '@/lib/account';
import { makeDeviceCopy, type DeviceCopy } from '@/lib/device-copy';
import { deviceId, loadDevice } from '@/lib/device';
import { registerOfflineShell } from '@/lib/offline-shell';
import { installOnlineDetection } from '@/lib/online';
import { waitForOutboxLock } from '@/lib/tab-lock';
import { makeQueryClient } from '@/lib/query-client';
import { configureSync, rebaseOnOutbox, resumeOutbox } from '@/lib/sync';
import { forgetDevicePhotos } from '@/hooks/use-photos';
import { SCHEMA_VERSION } from '@/shared/sync';

SplashScreen.preventAutoHideAsync().catch(() => undefined);

/** A screen above the tabs opened straight from a URL or a reload still has the tabs beneath it. */
export const unstable_settings = { initialRouteName: '(tabs)' };

export default function RootLayout() {
  const [fontsLoaded, fontError] = useFonts({
    [fonts.text]: require('@/fonts/AtkinsonHyperlegible_400Regular.ttf'),
    [fonts.textBold]: require('@/fonts/AtkinsonHyperlegible_700Bold.ttf'),
    [fonts.mono]: require('@/fonts/IBMPlexMono_400Regular.ttf'),
    [fonts.monoBold]: require('@/fonts/IBMPlexMono_600SemiBold.ttf'),
  });
  // undefined while the device's identity and last user are read from storage
  const [userId, setUserId] = useState<string | null | undefined>(undefined);
  useEffect(() => {
    installOnlineDetection();
    Promise.all([loadDevice(), getActiveUser()]).then(([, id]) => {
      // lets a support person (and the browser tests) tell devices apart
      if (typeof document !== 'undefined') document.documentElement.dataset.deviceId = deviceId();
      setUserId(id);
    });
  }, []);
  // the web swaps the faces in when they arrive: a schedule opened with no signal should not wait
  // for them (a phone would otherwise keep its splash screen up a moment longer)
  const ready = (fontsLoaded || !!fontError || Platform.OS === 'web') && userId !== undefined;
  useEffect(() => {
    if (!ready) return;
    SplashScreen.hideAsync().catch(() => undefined);
    registerOfflineShell();
  }, [ready]);

  const account = useMemo<Account>(
    () => ({
      userId: userId ?? null,
      switchTo: (id) => {
        void setActiveUser(id);
        setUserId(id);
      },
      forget: async () => {
        if (userId) await Promise.all([wipeUserCache(userId), forgetDevicePhotos(userId)]);
        await setActiveUser(null);
        setUserId(null);
      },
    }),
    [userId],
  );

  if (!ready) return null;
  return (
    <AccountContext.Provider value={account}>
      <ThemeProvider>
        <SafeAreaProvider>
          <StatusBar style="light" />
          {userId ? <UserCache key={userId} userId={userId} /> : <SignedOutCache />}
        </SafeAreaProvider>
      </ThemeProvider>
    </AccountContext.Provider>
  );
}

const dehydrateOptions = {
  // persist by allow-list: the session, the sync log, the band library; mutations still waiting.
  // Whatever the query's status: a refetch that failed offline keeps its data, and so must the
  // save (keeping only 'success' dropped the copy after a few offline reloads). The building copy
  // is saved apart, per building and panel (lib/device-copy.ts).
  shouldDehydrateQuery: (q: { queryKey: readonly unknown[]; state: { data: unknown } }) =>
    q.state.data !== undefined && ['me', 'sync-log', 'bands'].includes(String(q.queryKey[0])),
  shouldDehydrateMutation: (m: { state: { status: string } }) => m.state.status === 'pending',
};

/** Only the tab holding the user's outbox lock mounts their cache (lib/tab-lock.web.ts). */
function UserCache({ userId }: { userId: string }) {
  const [owner, setOwner] = useState(false);
  const [waitedLong, setWaitedLong] = useState(false);
  useEffect(() => {
    waitForOutboxLock(userId, () => setOwner(true));
    const timer = setTimeout(() => setWaitedLong(true), 1500);
    return () => clearTimeout(timer);
  }, [userId]);
  if (!owner && !waitedLong) return <LoadingState what="Ampwright" />;
  if (!owner) {
    return (
      <EmptyState
        title="Open in another tab"
        hint="Ampwright is already open in another tab or window of this browser. Use that one, so the changes on this device are sent once and in order. This page opens by itself when the other one is closed."
      />
    );
  }
  return <OwnedUserCache userId={userId} />;
}

/** One signed-in user's persisted cache and outbox. */
function OwnedUserCache({ userId }: { userId: string }) {
  const [{ client, copy }] = useState(() => {
    const queryClient = makeQueryClient();
    const deviceCopy = makeDeviceCopy({
      userId,
      queryClient,
      buster: String(SCHEMA_VERSION),
      dehydrateOptions,
      rebase: (replica) => rebaseOnOutbox(queryClient, replica, userId),
      path: typeof window === 'undefined' || !window.location ? undefined : window.location.pathname,
    });
    // before the restore: restored mutations find their function and scope in these defaults,
    // and the first pull waits until every stored panel is back in memory
    configureSync(queryClient, userId, deviceCopy.loaded);
    return { client: queryClient, copy: deviceCopy };
  });
  useImmediateSave(copy);
  return (
    <PersistQueryClientProvider
      client={client}
      persistOptions={{ persister: copy.persister, maxAge: Infinity, buster: String(SCHEMA_VERSION), dehydrateOptions }}
      onSuccess={() => afterRestore(client, copy)}
      // the restore failed past the device copy's own checks (TanStack's hydrate): the app must
      // still load the rest and sync, or a pull would wait for ever
      onError={() => afterRestore(client, copy)}
    >
      <RootStack />
    </PersistQueryClientProvider>
  );
}

function afterRestore(client: QueryClient, copy: DeviceCopy) {
  resumeOutbox(client);
  void copy.loadRest();
}

/**
 * The coalesced save may not have run when a change was just queued, the tab is closed or the
 * app goes to the background: write straight away.
 */
function useImmediateSave(copy: DeviceCopy) {
  useEffect(() => {
    setCacheFlush(copy.flush);
    if (typeof document === 'undefined' || typeof window.addEventListener !== 'function') return () => setCacheFlush(null);
    const save = () => void copy.flush();
    const hidden = () => document.visibilityState === 'hidden' && save();
    window.addEventListener('pagehide', save);
    document.addEventListener('visibilitychange', hidden);
    return () => {
      window.removeEventListener('pagehide', save);
      document.removeEventListener('visibilitychange', hidden);
      setCacheFlush(null);
    };
  }, [copy]);
}

function SignedOutCache() {
  const [client] = useState(makeQueryClient);
  return (
    <QueryClientProvider client={client}>
      <RootStack />
    </QueryClientProvider>
  );
}

function RootStack() {
  const session = useSession();
  const header = useHeaderOptions(!!session.data);
  if (session.isPending) return <LoadingState what="Ampwright" />;
  if (session.isError && session.data === undefined) {
    return <ErrorState error={session.error} onRetry={() => session.refetch()} />;
  }
  const signedIn = !!session.data;
  return (
    <Stack
      screenOptions={{ ...header, contentStyle: { backgroundColor: colours.paper } }}
    >
      <Stack.Protected guard={signedIn}>
        {/* the title is what the back button of a screen above the tabs reads */}
        <Stack.Screen name="(tabs)" options={{ headerShown: false, title: 'Ampwright' }} />
        <Stack.Screen name="bands/index" options={{ title: 'Time-current bands' }} />
        <Stack.Screen name="bands/new" options={{ title: 'New band' }} />
        <Stack.Screen name="deficiencies/new" options={{ title: 'New deficiency' }} />
        <Stack.Screen name="deficiencies/[deficiencyId]" options={{ title: 'Deficiency' }} />
        <Stack.Screen name="users/index" options={{ title: 'Users and access' }} />
      </Stack.Protected>
      <Stack.Protected guard={!signedIn}>
        <Stack.Screen name="sign-in" options={{ headerShown: false }} />
        <Stack.Screen name="forgot-password" options={{ headerShown: false }} />
        <Stack.Screen name="reset-password/[token]" options={{ headerShown: false }} />
      </Stack.Protected>
      {/* signed in or out: an existing account may accept while signed in as itself */}
      <Stack.Screen name="invitation/[token]" options={{ headerShown: false }} />
      <Stack.Screen name="+not-found" options={{ title: 'Not found' }} />
    </Stack>
  );
}

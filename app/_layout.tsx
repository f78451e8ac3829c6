import { dehydrate, QueryClientProvider, type QueryClient } from '@tanstack/react-query';
import { PersistQueryClientProvider } from '@tanstack/react-query-persist-client';
import { useFonts } from 'expo-font';
import { SplashScreen, Stack } from 'expo-router';
import { StatusBar } from 'expo-status-bar';
import { useEffect, useMemo, useState } from 'react';
import { SafeAreaProvider } from 'react-native-safe-area-context';
import { EmptyState, ErrorState, LoadingState } from '@/components/states';
import { SyncStatus } from '@/components/sync-status';
import { colours, fonts } from '@/components/theme';
import { AccountContext, useSession, type Account } from '@/hooks/use-session';
import { cacheKey, getActiveUser, makePersister, setActiveUser, setCacheFlush, wipeUserCache, withoutBuildingCopy } from '@/lib/account';
import { reportPersistFailure } from '@/lib/storage-health';
import { kv } from '@/lib/storage';
import { deviceId, loadDevice } from '@/lib/device';
import { registerOfflineShell } from '@/lib/offline-shell';
import { installOnlineDetection } from '@/lib/online';
import { waitForOutboxLock } from '@/lib/tab-lock';
import { makeQueryClient } from '@/lib/query-client';
import { configureSync, resumeOutbox } from '@/lib/sync';
import { forgetDevicePhotos } from '@/hooks/use-photos';
import { SCHEMA_VERSION } from '@/shared/sync';

SplashScreen.preventAutoHideAsync().catch(() => undefined);

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
  const ready = (fontsLoaded || !!fontError) && userId !== undefined;
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
      <SafeAreaProvider>
        <StatusBar style="light" />
        {userId ? <UserCache key={userId} userId={userId} /> : <SignedOutCache />}
      </SafeAreaProvider>
    </AccountContext.Provider>
  );
}

const dehydrateOptions = {
  // persist by allow-list: the session, the building copy, the band library; mutations still waiting
  shouldDehydrateQuery: (q: { queryKey: readonly unknown[]; state: { status: string } }) =>
    q.state.status === 'success' && ['me', 'replica', 'sync-log', 'bands'].includes(String(q.queryKey[0])),
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
  const [{ client, persister }] = useState(() => {
    const queryClient = makeQueryClient();
    // before the restore: restored mutations find their function and scope in these defaults
    configureSync(queryClient, userId);
    return { client: queryClient, persister: makePersister(userId) };
  });
  useImmediateSave(client, userId);
  return (
    <PersistQueryClientProvider
      client={client}
      persistOptions={{ persister, maxAge: Infinity, buster: String(SCHEMA_VERSION), dehydrateOptions }}
      onSuccess={() => resumeOutbox(client)}
    >
      <RootStack />
    </PersistQueryClientProvider>
  );
}

/**
 * The persister's throttled save may not have run when a change was just queued, the tab is
 * closed or the app goes to the background: write the same snapshot straight away.
 */
function useImmediateSave(queryClient: QueryClient, userId: string) {
  useEffect(() => {
    const flush = async () => {
      const snapshot = { buster: String(SCHEMA_VERSION), timestamp: Date.now(), clientState: dehydrate(queryClient, dehydrateOptions) };
      try {
        await kv.setItem(cacheKey(userId), JSON.stringify(snapshot));
      } catch (error) {
        // full device: keep at least the queue, then say so
        await kv.setItem(cacheKey(userId), JSON.stringify(withoutBuildingCopy(snapshot)));
        reportPersistFailure(error as Error);
      }
    };
    setCacheFlush(flush);
    if (typeof document === 'undefined' || typeof window.addEventListener !== 'function') return () => setCacheFlush(null);
    const save = () => void flush();
    const hidden = () => document.visibilityState === 'hidden' && save();
    window.addEventListener('pagehide', save);
    document.addEventListener('visibilitychange', hidden);
    return () => {
      window.removeEventListener('pagehide', save);
      document.removeEventListener('visibilitychange', hidden);
      setCacheFlush(null);
    };
  }, [queryClient, userId]);
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
        headerRight: signedIn ? () => <SyncStatus /> : undefined,
      }}
    >
      <Stack.Protected guard={signedIn}>
        <Stack.Screen name="(tabs)" options={{ headerShown: false }} />
        <Stack.Screen name="buildings/[buildingId]" options={{ title: 'Building' }} />
        <Stack.Screen name="panels/[panelId]/index" options={{ title: 'Panel schedule' }} />
        <Stack.Screen name="panels/[panelId]/edit" options={{ title: 'Edit panel' }} />
        <Stack.Screen name="panels/[panelId]/new-circuit" options={{ title: 'Add circuit' }} />
        <Stack.Screen name="panels/[panelId]/import" options={{ title: 'Import a schedule' }} />
        <Stack.Screen name="panels/[panelId]/circuits/[circuitId]" options={{ title: 'Circuit' }} />
        <Stack.Screen name="inspections/new" options={{ title: 'New inspection' }} />
        <Stack.Screen name="inspections/[inspectionId]/index" options={{ title: 'Inspection' }} />
        <Stack.Screen name="inspections/[inspectionId]/reading" options={{ title: 'Reading' }} />
        <Stack.Screen name="bands/index" options={{ title: 'Time-current bands' }} />
        <Stack.Screen name="bands/new" options={{ title: 'New band' }} />
        <Stack.Screen name="deficiencies/new" options={{ title: 'New deficiency' }} />
        <Stack.Screen name="deficiencies/[deficiencyId]" options={{ title: 'Deficiency' }} />
        <Stack.Screen name="trips/new" options={{ title: 'Record a trip' }} />
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

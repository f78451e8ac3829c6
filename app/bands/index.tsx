import { Stack, useRouter } from 'expo-router';
import { StyleSheet, View } from 'react-native';
import { BandList } from '@/components/register/band-list';
import { Button } from '@/components/ui/button';
import { Screen } from '@/components/ui/screen';
import { EmptyState, ErrorState, LoadingState } from '@/components/ui/states';
import { Text } from '@/components/ui/text';
import { space } from '@/components/ui/theme';
import { useBands } from '@/hooks/use-records';
import { useSession } from '@/hooks/use-session';
import { can } from '@/shared/permissions';

export default function BandLibraryScreen() {
  const router = useRouter();
  const bands = useBands();
  const me = useSession().data;
  // owners read the library; the field team keeps it (the server checks the same)
  const canAdd = !!me?.memberships.some((m) => can(m.role, 'band.edit'));
  const addButton = canAdd ? <Button label="New band" onPress={() => router.push('/bands/new')} testID="new-band" /> : null;
  if (bands.data === undefined) {
    if (bands.isError) return <ErrorState error={bands.error} onRetry={() => bands.refetch()} />;
    return <LoadingState what="the band library" />;
  }
  return (
    <>
      <Stack.Screen options={{ title: 'Band library' }} />
      <Screen>
        <View style={styles.head}>
          <Text variant="title" heading={2}>Time-current bands</Text>
          <Text tone="soft">
            Bands read off the makers’ published curves, shared by everyone in your organisation. A trip test is judged against
            the circuit’s band; without one only a 300 % test can be judged, against the NETA table.
          </Text>
        </View>
        {bands.data.length === 0 ? (
          <EmptyState
            title="No bands yet"
            hint={canAdd ? 'Add the band of a breaker from its maker’s time-current curve; then choose it on the circuit or in a trip test.' : 'The field team adds bands from the makers’ curves.'}
          >
            {addButton}
          </EmptyState>
        ) : (
          <>
            {addButton}
            <BandList bands={bands.data} />
          </>
        )}
      </Screen>
    </>
  );
}

const styles = StyleSheet.create({ head: { gap: space.xs } });

import { ActivityIndicator, StyleSheet, View } from 'react-native';
import { describeError } from '@/lib/api';
import { Button } from './button';
import { StorageProblem } from '@/components/sync/storage-problem';
import { Text } from './text';
import { colours, space } from './theme';

export function LoadingState({ what }: { what: string }) {
  return (
    <View style={styles.centre} accessibilityRole="progressbar" accessibilityLabel={`Loading ${what}`}>
      <ActivityIndicator color={colours.copper} size="large" />
      <Text tone="soft">Loading {what}…</Text>
    </View>
  );
}

export function ErrorState({ error, onRetry }: { error: unknown; onRetry?: () => void }) {
  return (
    <View style={styles.centre} accessibilityRole="alert">
      <StorageProblem />
      <Text variant="heading" heading={2}>Could not load this</Text>
      <Text tone="soft" style={styles.text}>
        {describeError(error)}
      </Text>
      {onRetry && <Button label="Try again" tone="secondary" onPress={onRetry} />}
    </View>
  );
}

export function EmptyState({ title, hint, children }: { title: string; hint: string; children?: React.ReactNode }) {
  return (
    <View style={styles.centre}>
      <StorageProblem />
      <Text variant="heading" heading={2}>{title}</Text>
      <Text tone="soft" style={styles.text}>
        {hint}
      </Text>
      {children}
    </View>
  );
}

/**
 * Loading, error and not-found states for a query of the device's replica: returns what to show
 * instead of the screen, or null when the data is there.
 */
export function replicaGate(
  query: { data: unknown; isError: boolean; error: unknown; refetch: () => unknown },
  what: string,
): React.ReactElement | null {
  if (query.data === undefined) {
    if (query.isError) return <ErrorState error={query.error} onRetry={() => query.refetch()} />;
    return <LoadingState what={what} />;
  }
  if (query.data === null) {
    return <EmptyState title="Not on this device" hint={`This ${what} was deleted, or you no longer have access to it. Go back and pull to refresh.`} />;
  }
  return null;
}

const styles = StyleSheet.create({
  centre: { flex: 1, alignItems: 'center', justifyContent: 'center', padding: space.xl, gap: space.md },
  text: { textAlign: 'center', maxWidth: 420 },
});

import { useSyncExternalStore } from 'react';
import { StyleSheet, View } from 'react-native';
import { getPersistProblem, subscribePersistProblem } from '@/lib/storage-health';
import { Text } from '@/components/ui/text';
import { colours, radii, space } from '@/components/ui/theme';

/** The device's storage failed to save or to read back: said on every screen, not only on Sync. */
export function StorageProblem() {
  const problem = useSyncExternalStore(subscribePersistProblem, getPersistProblem, () => null);
  if (!problem) return null;
  return (
    <View style={styles.problem} accessibilityRole="alert" testID="storage-problem">
      <Text variant="small">⚠ {problem}</Text>
    </View>
  );
}

const styles = StyleSheet.create({
  problem: { backgroundColor: colours.warnSoft, padding: space.sm, borderRadius: radii.sm, maxWidth: 760, alignSelf: 'stretch' },
});

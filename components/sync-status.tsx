import { useRouter } from 'expo-router';
import { Pressable, StyleSheet } from 'react-native';
import { useOnline, useOutbox } from '@/hooks/use-outbox';
import { useSyncReview } from '@/hooks/use-register';
import { Text } from './text';
import { colours, MIN_TOUCH, radii, space } from './theme';

/**
 * The compact status in every header: offline / on this device (N) / synced / needs review (N).
 * Words and a mark, never colour alone. Tap for the Sync tab.
 */
export function SyncStatus() {
  const router = useRouter();
  const online = useOnline();
  const outbox = useOutbox();
  const review = useSyncReview();
  const needsReview = (review.data?.conflicts.length ?? 0) + (review.data?.refused.length ?? 0);
  const waiting = outbox.length;
  let label: string;
  let tone: 'ok' | 'wait' | 'alert' | 'off';
  if (needsReview > 0) {
    label = `! needs review (${needsReview})`;
    tone = 'alert';
  } else if (!online) {
    label = waiting > 0 ? `○ offline · on this device (${waiting})` : '○ offline';
    tone = 'off';
  } else if (waiting > 0) {
    label = `↑ on this device (${waiting})`;
    tone = 'wait';
  } else {
    label = '✓ synced';
    tone = 'ok';
  }
  return (
    <Pressable
      accessibilityRole="button"
      accessibilityLabel={`Sync status: ${label.replace(/^\W+/, '')}`}
      testID="sync-status"
      onPress={() => router.push('/sync')}
      style={[styles.pill, styles[tone]]}
    >
      <Text variant="label" tone="paper" numberOfLines={1}>
        {label}
      </Text>
    </Pressable>
  );
}

const styles = StyleSheet.create({
  pill: {
    minHeight: MIN_TOUCH - 12,
    justifyContent: 'center',
    paddingHorizontal: space.sm,
    marginRight: space.md,
    borderRadius: radii.lg,
    borderWidth: 1,
    borderColor: colours.paper,
  },
  ok: { backgroundColor: 'transparent' },
  wait: { backgroundColor: colours.copper, borderColor: colours.copper },
  alert: { backgroundColor: colours.danger, borderColor: colours.danger },
  off: { backgroundColor: colours.inkSoft, borderColor: colours.inkSoft },
});

import { useRouter } from 'expo-router';
import { Pressable, StyleSheet } from 'react-native';
import { useOnline, useOutbox } from '@/hooks/use-outbox';
import { useWaitingPhotos } from '@/hooks/use-photos';
import { useSyncReview } from '@/hooks/use-register';
import { describePullProgress, usePullProgress } from '@/lib/pull-progress';
import { Text } from '@/components/ui/text';
import { colours, MIN_TOUCH, space } from '@/components/ui/theme';

/**
 * The compact status in every header: offline / on this device (N) / synced / needs review (N),
 * and "Loading Tower: 3 of 9 parts" while a big building's first sync arrives in pages.
 * Words and a mark, never colour alone. Tap for the Sync tab.
 */
export function SyncStatus() {
  const router = useRouter();
  const online = useOnline();
  const outbox = useOutbox();
  const review = useSyncReview();
  const needsReview = review.conflicts.length + review.refused.length;
  // mounted in every header for the whole session: this also keeps the photo uploads going
  const photos = useWaitingPhotos().photos.length;
  const waiting = outbox.length + photos;
  const loading = usePullProgress();
  const parts: string[] = [];
  if (!online) parts.push('○ offline');
  if (online && loading.length > 0) parts.push(`↓ ${loading.map(describePullProgress).join(', ')}`);
  if (waiting > 0) parts.push(`${online ? '↑ ' : ''}on this device (${waiting})`);
  if (needsReview > 0) parts.push(`${parts.length ? '' : '! '}needs review (${needsReview})`);
  if (parts.length === 0) parts.push('✓ synced');
  const label = parts.join(' · ');
  const tone = needsReview > 0 ? 'alert' : !online ? 'off' : waiting > 0 || loading.length > 0 ? 'wait' : 'ok';
  return (
    <Pressable
      accessibilityRole="button"
      accessibilityLabel={`Sync status: ${label.replace(/^\W+/, '')}`}
      testID="sync-status"
      onPress={() => router.push('/sync')}
      style={[styles.pill, styles[tone]]}
    >
      <Text variant="label" tone={tone === 'ok' ? 'bar' : 'paper'} numberOfLines={1}>
        {label}
      </Text>
    </Pressable>
  );
}

const styles = StyleSheet.create({
  pill: {
    minHeight: MIN_TOUCH,
    minWidth: MIN_TOUCH,
    justifyContent: 'center',
    paddingHorizontal: space.sm,
    marginRight: space.md,
    borderRadius: MIN_TOUCH / 2,
    borderWidth: 1,
    borderColor: colours.onBar,
  },
  ok: { backgroundColor: 'transparent' },
  wait: { backgroundColor: colours.copper, borderColor: colours.copper },
  alert: { backgroundColor: colours.danger, borderColor: colours.danger },
  off: { backgroundColor: colours.inkSoft, borderColor: colours.inkSoft },
});

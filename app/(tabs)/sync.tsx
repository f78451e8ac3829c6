import { StyleSheet, View } from 'react-native';
import { Button } from '@/components/ui/button';
import { PhotosWaiting } from '@/components/documents/photos';
import { Card } from '@/components/ui/card';
import { Screen } from '@/components/ui/screen';
import { Text } from '@/components/ui/text';
import { colours, radii, space } from '@/components/ui/theme';
import { stampTime, timeAgo } from '@/components/ui/time-ago';
import type { BuildingView } from '@/hooks/building-view';
import { canRestore, useConflictActions, useDismissRefused, useOnline, useOutbox, useSyncNow } from '@/hooks/use-outbox';
import { useSyncReview } from '@/hooks/use-register';
import type { Conflict } from '@/shared/sync';

const show = (value: unknown) =>
  value === null || value === undefined || value === '' ? '(blank)' : typeof value === 'object' ? JSON.stringify(value) : String(value);
const values = (v: Record<string, unknown>) =>
  Object.entries(v)
    .map(([k, x]) => (Object.keys(v).length > 1 ? `${k}: ${show(x)}` : show(x)))
    .join(', ');

export default function Sync() {
  const online = useOnline();
  const outbox = useOutbox();
  const review = useSyncReview();
  const { syncNow, pulling } = useSyncNow();
  const data = review;
  const needsReview = data.conflicts.length + data.refused.length;

  return (
    <Screen>
      <Card>
        <Text variant="heading" heading={2} testID="sync-connection">
          {online ? 'Connected' : 'Offline — changes stay on this device'}
        </Text>
        <Text tone="soft" testID="last-sync">Last successful sync: {timeAgo(data.lastSyncAt)}</Text>
        <Button label={pulling ? 'Syncing…' : 'Sync now'} busy={pulling} onPress={syncNow} testID="sync-now" />
      </Card>

      <Section title={`On this device (${outbox.length})`} testID="outbox">
        {outbox.length === 0 ? (
          <Text tone="soft">Nothing waiting: every change you made has reached the server.</Text>
        ) : (
          outbox.map(({ mutation, since, paused }) => (
            <View key={mutation.id} style={styles.row}>
              <Text style={styles.flex}>{data.describe(mutation)}</Text>
              <Text variant="small" tone="faint">
                {paused ? 'waiting for signal · ' : 'sending · '}
                {timeAgo(since)}
              </Text>
            </View>
          ))
        )}
      </Section>

      <PhotosWaiting />

      <Section title={`Needs review (${needsReview})`} testID="needs-review">
        {needsReview === 0 && <Text tone="soft">No conflicts or refused changes.</Text>}
        {data.conflicts.map(({ conflict, view }) => (
          <ConflictCard key={conflict.id} conflict={conflict} where={whereOf(conflict, view)} />
        ))}
        {data.refused.map((r) => <RefusedCard key={r.mutation.id} label={r.label} reason={r.reason} at={r.at} id={r.mutation.id} />)}
      </Section>

      <Section title="Synced" testID="synced">
        {data.synced.length === 0 ? (
          <Text tone="soft">Changes you send will be listed here.</Text>
        ) : (
          data.synced.slice(0, 10).map((s) => (
            <View key={s.mutationId} style={styles.row}>
              <Text style={styles.flex}>{s.label}</Text>
              <Text variant="small" tone="faint">{s.status} · {timeAgo(s.at)}</Text>
            </View>
          ))
        )}
      </Section>
    </Screen>
  );
}

function whereOf(conflict: Conflict, view: BuildingView) {
  if (conflict.entity === 'circuit') {
    const circuit = view.circuit(conflict.entityId);
    return circuit ? `${view.panel(circuit.panelId)?.tag ?? 'Panel'} · position ${circuit.position}` : 'A deleted circuit';
  }
  if (conflict.entity === 'panel') return `Panel ${view.panel(conflict.entityId)?.tag ?? ''}`;
  if (conflict.entity === 'building') return 'Building';
  const deficiency = view.deficiency(conflict.entityId);
  if (deficiency) return `Deficiency · ${deficiency.title}`;
  return RECORD_WORDS[conflict.entity] ?? 'Record';
}

const RECORD_WORDS: Record<string, string> = {
  inspection: 'An inspection',
  reading: 'A reading',
  deficiency: 'A deficiency',
  trip: 'A recorded trip',
  photo: 'A photo',
};

function ConflictCard({ conflict, where }: { conflict: Conflict; where: string }) {
  const { keepTheirs, restoreMine } = useConflictActions();
  const deleted = conflict.kind === 'edited_after_delete';
  return (
    <View style={styles.review} testID="conflict">
      <Text variant="strong">{where} · {conflict.field}</Text>
      <Text variant="small">
        {deleted ? 'Deleted' : 'Kept'}: {deleted ? 'the row was deleted' : values(conflict.winnerValue)} — {conflict.winnerUserName ?? 'someone'}, {stampTime(conflict.winnerHlc)}
      </Text>
      <Text variant="small">
        Not applied: {values(conflict.loserValue)} — {conflict.loserUserName ?? 'someone'}, {stampTime(conflict.loserHlc)}
      </Text>
      <View style={styles.actions}>
        <Button label="Keep theirs" tone="secondary" onPress={() => keepTheirs(conflict)} testID="keep-theirs" />
        {canRestore(conflict) ? (
          <Button label="Restore mine" tone="secondary" onPress={() => restoreMine(conflict)} testID="restore-mine" />
        ) : null}
      </View>
    </View>
  );
}

function RefusedCard({ id, label, reason, at }: { id: string; label: string; reason: string; at: string }) {
  const dismiss = useDismissRefused();
  return (
    <View style={styles.review} testID="refused">
      <Text variant="strong">{label}</Text>
      <Text variant="small">Refused by the server {timeAgo(at)}: {reason}</Text>
      <Button label="Dismiss" tone="secondary" onPress={() => dismiss(id)} />
    </View>
  );
}

function Section({ title, children, testID }: { title: string; children: React.ReactNode; testID: string }) {
  return (
    <Card testID={testID}>
      <Text variant="label" tone="soft" heading={2} caps>
        {title}
      </Text>
      {children}
    </Card>
  );
}

const styles = StyleSheet.create({
  row: { flexDirection: 'row', alignItems: 'center', gap: space.sm, paddingVertical: space.xs, borderBottomWidth: StyleSheet.hairlineWidth, borderBottomColor: colours.rule },
  flex: { flex: 1 },
  review: { gap: space.xs, padding: space.md, borderRadius: radii.md, borderWidth: 1, borderColor: colours.danger, backgroundColor: colours.dangerSoft },
  actions: { flexDirection: 'row', gap: space.sm, flexWrap: 'wrap' },
});

/**
 * "Read a door card": photograph (or choose) the card → the text is read on this device → the
 * draft laid out like the panel schedule, each line with its confidence and the photo it came
 * from → accept / skip / edit → the CSV import's checks → one batch of queued changes (offline too).
 */
import { useRouter } from 'expo-router';
import { useState } from 'react';
import { StyleSheet, useWindowDimensions, View } from 'react-native';
import { useDoorCard, type ReviewLine } from '@/hooks/use-door-card';
import { planSummary, type ImportPlan } from '@/shared/csv';
import { LOW_CONFIDENCE } from '@/shared/door-card/parse';
import { Button } from '../ui/button';
import { SafetyNote } from '../ui/safety-note';
import { EmptyState, replicaGate } from '../ui/states';
import { Text } from '../ui/text';
import { colours, radii, space } from '../ui/theme';
import { DraftLine } from './draft-line';
import { can } from '@/shared/permissions';

const WIDE = 1024;

/** The import's summary in the card's words: circuits the card does not list stay. */
const cardSummary = (plan: ImportPlan) => planSummary(plan).replace('not in the file', 'not on the card');

export function DoorCardReader({ panelId }: { panelId: string }) {
  const router = useRouter();
  const card = useDoorCard(panelId);
  const { width } = useWindowDimensions();
  const [applied, setApplied] = useState<string | null>(null);
  const gate = replicaGate(card.query, 'panel');
  if (gate || !card.found) return gate;
  const { panel, building } = card.found;
  if (!can(building.role, 'schedule.edit')) {
    return <EmptyState title="Read only" hint={`As ${building.role} you can read this schedule but not fill it from a card.`} />;
  }

  const lines = card.lines ?? [];
  const undecided = lines.filter((l) => l.decision === 'undecided').length;
  const plan = card.card?.plan ?? null;
  const problemsOf = (l: ReviewLine) => card.card?.problemsByKey.get(l.key) ?? [];
  const changes = plan ? plan.creates.length + plan.patches.length : 0;
  const reason = !plan
    ? null
    : undecided > 0
      ? `${undecided} marked line${undecided === 1 ? '' : 's'} still to accept, edit or skip.`
      : plan.blocked
        ? 'Nothing is written while an accepted line has a problem: edit it or skip it.'
        : changes === 0
          ? 'The accepted lines match the schedule: there is nothing to change.'
          : null;
  const byPosition = [...lines].sort((a, b) => a.position - b.position || a.line - b.line);
  const columns = width >= WIDE ? [byPosition.filter((l) => l.position % 2 === 1), byPosition.filter((l) => l.position % 2 === 0)] : [byPosition];

  const apply = () => {
    if (!plan) return;
    const summary = cardSummary(plan);
    card.apply();
    setApplied(summary);
  };

  return (
    <View style={styles.wrap}>
      <View style={styles.head}>
        <Text variant="title" heading={2}>Read a door card into {panel.tag}</Text>
        <Text tone="soft">
          Photograph the circuit directory on the panel door, square on and filling the frame. The text is read on this
          device, with no signal needed. Nothing is written until you have looked at the draft and applied it; lines
          marked ⚠ (below {LOW_CONFIDENCE} % sure, or with a guess) wait for your word.
        </Text>
        <Text variant="small" tone="faint">
          Reads typed and printed cards well; most handwriting is not read reliably — type those lines in instead.
        </Text>
      </View>
      <SafetyNote />
      {applied && (
        <View style={styles.done} testID="door-card-applied">
          <Text variant="strong">Card queued: {applied}.</Text>
          <Text variant="small">The schedule shows it now on this device; it is sent as soon as there is a connection.</Text>
          <Button label={`Back to ${panel.tag}`} tone="secondary" onPress={() => router.back()} testID="door-card-back" />
        </View>
      )}
      <Button
        label={card.lines ? 'Read another photo' : 'Photograph or choose a card'}
        tone={card.lines ? 'secondary' : 'primary'}
        busy={!!card.progress}
        onPress={() => {
          setApplied(null);
          void card.read();
        }}
        testID="door-card-pick"
      />
      {card.progress && (
        <View style={styles.progress} testID="door-card-progress" accessibilityRole="progressbar" accessibilityValue={{ min: 0, max: 100, now: Math.round(card.progress.share * 100) }}>
          <Text variant="small">{card.progress.step}… {Math.round(card.progress.share * 100)} %</Text>
          <View style={styles.bar}>
            <View style={[styles.barFill, { width: `${Math.round(card.progress.share * 100)}%` }]} />
          </View>
        </View>
      )}
      {card.error && <Text tone="danger" testID="door-card-error">{card.error}</Text>}
      {card.lines && (
        <>
          <Text variant="small" tone="soft" testID="door-card-summary">
            {lines.length} position{lines.length === 1 ? '' : 's'} read
            {card.readMs !== null ? ` in ${(card.readMs / 1000).toFixed(1)} s` : ''} · {undecided} to look at
            {plan ? ` · ${cardSummary(plan)}` : ''}
          </Text>
          {lines.length === 0 && (
            <Text tone="danger">No numbered lines were found on this photo. Try again closer, square on and in good light.</Text>
          )}
          <View style={styles.columns} testID="door-card-draft">
            {columns.map((column, i) => (
              <View key={i} style={styles.column}>
                {column.map((l) => (
                  <DraftLine
                    key={l.key}
                    line={l}
                    photo={card.photo}
                    problems={problemsOf(l)}
                    onDecide={(d) => card.decide(l.key, d)}
                    onEdit={(f) => card.edit(l.key, f)}
                  />
                ))}
              </View>
            ))}
          </View>
          {card.unread.length > 0 && (
            <View style={styles.unread}>
              <Text variant="label" tone="soft">NOT READ AS A POSITION</Text>
              {card.unread.map((u) => (
                <Text key={u.line} variant="small" tone="faint">“{u.text}”</Text>
              ))}
            </View>
          )}
          {reason && (
            <Text tone={undecided > 0 || plan?.blocked ? 'danger' : 'soft'} testID="door-card-apply-reason">
              {reason}
            </Text>
          )}
          <View style={styles.actions}>
            <Button
              label={changes > 0 ? `Apply ${changes} change${changes === 1 ? '' : 's'}` : 'Apply'}
              disabled={!plan || plan.blocked || undecided > 0 || changes === 0}
              onPress={apply}
              testID="door-card-apply"
            />
            <Button label="Discard the draft" tone="quiet" onPress={card.discard} testID="door-card-discard" />
          </View>
        </>
      )}
    </View>
  );
}

const styles = StyleSheet.create({
  wrap: { gap: space.md },
  head: { gap: space.xs },
  progress: { gap: space.xs },
  bar: { height: 8, borderRadius: radii.sm, backgroundColor: colours.rule, overflow: 'hidden' },
  barFill: { height: 8, backgroundColor: colours.copper },
  columns: { flexDirection: 'row', gap: space.md, alignItems: 'flex-start' },
  column: { flex: 1, gap: space.sm },
  unread: { gap: 2 },
  actions: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
  done: { gap: space.xs, backgroundColor: colours.copperSoft, padding: space.md, borderRadius: radii.md },
});

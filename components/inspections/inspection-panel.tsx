/**
 * One panel covered by an inspection: its readings with what each means, the buttons to add the
 * readings this kind of inspection is made of (the other kinds one tap further), and its visual
 * checklist.
 */
import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import type { BuildingView } from '@/hooks/building-view';
import type { AssessedReading } from '@/hooks/use-records';
import { READING_KINDS, type InspectionKind, type Reading, type VisualCheck } from '@/shared/records';
import type { Panel } from '@/shared/schemas';
import { Button } from '@/components/ui/button';
import { InspectionChecklist } from './inspection-checklist';
import { READING_KINDS_FOR, READING_KIND_LABELS } from './inspection-format';
import { ReadingCard } from '@/components/inspections/readings/reading-card';
import { Text } from '@/components/ui/text';
import { colours, radii, space } from '@/components/ui/theme';

type MeasuredKind = 'thermal' | 'torque' | 'trip';
const MEASURED: readonly MeasuredKind[] = READING_KINDS.filter((k): k is MeasuredKind => k !== 'visual');

export function InspectionPanel({
  panel,
  view,
  readings,
  raisedFor,
  kind,
  canRecord,
  canRaise,
  onAdd,
  onOpenReading,
  onTick,
  onUntick,
}: {
  panel: Panel;
  /** the building's lookups (the readings' circuits) */
  view: BuildingView;
  /** this panel's readings in this inspection */
  readings: AssessedReading[];
  /** reading ids a deficiency was raised from */
  raisedFor: ReadonlySet<string>;
  kind: InspectionKind;
  canRecord: boolean;
  canRaise: boolean;
  onAdd: (kind: MeasuredKind) => void;
  onOpenReading: (reading: Reading) => void;
  onTick: (check: VisualCheck) => void;
  onUntick: (reading: Reading) => void;
}) {
  const [moreKinds, setMoreKinds] = useState(false);
  const fitting = READING_KINDS_FOR[kind];
  const others = MEASURED.filter((k) => !fitting.includes(k));
  const measured = readings.filter((r) => r.reading.kind !== 'visual');
  const visual = readings.filter((r) => r.reading.kind === 'visual').map((r) => r.reading);
  return (
    <View style={styles.section} testID={`inspection-panel-${panel.tag}`}>
      <View style={styles.head}>
        <View style={styles.tag}>
          <Text variant="readingBold" tone="paper">{panel.tag}</Text>
        </View>
        <Text variant="small" tone="soft" style={styles.location}>{panel.location || 'Location not recorded'}</Text>
      </View>
      {measured.length === 0 ? (
        <Text tone="soft">
          {canRecord ? 'No readings on this panel yet: add one below.' : 'No readings were taken on this panel.'}
        </Text>
      ) : (
        measured.map(({ reading, assessment }) => (
          <ReadingCard
            key={reading.id}
            reading={reading}
            assessment={assessment}
            circuit={reading.circuitId ? (view.circuit(reading.circuitId) ?? null) : null}
            hasDeficiency={raisedFor.has(reading.id)}
            onOpen={canRecord ? () => onOpenReading(reading) : undefined}
          />
        ))
      )}
      {canRecord && (
        <View style={styles.add}>
          {fitting.map((k) => (
            <Button key={k} label={`+ ${READING_KIND_LABELS[k]}`} onPress={() => onAdd(k)} testID={`add-${k}-${panel.tag}`} />
          ))}
          {others.length > 0 &&
            (moreKinds || fitting.length === 0 ? (
              others.map((k) => (
                <Button
                  key={k}
                  label={`+ ${READING_KIND_LABELS[k]}`}
                  tone="secondary"
                  onPress={() => onAdd(k)}
                  testID={`add-${k}-${panel.tag}`}
                />
              ))
            ) : (
              <Button label="Other readings…" tone="quiet" onPress={() => setMoreKinds(true)} testID={`more-kinds-${panel.tag}`} />
            ))}
        </View>
      )}
      <InspectionChecklist
        panelTag={panel.tag}
        visualReadings={visual}
        raisedFor={raisedFor}
        editable={canRecord}
        raises={canRaise}
        onTick={onTick}
        onUntick={onUntick}
        startOpen={kind === 'visual' || kind === 'full-maintenance'}
      />
    </View>
  );
}

const styles = StyleSheet.create({
  section: {
    gap: space.md,
    padding: space.md,
    borderRadius: radii.lg,
    borderWidth: 1,
    borderColor: colours.rule,
    backgroundColor: colours.paper,
  },
  head: { flexDirection: 'row', alignItems: 'center', gap: space.sm },
  tag: { backgroundColor: colours.ink, borderRadius: radii.sm, paddingHorizontal: space.sm, paddingVertical: 2 },
  location: { flex: 1 },
  add: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
});

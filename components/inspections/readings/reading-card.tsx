/** One reading of an inspection: what was measured where, and what it means. */
import { StyleSheet, View } from 'react-native';
import { Card, PressableCard } from '@/components/ui/card';
import type { Assessment } from '@/shared/assess';
import { percentOfNormal } from '@/shared/calc/thermal';
import { THERMAL_COMPONENT_LABELS, type Reading } from '@/shared/records';
import type { Circuit } from '@/shared/schemas';
import { circuitName, fastenerText, READING_KIND_LABELS } from '@/components/inspections/inspection-format';
import { ReadingAssessment } from './reading-assessment';
import { Text } from '@/components/ui/text';
import { MIN_TOUCH, space } from '@/components/ui/theme';
import { useTemperatureUnit } from '@/hooks/use-temperature-unit';
import { formatTemp, type TemperatureUnit } from '@/shared/units';

/** The measured values of a reading as one mono line. */
export function readingValues(r: Reading, circuit: Circuit | null, unit: TemperatureUnit = 'C'): string {
  switch (r.kind) {
    case 'thermal': {
      const basis = r.referenceBasis === 'ambient' ? 'ambient' : 'similar';
      const load =
        r.loadA !== null && r.referenceLoadA !== null && r.referenceLoadA > 0
          ? ` · ${r.loadA} A of ${r.referenceLoadA} A (${percentOfNormal(r.loadA, r.referenceLoadA)} % of normal)`
          : '';
      return `${formatTemp(r.temperatureC, unit, 'absolute')} vs ${formatTemp(r.referenceC, unit, 'absolute')} ${basis}${load}`;
    }
    case 'torque': {
      const found = r.asFound === 'held' ? 'held' : `turned at ${r.asFoundValue ?? '?'}`;
      const source = r.specSource === 'fallback-table' ? ' (UL 486A-B fallback)' : '';
      return `spec ${r.specified ?? '?'} ${r.unit ?? ''}${source} · found ${found} · left ${r.asLeft ?? '?'}`;
    }
    case 'trip': {
      const rating = circuit?.ratingA ? ` (${Math.round((100 * (r.testCurrentA ?? 0)) / circuit.ratingA)} %)` : '';
      const trip = r.tripped ? `tripped ${r.tripTimeS ?? '?'} s` : 'did not trip';
      return `${r.testCurrentA ?? '?'} A${rating} · ${trip}`;
    }
    case 'visual':
      return '';
  }
}

/** Where the reading was taken: "Lug · 13 · Corridor lights east · phase B". */
export function readingWhere(r: Reading, circuit: Circuit | null): string {
  const parts: string[] = [];
  if (r.kind === 'thermal' && r.component) parts.push(THERMAL_COMPONENT_LABELS[r.component]);
  if (circuit) parts.push(circuitName(circuit));
  else if (r.kind === 'torque') parts.push(fastenerText(r));
  if (r.kind === 'torque' && circuit && r.fastener && r.fastener !== 'main') parts.push(r.fastener);
  if (r.phase) parts.push(r.phase === 'N' ? 'neutral' : `phase ${r.phase}`);
  return parts.join(' · ') || 'panel';
}

export function ReadingCard({
  reading,
  assessment,
  circuit,
  onOpen,
  hasDeficiency,
}: {
  reading: Reading;
  assessment: Assessment;
  circuit: Circuit | null;
  /** absent: the reading cannot be changed (signed, or the role may not) */
  onOpen?: () => void;
  hasDeficiency: boolean;
}) {
  const { unit } = useTemperatureUnit();
  const body = (
    <>
      <View style={styles.top}>
        <Text variant="label" tone="soft">{READING_KIND_LABELS[reading.kind].toUpperCase()}</Text>
        {onOpen && <Text tone="faint">Edit ›</Text>}
      </View>
      <Text variant="strong">{readingWhere(reading, circuit)}</Text>
      <Text variant="reading" tone="soft">{readingValues(reading, circuit, unit)}</Text>
      <ReadingAssessment assessment={assessment} compact />
      {hasDeficiency && <Text variant="small" tone="copper">● Deficiency raised from this reading</Text>}
    </>
  );
  if (!onOpen) {
    return (
      <Card size="row" style={styles.card} testID={`reading-${reading.kind}`}>
        {body}
      </Card>
    );
  }
  return (
    <PressableCard
      accessibilityRole="button"
      accessibilityLabel={`${READING_KIND_LABELS[reading.kind]}: ${readingWhere(reading, circuit)}. ${assessment.summary}`}
      onPress={onOpen}
      style={styles.card}
      testID={`reading-${reading.kind}`}
    >
      {body}
    </PressableCard>
  );
}

const styles = StyleSheet.create({
  card: {
    minHeight: MIN_TOUCH,
    gap: space.xs,
  },
  top: { flexDirection: 'row', justifyContent: 'space-between', alignItems: 'center' },
});

/**
 * A circuit's record, on the circuit screen: the recorded trips, the thermal readings at its
 * terminations and its torque checks as one timeline, newest first, each with its verdict; what they say together
 * (nuisanceTripFindings: trips well below the rating with a hot or loose termination point at the
 * termination, not the breaker), its other readings and its open deficiencies.
 */
import { useRouter } from 'expo-router';
import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import { Card } from '@/components/ui/card';
import { useCircuitRecord, type AssessedReading } from '@/hooks/use-records';
import type { BuildingView } from '@/hooks/building-view';
import { NUISANCE_TRIP_LOAD_FRACTION, type NuisanceTripFindings } from '@/shared/calc';
import { isOutstanding, may, todayISO } from '@/shared/deficiency';
import { THERMAL_COMPONENT_LABELS, type TripEvent } from '@/shared/records';
import type { Circuit } from '@/shared/schemas';
import { Button } from '@/components/ui/button';
import { dateTimeWords, dateWords, dueLine } from '@/components/deficiencies/deficiency-format';
import { RowLink, Section, StatusWord } from '@/components/deficiencies/deficiency-parts';
import { PriorityChip } from '@/components/deficiencies/priority-chip';
import { SafetyNote } from '@/components/ui/safety-note';
import { Text } from '@/components/ui/text';
import { colours, space } from '@/components/ui/theme';
import { CircuitThermalTrends } from './thermal-trend';
import { can } from '@/shared/permissions';

/** Entries shown before "Show older". */
const RECENT = 8;

/** One dated line of the record: a trip or a reading, with what to sort it by. */
interface Entry {
  key: string;
  /** ISO date or date-time: trips carry their time, readings their inspection's date */
  at: string;
  node: React.ReactNode;
}

export function CircuitRecord({ circuitId, panelId }: { circuitId: string; panelId: string }) {
  const router = useRouter();
  const [showAll, setShowAll] = useState(false);
  const record = useCircuitRecord(circuitId).data;
  if (!record) return null;
  const { circuit, trips, readings, findings, deficiencies, view } = record;
  const role = view.building.role;
  const outstanding = deficiencies.filter((d) => isOutstanding(d.status)).sort((a, b) => a.dueOn.localeCompare(b.dueOn) || a.priority - b.priority);
  const closed = deficiencies.length - outstanding.length;
  const today = todayISO();
  const openDeficiency = (id: string) => router.push({ pathname: '/deficiencies/[deficiencyId]', params: { deficiencyId: id } });
  // trips, thermal, torque and the other readings as one story, newest first
  const entries: Entry[] = [
    ...trips.map((t) => ({ key: `trip-${t.id}`, at: t.occurredAt, node: <TripRow key={t.id} trip={t} ratingA={circuit.ratingA} /> })),
    ...readings.map((r) => ({
      key: `reading-${r.reading.id}`,
      at: view.inspection(r.reading.inspectionId)?.performedOn ?? '',
      node: <ReadingRow key={r.reading.id} assessed={r} view={view} />,
    })),
  ].sort((a, b) => b.at.localeCompare(a.at));
  const shown = showAll ? entries : entries.slice(0, RECENT);

  return (
    <View style={styles.wrap} testID="circuit-record">
      <Text variant="heading" heading={2}>
        Record
      </Text>
      <Text variant="small" tone="soft">
        Trips, thermal readings at the terminations and torque checks, newest first: a breaker that trips well below its rating is often a loose termination heating it.
      </Text>

      <TripFindingsBox findings={findings} circuit={circuit} tripCount={trips.length} />

      {can(role, 'inspection.record') && (
        <Button
          label="Record a trip"
          tone="secondary"
          onPress={() => router.push({ pathname: '/trips/new', params: { circuitId, panelId } })}
          testID="record-trip"
          style={styles.start}
        />
      )}
      <View style={styles.timeline} role="list" testID="record-timeline">
        {entries.length === 0 ? (
          <Text tone="soft">
            Nothing recorded yet. Record a trip when this breaker trips unexpectedly; thermal scans and torque checks of its terminals are recorded in an inspection.
          </Text>
        ) : (
          shown.map((e) => (
            <View key={e.key} role="listitem">
              {e.node}
            </View>
          ))
        )}
      </View>
      {entries.length > RECENT && (
        <Button
          label={showAll ? 'Show the latest only' : `Show ${entries.length - RECENT} older`}
          tone="quiet"
          onPress={() => setShowAll((v) => !v)}
          testID="record-older"
          style={styles.start}
        />
      )}
      <CircuitThermalTrends readings={readings.filter((r) => r.reading.kind === 'thermal')} view={view} />

      <Section title="Open deficiencies" testID="record-deficiencies" level={3}>
        {outstanding.length === 0 ? (
          <Text tone="soft">None outstanding on this circuit{closed > 0 ? ` (${closed} closed or deferred)` : ''}.</Text>
        ) : (
          outstanding.map((d) => {
            const due = dueLine(d, today);
            return (
              <RowLink key={d.id} label={`Open deficiency ${d.title}`} onPress={() => openDeficiency(d.id)} testID={`record-deficiency-${d.id}`}>
                <View style={styles.inline}>
                  <PriorityChip priority={d.priority} size="small" />
                  <StatusWord status={d.status} />
                </View>
                <Text variant="strong">{d.title}</Text>
                <Text variant="small" tone={due.overdue ? 'danger' : 'soft'}>
                  {due.overdue ? '⚠ ' : ''}
                  {due.text}
                </Text>
              </RowLink>
            );
          })
        )}
        {may(role, 'raise') && (
          <Button
            label="Raise a deficiency on this circuit"
            tone="secondary"
            onPress={() => router.push({ pathname: '/deficiencies/new', params: { buildingId: view.building.id, panelId, circuitId } })}
            testID="raise-circuit-deficiency"
          />
        )}
      </Section>

      <SafetyNote />
    </View>
  );
}

/** What the trips and the termination readings say together, in words. */
function TripFindingsBox({ findings, circuit, tripCount }: { findings: NuisanceTripFindings | null; circuit: Circuit; tripCount: number }) {
  if (!findings) {
    return (
      <Card size="row" testID="trip-findings">
        <Text tone="soft">
          {tripCount > 0
            ? 'Record the breaker’s trip rating on this circuit to judge its trips against it.'
            : 'No trip rating recorded for this circuit: trips cannot be judged against it.'}
        </Text>
      </Card>
    );
  }
  if (findings.reasons.length === 0) {
    if (tripCount === 0) return null;
    return (
      <Card size="row" testID="trip-findings">
        <Text>
          {tripCount} trip{tripCount === 1 ? '' : 's'} recorded, none well below the {circuit.ratingA} A rating: nothing here points at a termination.
        </Text>
      </Card>
    );
  }
  return (
    <Card size="row" strong style={findings.suspectTermination && styles.suspect} testID="trip-findings" accessibilityRole={findings.suspectTermination ? 'alert' : undefined}>
      {findings.suspectTermination && (
        <Text variant="heading" testID="suspect-termination">
          ⚠ Trips well below rating with a hot or loose termination: suspect the termination, not the breaker
        </Text>
      )}
      {!findings.suspectTermination && <Text variant="strong">What the record says</Text>}
      <Text variant="small" tone="soft" testID="trip-counts">
        {countWords(findings, tripCount)}
      </Text>
      {findings.reasons.map((reason) => (
        <Text key={reason} testID="trip-reason">
          • {reason}
        </Text>
      ))}
    </Card>
  );
}

function countWords(f: NuisanceTripFindings, trips: number): string {
  const parts = [
    `${trips} trip${trips === 1 ? '' : 's'} recorded`,
    f.lowLoadTrips > 0 ? `${f.lowLoadTrips} well below the rating` : null,
    f.tripsWithoutLoad > 0 ? `${f.tripsWithoutLoad} with no load recorded` : null,
    f.hotTerminations > 0 ? `${f.hotTerminations} hot termination${f.hotTerminations === 1 ? '' : 's'}` : null,
    f.looseTerminations > 0 ? `${f.looseTerminations} found loose` : null,
  ];
  return parts.filter(Boolean).join(' · ');
}

function TripRow({ trip, ratingA }: { trip: TripEvent; ratingA: number | null }) {
  const load =
    trip.loadA === null
      ? 'load not recorded'
      : ratingA
        ? `${trip.loadA} A (${Math.round((trip.loadA / ratingA) * 100)} % of ${ratingA} A)`
        : `${trip.loadA} A`;
  const verdict =
    trip.loadA === null || !ratingA
      ? null
      : trip.loadA < ratingA * NUISANCE_TRIP_LOAD_FRACTION
        ? '⚠ well below the rating'
        : 'at or near the rating';
  return (
    <Card size="row" testID="trip-row">
      <View style={styles.inline}>
        <Text variant="label" style={styles.kind}>
          TRIP
        </Text>
        <Text variant="strong" style={styles.flex}>
          {dateTimeWords(trip.occurredAt)}
        </Text>
        {verdict && <Text variant="small">{verdict}</Text>}
      </View>
      <Text variant="reading" testID="trip-load">
        {load}
      </Text>
      {trip.circumstances ? <Text variant="small">{trip.circumstances}</Text> : null}
    </Card>
  );
}

const KIND_WORDS: Record<AssessedReading['reading']['kind'], string> = { thermal: 'THERMAL', torque: 'TORQUE', trip: 'TRIP TEST', visual: 'VISUAL' };

function ReadingRow({ assessed, view }: { assessed: AssessedReading; view: BuildingView }) {
  const { reading, assessment } = assessed;
  const inspection = view.inspection(reading.inspectionId);
  const what =
    reading.kind === 'thermal'
      ? [reading.component ? THERMAL_COMPONENT_LABELS[reading.component] : 'Thermal', reading.phase ? `phase ${reading.phase}` : null].filter(Boolean).join(', ')
      : reading.kind === 'torque'
        ? `${reading.fastener || 'Terminal'}${reading.specified && reading.unit ? ` · specified ${reading.specified} ${reading.unit}` : ''}`
        : reading.kind === 'trip'
          ? `Trip test at ${reading.testCurrentA ?? '?'} A`
          : 'Visual';
  return (
    <Card size="row" testID={`reading-${reading.kind}`}>
      <View style={styles.inline}>
        <Text variant="label" style={styles.kind}>
          {KIND_WORDS[reading.kind]}
        </Text>
        <Text variant="strong" style={styles.flex}>
          {what}
        </Text>
        {assessment.priority !== null ? <PriorityChip priority={assessment.priority} size="small" /> : <Text variant="small" tone="soft">no finding</Text>}
      </View>
      <Text variant="reading">{assessment.summary}</Text>
      <Text variant="small" tone="soft">
        {inspection ? `${dateWords(inspection.performedOn)}${inspection.signedAt ? ' · signed' : ''}` : 'inspection not on this device'}
      </Text>
    </Card>
  );
}

const styles = StyleSheet.create({
  wrap: { gap: space.lg },
  timeline: { gap: space.sm },
  start: { alignSelf: 'flex-start' },
  kind: { borderWidth: 1, borderColor: colours.ruleStrong, borderRadius: 4, paddingHorizontal: space.xs },
  inline: { flexDirection: 'row', alignItems: 'center', flexWrap: 'wrap', gap: space.sm },
  flex: { flex: 1 },
  suspect: { borderColor: colours.danger, borderWidth: 2, borderLeftWidth: 8, backgroundColor: colours.dangerSoft },
});

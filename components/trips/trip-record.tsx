/**
 * A circuit's record, on the circuit screen: the recorded trips, the thermal readings at its
 * terminations and its torque record side by side (from 1024 px), what they say together
 * (nuisanceTripFindings: trips well below the rating with a hot or loose termination point at the
 * termination, not the breaker), its other readings and its open deficiencies.
 */
import { useRouter } from 'expo-router';
import { StyleSheet, useWindowDimensions, View } from 'react-native';
import { Card } from '@/components/ui/card';
import { useCircuitRecord, type AssessedReading } from '@/hooks/use-records';
import type { BuildingView } from '@/hooks/building-view';
import type { NuisanceTripFindings } from '@/shared/calc';
import { isOutstanding, may, todayISO } from '@/shared/deficiency';
import { THERMAL_COMPONENT_LABELS, type TripEvent } from '@/shared/records';
import type { Circuit } from '@/shared/schemas';
import { Button } from '@/components/ui/button';
import { dateTimeWords, dateWords, dueLine } from '@/components/deficiencies/deficiency-format';
import { RowLink, Section, StatusWord } from '@/components/deficiencies/deficiency-parts';
import { PriorityChip } from '@/components/deficiencies/priority-chip';
import { SafetyNote } from '@/components/ui/safety-note';
import { Text } from '@/components/ui/text';
import { colours, space, WIDE_MIN_WIDTH } from '@/components/ui/theme';
import { can } from '@/shared/permissions';

const RECENT = 5;

export function CircuitRecord({ circuitId, panelId }: { circuitId: string; panelId: string }) {
  const router = useRouter();
  const { width } = useWindowDimensions();
  const record = useCircuitRecord(circuitId).data;
  if (!record) return null;
  const { circuit, trips, readings, findings, deficiencies, view } = record;
  const role = view.building.role;
  const wide = width >= WIDE_MIN_WIDTH;
  const thermal = readings.filter((r) => r.reading.kind === 'thermal');
  const torque = readings.filter((r) => r.reading.kind === 'torque');
  const other = readings.filter((r) => r.reading.kind === 'trip' || r.reading.kind === 'visual');
  const outstanding = deficiencies.filter((d) => isOutstanding(d.status)).sort((a, b) => a.dueOn.localeCompare(b.dueOn) || a.priority - b.priority);
  const closed = deficiencies.length - outstanding.length;
  const today = todayISO();
  const openDeficiency = (id: string) => router.push({ pathname: '/deficiencies/[deficiencyId]', params: { deficiencyId: id } });

  return (
    <View style={styles.wrap} testID="circuit-record">
      <View style={styles.rule} />
      <Text variant="heading" accessibilityRole="header">
        Record
      </Text>
      <Text variant="small" tone="soft">
        Trips, thermal readings at the terminations and torque checks of this circuit, side by side: a breaker that trips well below its rating is often a loose termination heating it.
      </Text>

      <TripFindingsBox findings={findings} circuit={circuit} tripCount={trips.length} />

      <View style={[styles.columns, wide && styles.columnsWide]} testID="record-columns">
        <View style={[styles.column, wide && styles.columnWide]}>
          <Section
            title="Recorded trips"
            testID="record-trips"
          >
            {can(role, 'inspection.record') && (
              <Button
                label="Record a trip"
                tone="secondary"
                onPress={() => router.push({ pathname: '/trips/new', params: { circuitId, panelId } })}
                testID="record-trip"
              />
            )}
            {trips.length === 0 ? (
              <Text tone="soft">No trips recorded. When this breaker trips unexpectedly, record when, the load and what was happening.</Text>
            ) : (
              <>
                {trips.slice(0, RECENT).map((t) => (
                  <TripRow key={t.id} trip={t} ratingA={circuit.ratingA} />
                ))}
                {trips.length > RECENT && <Text variant="small" tone="soft">+ {trips.length - RECENT} older</Text>}
              </>
            )}
          </Section>
        </View>
        <View style={[styles.column, wide && styles.columnWide]}>
          <Section title="Thermal at the terminations" testID="record-thermal">
            {thermal.length === 0 ? (
              <Text tone="soft">No thermal reading of this circuit yet. A scan of its lug under load is recorded in an inspection.</Text>
            ) : (
              thermal.slice(0, RECENT).map((r) => <ReadingRow key={r.reading.id} assessed={r} view={view} />)
            )}
          </Section>
        </View>
        <View style={[styles.column, wide && styles.columnWide]}>
          <Section title="Torque record" testID="record-torque">
            {torque.length === 0 ? (
              <Text tone="soft">No torque check of this circuit&apos;s terminal yet.</Text>
            ) : (
              torque.slice(0, RECENT).map((r) => <ReadingRow key={r.reading.id} assessed={r} view={view} />)
            )}
          </Section>
        </View>
      </View>

      {other.length > 0 && (
        <Section title="Other readings" testID="record-other">
          {other.slice(0, RECENT).map((r) => (
            <ReadingRow key={r.reading.id} assessed={r} view={view} />
          ))}
        </Section>
      )}

      <Section title="Open deficiencies" testID="record-deficiencies">
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

/**
 * A line at the top of the editor's circuit screen, whose form is long: what the record below
 * holds, and the termination warning when there is one. Nothing when there is no record.
 */
export function CircuitRecordSummary({ circuitId }: { circuitId: string }) {
  const record = useCircuitRecord(circuitId).data;
  if (!record) return null;
  const { trips, readings, deficiencies, findings } = record;
  const open = deficiencies.filter((d) => isOutstanding(d.status)).length;
  if (trips.length + readings.length + open === 0) return null;
  const parts = [
    trips.length ? `${trips.length} recorded trip${trips.length === 1 ? '' : 's'}` : null,
    readings.length ? `${readings.length} reading${readings.length === 1 ? '' : 's'}` : null,
    open ? `${open} open deficienc${open === 1 ? 'y' : 'ies'}` : null,
  ].filter(Boolean);
  return (
    <Card size="row" strong style={findings?.suspectTermination && styles.suspect} testID="record-summary">
      {findings?.suspectTermination ? (
        <Text variant="strong">⚠ Trips well below rating with a hot or loose termination: suspect the termination, not the breaker.</Text>
      ) : null}
      <Text variant="small">{parts.join(' · ')}: see the record below the form.</Text>
    </Card>
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
  return (
    <Card size="row" testID="trip-row">
      <Text variant="strong">{dateTimeWords(trip.occurredAt)}</Text>
      <Text variant="reading" testID="trip-load">
        {load}
      </Text>
      {trip.circumstances ? <Text variant="small">{trip.circumstances}</Text> : null}
    </Card>
  );
}

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
  rule: { height: 1, backgroundColor: colours.rule, marginTop: space.lg },
  columns: { gap: space.lg },
  columnsWide: { flexDirection: 'row', alignItems: 'flex-start' },
  column: { gap: space.sm },
  columnWide: { flex: 1, minWidth: 0 },
  inline: { flexDirection: 'row', alignItems: 'center', flexWrap: 'wrap', gap: space.sm },
  flex: { flex: 1 },
  suspect: { borderColor: colours.danger, borderWidth: 2, borderLeftWidth: 8, backgroundColor: colours.dangerSoft },
});

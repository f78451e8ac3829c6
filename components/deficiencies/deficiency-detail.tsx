/**
 * One deficiency in full: what, how urgent and by when, where, who raised it and from what, its
 * photos, what the signed-in role may do next, and its history with comments. Used by the
 * deficiency screen and by the Findings tab's second pane on a wide screen.
 */
import { useRouter } from 'expo-router';
import { StyleSheet, View } from 'react-native';
import { Card } from '@/components/ui/card';
import { assessOnDevice, useBands, useDeficiency, useMembership, useRecordWrites } from '@/hooks/use-records';
import { useTemperatureUnit } from '@/hooks/use-temperature-unit';
import { confirmAction } from '@/lib/confirm';
import { may, todayISO } from '@/shared/deficiency';
import { INSPECTION_KIND_LABELS, VISUAL_CHECKS, type Deficiency, type Reading } from '@/shared/records';
import { directoryText } from '@/components/register/circuit-format';
import { DeficiencyActions } from './deficiency-actions';
import { authorName, dateTimeWords, dateWords, dueLine, personName, whereParts } from './deficiency-format';
import { DeficiencyHistory } from './deficiency-history';
import { RowLink, Section, StatusWord } from './deficiency-parts';
import { DeficiencyPhotos } from './deficiency-photos';
import { PriorityChip } from './priority-chip';
import { replicaGate } from '@/components/ui/states';
import { Text } from '@/components/ui/text';
import { colours, radii, space } from '@/components/ui/theme';
import { can } from '@/shared/permissions';

const READING_WORDS: Record<Reading['kind'], string> = {
  thermal: 'Thermal reading',
  torque: 'Torque check',
  trip: 'Trip test',
  visual: 'Visual check',
};

/** When a row with a UUIDv7 id was made (its first 48 bits are the milliseconds). */
function madeAt(id: string): string | null {
  const ms = parseInt(id.replace(/-/g, '').slice(0, 12), 16);
  return Number.isFinite(ms) && ms > 0 ? new Date(ms).toISOString() : null;
}

export function DeficiencyDetail({ deficiencyId, onDeleted }: { deficiencyId: string; onDeleted: () => void }) {
  const router = useRouter();
  const query = useDeficiency(deficiencyId);
  const bands = useBands().data;
  const { unit } = useTemperatureUnit();
  const writes = useRecordWrites();
  const membership = useMembership(query.data?.view.building.organisationId);
  const gate = replicaGate(query, 'deficiency');
  if (gate || !query.data) return gate;
  const { deficiency: d, entries, photos, reading, view, circuit } = query.data;
  const role = view.building.role;
  const people = membership?.people ?? [];
  const me = membership?.userId ?? null;
  const buildingId = view.building.id;
  const today = todayISO();
  const due = dueLine(d, today);
  const where = whereParts(view, d);
  const raisedEntry = entries.find((e) => e.kind === 'change' && e.text === 'raised');
  const raisedAt = raisedEntry?.at ?? madeAt(d.id);
  const repairPhotos = photos.filter((p) => p.purpose === 'repair').length;
  const assessment = reading ? assessOnDevice(view, reading, bands, unit) : null;
  const inspection = d.inspectionId ? view.inspection(d.inspectionId) : undefined;
  // photos are recorded by the field team, as readings are (the server checks the same action)
  const fieldWorker = can(role, 'inspection.record');

  const remove = async () => {
    const ok = await confirmAction(
      'Delete this deficiency?',
      `“${d.title}” leaves the record with its history. Only for a deficiency raised by mistake: a real finding that needs no work should be deferred or verified instead.`,
      'Delete',
    );
    if (!ok) return;
    writes.deleteDeficiency(buildingId, d.id);
    onDeleted();
  };

  return (
    <View style={styles.wrap} testID="deficiency-detail">
      <View style={styles.head}>
        <View style={styles.chips}>
          <PriorityChip priority={d.priority} />
          <StatusWord status={d.status} />
        </View>
        <Text variant="title" heading={2} testID="deficiency-title">
          {d.title}
        </Text>
        <Text variant="strong" tone={due.overdue ? 'danger' : 'ink'} testID="deficiency-due">
          {due.overdue ? '⚠ ' : ''}
          {due.text.charAt(0).toUpperCase() + due.text.slice(1)}
        </Text>
        {d.priorityReason ? (
          <Text variant="small" tone="soft">
            Priority set because: {d.priorityReason}
          </Text>
        ) : null}
      </View>

      <Card size="row">
        <Text variant="label" tone="soft">WHERE</Text>
        <Text testID="deficiency-where">{[where.building, where.panel].filter(Boolean).join(' · ')}</Text>
        {circuit && d.panelId ? (
          <RowLink
            label={`Open circuit ${circuit.position}`}
            onPress={() => router.push({ pathname: '/panels/[panelId]/circuits/[circuitId]', params: { panelId: d.panelId!, circuitId: circuit.id } })}
            testID="deficiency-circuit"
          >
            <Text>
              Circuit <Text variant="readingBold">{circuit.position}</Text> · {directoryText(circuit)} ›
            </Text>
          </RowLink>
        ) : where.circuit ? (
          <Text>{where.circuit}</Text>
        ) : (
          <Text variant="small" tone="soft">
            {d.panelId ? 'The panel as a whole (no single circuit).' : 'The building as a whole (no panel).'}
          </Text>
        )}
        <Text variant="small" tone="soft" testID="deficiency-raised">
          Raised by {authorName(d.raisedByName, d.raisedBy, me)}
          {raisedAt ? ` · ${dateTimeWords(raisedAt)}` : ''}
          {' · '}
          {d.source === 'manual' ? 'by hand' : d.source === 'checklist' ? 'from the visual checklist' : 'from a reading'}
        </Text>
        {inspection ? (
          <Text variant="small" tone="soft">
            Inspection: {INSPECTION_KIND_LABELS[inspection.kind]}, {dateWords(inspection.performedOn)}
          </Text>
        ) : null}
      </Card>

      {d.source === 'reading' && (
        <Card size="row" testID="deficiency-source">
          <Text variant="label" tone="soft" heading={2} caps>
            What the reading said
          </Text>
          {reading && assessment ? (
            <>
              <View style={styles.chips}>
                <Text variant="strong">{READING_WORDS[reading.kind]}</Text>
                <PriorityChip priority={assessment.priority} size="small" />
              </View>
              <Text variant="reading">{assessment.summary}</Text>
              <Text variant="small" tone="soft">Judged on: {assessment.basis}</Text>
              {reading.notes ? <Text variant="small">Reading notes: {reading.notes}</Text> : null}
            </>
          ) : (
            <Text tone="soft">The reading is not on this device (deleted, or not yet pulled).</Text>
          )}
        </Card>
      )}
      {d.source === 'checklist' && d.check ? (
        <Card size="row" testID="deficiency-source">
          <Text variant="label" tone="soft" heading={2} caps>
            From the visual checklist
          </Text>
          <Text>{VISUAL_CHECKS[d.check].label}</Text>
        </Card>
      ) : null}

      {d.description ? (
        <Section title="Description">
          <Text testID="deficiency-description">{d.description}</Text>
        </Section>
      ) : null}

      <StateFacts d={d} people={people} me={me} />

      <Section title="Photos of the finding">
        <DeficiencyPhotos buildingId={buildingId} deficiencyId={d.id} purpose="finding" canAdd={fieldWorker} label="Add a photo of the finding" />
      </Section>
      {(d.status !== 'open' || may(role, 'repair')) && (
        <Section title="Repair evidence">
          <DeficiencyPhotos
            buildingId={buildingId}
            deficiencyId={d.id}
            purpose="repair"
            canAdd={fieldWorker && d.status !== 'verified'}
            label="Add a photo of the repair"
          />
        </Section>
      )}

      <Section title="What next" testID="what-next">
        <DeficiencyActions
          key={`${d.id}-${d.status}`}
          deficiency={d}
          role={role}
          people={people}
          me={me}
          dueDays={membership?.settings.dueDays}
          repairPhotos={repairPhotos}
          onPatch={(patch) => writes.patchDeficiency(buildingId, d.id, patch)}
          onComment={(text) => writes.comment(buildingId, d.id, text)}
          onDelete={remove}
        />
      </Section>

      <Section title="History and comments">
        <DeficiencyHistory
          deficiencyId={d.id}
          entries={entries}
          view={view}
          people={people}
          me={me}
          onComment={(text) => writes.comment(buildingId, d.id, text)}
        />
      </Section>
    </View>
  );
}

/** What the status carries: the repair note, the deferral, the owner's acceptance, who does it. */
function StateFacts({ d, people, me }: { d: Deficiency; people: readonly { id: string; name: string }[]; me: string | null }) {
  const facts: { key: string; label: string; text: string }[] = [];
  if (d.assigneeId) facts.push({ key: 'assignee', label: 'Assigned to', text: personName(people, d.assigneeId, me) });
  if (d.repairNote && (d.status === 'repaired' || d.status === 'verified' || d.status === 'open')) {
    facts.push({ key: 'repair', label: 'Repair', text: d.repairNote });
  }
  if (d.status === 'deferred') {
    facts.push({ key: 'defer', label: 'Deferred because', text: d.deferReason || '—' });
    if (d.reviewOn) facts.push({ key: 'review', label: 'Look again on', text: dateWords(d.reviewOn) });
  }
  if (d.acceptedAt) facts.push({ key: 'accepted', label: 'Repair plan', text: `accepted by the owner, ${dateTimeWords(d.acceptedAt)}` });
  if (facts.length === 0) return null;
  return (
    <View style={styles.facts} testID="deficiency-facts">
      {facts.map((f) => (
        <View key={f.key} style={styles.fact}>
          <Text variant="label" tone="soft" style={styles.factLabel}>
            {f.label}
          </Text>
          <Text style={styles.factText}>{f.text}</Text>
        </View>
      ))}
    </View>
  );
}

const styles = StyleSheet.create({
  wrap: { gap: space.lg },
  head: { gap: space.sm },
  chips: { flexDirection: 'row', flexWrap: 'wrap', alignItems: 'center', gap: space.sm },
  facts: {
    borderLeftWidth: 3,
    borderLeftColor: colours.ruleStrong,
    paddingLeft: space.md,
    gap: space.xs,
    borderRadius: radii.sm,
  },
  fact: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
  factLabel: { minWidth: 120 },
  factText: { flex: 1, minWidth: 180 },
});

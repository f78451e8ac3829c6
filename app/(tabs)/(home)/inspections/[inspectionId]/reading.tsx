import { Stack, useLocalSearchParams, useRouter } from 'expo-router';
import { StyleSheet, useWindowDimensions, View } from 'react-native';
import { blankReading, useInspectionActions } from '@/components/inspections/inspection-actions';
import { READING_KIND_LABELS } from '@/components/inspections/inspection-format';
import { ReadingCard } from '@/components/inspections/readings/reading-card';
import { ReadingFollowUp } from '@/components/inspections/readings/reading-follow-up';
import { ReadingForm } from '@/components/inspections/readings/reading-form';
import { TripReadingPlot } from '@/components/trips/trip-reading-plot';
import { SafetyNote } from '@/components/ui/safety-note';
import { Screen } from '@/components/ui/screen';
import { EmptyState, replicaGate } from '@/components/ui/states';
import { Text } from '@/components/ui/text';
import { colours, radii, space, WIDE_MIN_WIDTH } from '@/components/ui/theme';
import { useBands, useInspection } from '@/hooks/use-records';
import { confirmAction } from '@/lib/confirm';
import type { ReadingFields } from '@/shared/records';

type MeasuredKind = 'thermal' | 'torque' | 'trip';
const MEASURED: readonly string[] = ['thermal', 'torque', 'trip'];

/** The caution the kind of work needs before the form (the full caution closes the screen). */
const KIND_CAUTION: Record<MeasuredKind, string> = {
  thermal: 'Scanning with covers open is energised work: NFPA 70E risk assessment, PPE and a qualified person.',
  torque: 'Check and re-torque terminations de-energised and locked out, with a calibrated tool, per NFPA 70E and the maker’s instructions.',
  trip: 'Trip testing by primary injection is done de-energised, with the breaker out of service, per NFPA 70E and the maker’s instructions.',
};

export default function ReadingScreen() {
  const params = useLocalSearchParams<{ inspectionId: string; kind?: string; panelId?: string; readingId?: string }>();
  const router = useRouter();
  const wide = useWindowDimensions().width >= WIDE_MIN_WIDTH;
  const query = useInspection(params.inspectionId);
  const bands = useBands().data;
  const actions = useInspectionActions(query.data?.view, query.data?.inspection);
  const gate = replicaGate(query, 'inspection');
  if (gate || !query.data) return gate;
  const { inspection, readings, deficiencies, view } = query.data;

  const existing = params.readingId ? readings.find((r) => r.reading.id === params.readingId) : undefined;
  if (params.readingId && !existing) {
    return <EmptyState title="Reading not found" hint="It may have been deleted. Go back to the inspection." />;
  }
  const kind = (existing?.reading.kind ?? params.kind) as MeasuredKind;
  if (!MEASURED.includes(kind)) {
    return <EmptyState title="Which kind of reading?" hint="Go back to the inspection and choose thermal, torque or trip test." />;
  }
  const panelId = existing?.reading.panelId ?? (inspection.panelIds.includes(params.panelId ?? '') ? params.panelId : inspection.panelIds[0]);
  const panel = panelId ? view.panel(panelId) : undefined;
  if (!panel) return <EmptyState title="Panel not on this device" hint="The panel of this reading was deleted, or is not in the inspection." />;
  const circuits = view.circuitsOf(panel.id);
  const title = `${READING_KIND_LABELS[kind]} · ${panel.tag}`;
  const back = () =>
    router.canGoBack() ? router.back() : router.replace({ pathname: '/inspections/[inspectionId]', params: { inspectionId: inspection.id } });
  const deficiencyOf = (readingId: string | null) => (readingId ? (deficiencies.find((d) => d.readingId === readingId) ?? null) : null);
  const openDeficiency = (id: string) => router.push({ pathname: '/deficiencies/[deficiencyId]', params: { deficiencyId: id } });

  if (!actions.canRecord) {
    if (!existing) {
      return (
        <EmptyState
          title={actions.signed ? 'This inspection is signed' : 'Readings are recorded by the field team'}
          hint={actions.signed ? 'A signed inspection is frozen: start a new inspection for later readings.' : `As ${actions.role} you can read the readings, not add them.`}
        />
      );
    }
    return (
      <>
        <Stack.Screen options={{ title }} />
        <Screen>
          <ReadingCard
            reading={existing.reading}
            assessment={existing.assessment}
            circuit={existing.reading.circuitId ? (view.circuit(existing.reading.circuitId) ?? null) : null}
            hasDeficiency={!!deficiencyOf(existing.reading.id)}
          />
          <TripReadingPlot reading={existing.reading} assessment={existing.assessment} circuits={circuits} bands={bands} />
          <ReadingFollowUp
            kind={kind}
            saved={existing}
            dirty={false}
            deficiency={deficiencyOf(existing.reading.id)}
            canRaise={false}
            canAddPhotos={false}
            buildingId={view.building.id}
            onRaise={() => undefined}
            onOpenDeficiency={(d) => openDeficiency(d.id)}
          />
          <SafetyNote />
        </Screen>
      </>
    );
  }

  const initial: ReadingFields = existing?.reading ?? {
    ...blankReading(inspection.id, panel.id, kind),
    ...(kind === 'thermal' ? { component: 'lug', referenceBasis: 'similar' } : {}),
    ...(kind === 'torque' ? { unit: 'lbf-in', specSource: 'maker' } : {}),
  };

  return (
    <>
      <Stack.Screen options={{ title }} />
      <Screen wide={wide}>
        <View style={styles.head}>
          <Text variant="small" tone="soft">
            {view.building.name} · panel {panel.tag}
          </Text>
          <Text variant="title" heading={2}>{existing ? READING_KIND_LABELS[kind] : `New ${READING_KIND_LABELS[kind].toLowerCase()}`}</Text>
          <View style={styles.caution} testID="kind-caution">
            <Text variant="small">⚠ {KIND_CAUTION[kind]}</Text>
          </View>
        </View>
        <ReadingForm
          initial={initial}
          readingId={existing?.reading.id ?? null}
          panel={panel}
          circuits={circuits}
          bands={bands}
          ambientC={inspection.ambientC}
          wide={wide}
          contextFor={(r) => {
            const circuit = r.circuitId ? (view.circuit(r.circuitId) ?? null) : null;
            const bandId = r.bandId ?? circuit?.bandId ?? null;
            return { circuit, panel, band: bandId ? bands?.find((b) => b.id === bandId) : null };
          }}
          onCreate={(body) => {
            const id = actions.writes.createReading(actions.buildingId, body);
            // a reload, or a link, now opens the saved reading
            router.setParams({ readingId: id });
            return id;
          }}
          onPatch={(id, patch) => actions.writes.patchReading(actions.buildingId, id, patch)}
          onDelete={async (id) => {
            const raised = deficiencyOf(id);
            const ok = await confirmAction(
              'Delete this reading?',
              raised ? 'The reading is removed from the inspection. The deficiency raised from it stays.' : 'The reading is removed from the inspection.',
              'Delete',
            );
            if (!ok) return;
            actions.writes.deleteReading(actions.buildingId, id);
            back();
          }}
          onDone={back}
          followUp={({ readingId, dirty }) => {
            const saved = readingId ? (readings.find((r) => r.reading.id === readingId) ?? null) : null;
            return (
              <ReadingFollowUp
                kind={kind}
                saved={saved}
                dirty={dirty}
                deficiency={deficiencyOf(readingId)}
                canRaise={actions.canRaise}
                canAddPhotos={actions.canRecord}
                buildingId={view.building.id}
                onRaise={() => saved && actions.raiseFromReading(saved.reading, saved.assessment)}
                onOpenDeficiency={(d) => openDeficiency(d.id)}
              />
            );
          }}
        />
        <SafetyNote />
      </Screen>
    </>
  );
}

const styles = StyleSheet.create({
  head: { gap: space.xs },
  caution: { borderLeftWidth: 4, borderLeftColor: colours.warn, backgroundColor: colours.warnSoft, padding: space.sm, borderRadius: radii.sm },
});

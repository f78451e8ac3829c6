import { Stack, useLocalSearchParams, useRouter } from 'expo-router';
import { useState } from 'react';
import { StyleSheet, useWindowDimensions, View } from 'react-native';
import { useInspectionActions } from '@/components/inspections/inspection-actions';
import { InspectionDeficiencies } from '@/components/inspections/inspection-deficiencies';
import { InspectionForm } from '@/components/inspections/inspection-form';
import { INSPECTION_KIND_LABELS } from '@/shared/records';
import { InspectionHeader } from '@/components/inspections/inspection-header';
import { InspectionPanel } from '@/components/inspections/inspection-panel';
import { InspectionSignOff } from '@/components/inspections/inspection-signoff';
import { ReportPdfButton, SendReportButton } from '@/components/documents/print-button';
import { SafetyNote } from '@/components/ui/safety-note';
import { Screen } from '@/components/ui/screen';
import { replicaGate } from '@/components/ui/states';
import { space, WIDE_MIN_WIDTH } from '@/components/ui/theme';
import { useInspection } from '@/hooks/use-records';

export default function InspectionScreen() {
  const { inspectionId } = useLocalSearchParams<{ inspectionId: string }>();
  const router = useRouter();
  const wide = useWindowDimensions().width >= WIDE_MIN_WIDTH;
  const query = useInspection(inspectionId);
  const [editing, setEditing] = useState(false);
  const actions = useInspectionActions(query.data?.view, query.data?.inspection);
  const gate = replicaGate(query, 'inspection');
  if (gate || !query.data) return gate;
  const { inspection, readings, deficiencies, panels, view } = query.data;
  const raisedFor = new Set(deficiencies.map((d) => d.readingId).filter((id): id is string => !!id));
  const panelsWithReadings = [...new Set(readings.map((r) => r.reading.panelId))];

  const header = editing ? (
    <InspectionForm
      panels={view.panels()}
      initial={inspection}
      isNew={false}
      lockedPanelIds={panelsWithReadings}
      onCancel={() => setEditing(false)}
      onSubmit={(patch) => {
        if (Object.keys(patch).length > 0) actions.writes.patchInspection(actions.buildingId, inspection.id, patch);
        setEditing(false);
      }}
    />
  ) : (
    <InspectionHeader
      inspection={inspection}
      buildingName={view.building.name}
      panels={panels}
      myId={actions.myId}
      onEdit={actions.canRecord ? () => setEditing(true) : undefined}
    />
  );

  const panelSections = panels.map((panel) => (
    <InspectionPanel
      key={panel.id}
      panel={panel}
      view={view}
      readings={readings.filter((r) => r.reading.panelId === panel.id)}
      raisedFor={raisedFor}
      kind={inspection.kind}
      canRecord={actions.canRecord}
      canRaise={actions.canRaise}
      onAdd={(kind) =>
        router.push({ pathname: '/inspections/[inspectionId]/reading', params: { inspectionId, kind, panelId: panel.id } })
      }
      onOpenReading={(reading) =>
        router.push({ pathname: '/inspections/[inspectionId]/reading', params: { inspectionId, readingId: reading.id } })
      }
      onTick={(check) => actions.tick(panel.id, check)}
      onUntick={(reading) => void actions.untick(reading, raisedFor.has(reading.id))}
    />
  ));

  const aside = (
    <>
      <InspectionDeficiencies
        deficiencies={deficiencies}
        view={view}
        canRaise={actions.canRaise}
        signed={inspection.signedAt !== null}
        onOpen={(d) => router.push({ pathname: '/deficiencies/[deficiencyId]', params: { deficiencyId: d.id } })}
      />
      <SafetyNote />
      <InspectionSignOff
        inspection={inspection}
        readingCount={readings.length}
        deficiencyCount={deficiencies.length}
        canSign={actions.canSign}
        myId={actions.myId}
        onSign={() => void actions.sign()}
      />
    </>
  );

  return (
    <>
      <Stack.Screen options={{ title: INSPECTION_KIND_LABELS[inspection.kind] }} />
      <Screen wide={wide}>
        {header}
        {!editing && <ReportPdfButton inspectionId={inspection.id} />}
        {!editing && actions.canSign && <SendReportButton inspectionId={inspection.id} />}
        {wide ? (
          <View style={styles.columns}>
            <View style={styles.main}>{panelSections}</View>
            <View style={styles.aside}>{aside}</View>
          </View>
        ) : (
          <>
            {panelSections}
            {aside}
          </>
        )}
      </Screen>
    </>
  );
}

const styles = StyleSheet.create({
  columns: { flexDirection: 'row', gap: space.xl, alignItems: 'flex-start' },
  main: { flex: 3, gap: space.lg },
  aside: { flex: 2, gap: space.lg },
});

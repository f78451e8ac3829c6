import { Stack, useLocalSearchParams, useRouter } from 'expo-router';
import { useMemo } from 'react';
import { StyleSheet, View } from 'react-native';
import { PhotoStrip } from '@/components/documents/photos';
import { FaultCheckCard } from '@/components/register/fault-check';
import { MeasuredLoad } from '@/components/register/measured-load';
import { PanelActions } from '@/components/register/panel-actions';
import { ArcFlashCard } from '@/components/register/arc-flash-card';
import { PanelLoadSummary } from '@/components/register/panel-load';
import { SpareCapacityCalculator } from '@/components/register/spare-capacity';
import { PanelProblems } from '@/components/register/panel-problems';
import { PanelSchedule, warningsByCircuit } from '@/components/register/panel-schedule';
import { SafetyNote } from '@/components/ui/safety-note';
import { Screen } from '@/components/ui/screen';
import { replicaGate } from '@/components/ui/states';
import { Text } from '@/components/ui/text';
import { colours, radii, space } from '@/components/ui/theme';
import { usePanel } from '@/hooks/use-register';
import { SYSTEM_INFO } from '@/shared/domain';
import { can } from '@/shared/permissions';

export default function PanelScreen() {
  const { panelId } = useLocalSearchParams<{ panelId: string }>();
  const router = useRouter();
  const query = usePanel(panelId);
  const warnings = useMemo(
    () => (query.data ? warningsByCircuit(query.data.panel, query.data.circuits) : new Map()),
    [query.data],
  );
  const gate = replicaGate(query, 'panel');
  if (gate || !query.data) return gate;
  const { panel, building, circuits } = query.data;
  const canEdit = can(building.role, 'schedule.edit');
  const openCircuit = (circuit: { id: string }) =>
    router.push({ pathname: '/panels/[panelId]/circuits/[circuitId]', params: { panelId, circuitId: circuit.id } });
  const problems = circuits
    .map((circuit) => ({ circuit, warnings: warnings.get(circuit.id) ?? [] }))
    .filter((p) => p.warnings.length > 0);
  const facts = [
    SYSTEM_INFO[panel.system].label,
    `${panel.busRatingA} A bus`,
    panel.mainRatingA ? `${panel.mainRatingA} A main` : 'main lugs only',
    panel.shortCircuitKA ? `${panel.shortCircuitKA} kA` : null,
    `${panel.spaces} spaces`,
  ].filter(Boolean);
  return (
    <>
      <Stack.Screen options={{ title: `Panel ${panel.tag}` }} />
      <Screen wide>
        <View style={styles.head}>
          <View style={styles.tag}>
            <Text variant="title" tone="paper" style={styles.tagText}>{panel.tag}</Text>
          </View>
          <View style={styles.headText}>
            <Text variant="small" tone="soft">{building.name}</Text>
            <Text variant="strong">{panel.location || 'Location not recorded'}</Text>
            <Text variant="small" tone="soft">{facts.join(' · ')}</Text>
            {(panel.maker || panel.model) && (
              <Text variant="small" tone="faint">{[panel.maker, panel.model].filter(Boolean).join(' — ')}</Text>
            )}
          </View>
        </View>
        <PanelActions panelId={panelId} buildingId={building.id} role={building.role} canEdit={canEdit} />
        {!canEdit && (
          <View style={styles.readOnly} testID="read-only-note">
            <Text variant="small">Read only: as {building.role} you can view this schedule but not change it.</Text>
          </View>
        )}
        <PanelSchedule
          panel={panel}
          circuits={circuits}
          warnings={warnings}
          canEdit={canEdit}
          onOpenCircuit={openCircuit}
          onAddAt={(position) =>
            router.push({ pathname: '/panels/[panelId]/new-circuit', params: { panelId, position: String(position) } })
          }
        />
        {/* the panel's figures after its schedule; a card about the panel as a whole sits here, one line each */}
        <View style={styles.overview}>
          <View style={styles.overviewItem}>
            <PanelLoadSummary panel={panel} circuits={circuits} />
          </View>
          <View style={styles.overviewItem}>
            <PanelProblems problems={problems} onOpen={openCircuit} />
          </View>
        </View>
        <FaultCheckCard panel={panel} circuits={circuits} />
        <ArcFlashCard buildingId={building.id} panelId={panel.id} role={building.role} />
        <View style={styles.overview}>
          <View style={styles.overviewItem}>
            <MeasuredLoad panel={panel} circuits={circuits} />
          </View>
          <View style={styles.overviewItem}>
            <SpareCapacityCalculator panel={panel} circuits={circuits} />
          </View>
        </View>
        <PhotoStrip buildingId={building.id} parentKind="panel" parentId={panel.id} purpose="equipment" canAdd={can(building.role, 'inspection.record')} label="Add panel photo" />
        <SafetyNote />
      </Screen>
    </>
  );
}

const styles = StyleSheet.create({
  head: { flexDirection: 'row', alignItems: 'center', gap: space.md, flexWrap: 'wrap' },
  tag: { backgroundColor: colours.ink, borderRadius: radii.md, paddingHorizontal: space.md, paddingVertical: space.xs },
  tagText: { fontFamily: 'IBMPlexMono-SemiBold' },
  headText: { flex: 1, minWidth: 200, gap: 2 },
  // side by side when there is room, stacked on a phone
  overview: { flexDirection: 'row', flexWrap: 'wrap', gap: space.lg },
  overviewItem: { flexGrow: 1, flexBasis: 340 },
  readOnly: { backgroundColor: colours.copperSoft, padding: space.sm, borderRadius: radii.sm },
});

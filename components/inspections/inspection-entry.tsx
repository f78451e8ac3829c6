/**
 * Where inspections are reached from: the building's list of them with "New inspection", and the
 * panel's "Inspect this panel". Owners read inspections but never start one.
 */
import { useRouter } from 'expo-router';
import { StyleSheet, View } from 'react-native';
import { useInspections } from '@/hooks/use-records';
import { useBuilding } from '@/hooks/use-register';
import type { Role } from '@/shared/domain';
import { Button } from '@/components/ui/button';
import { InspectionList } from './inspection-list';
import { Text } from '@/components/ui/text';
import { space } from '@/components/ui/theme';
import { can } from '@/shared/permissions';

export function BuildingInspections({ buildingId }: { buildingId: string }) {
  const router = useRouter();
  const building = useBuilding(buildingId).data;
  const inspections = useInspections(buildingId).data ?? [];
  if (!building) return null;
  const canRecord = can(building.building.role, 'inspection.record');
  return (
    <View style={styles.section} testID="building-inspections">
      <View style={styles.head}>
        <Text variant="label" tone="soft" heading={2} caps style={styles.title}>Inspections ({inspections.length})</Text>
        {canRecord && (
          <Button
            label="New inspection"
            tone="secondary"
            onPress={() => router.push({ pathname: '/inspections/new', params: { buildingId } })}
            testID="new-inspection"
          />
        )}
      </View>
      {inspections.length === 0 ? (
        <Text tone="soft">
          {canRecord
            ? 'No inspections yet. Start one for a round of the building here, or from a panel with “Inspect this panel”.'
            : 'No inspections recorded yet.'}
        </Text>
      ) : (
        <InspectionList
          inspections={inspections}
          panels={building.panels}
          onOpen={(i) => router.push({ pathname: '/inspections/[inspectionId]', params: { inspectionId: i.id } })}
        />
      )}
    </View>
  );
}

export function InspectPanelButton({ role, buildingId, panelId }: { role: Role; buildingId: string; panelId: string }) {
  const router = useRouter();
  if (!can(role, 'inspection.record')) return null;
  return (
    <Button
      label="Inspect this panel"
      tone="secondary"
      onPress={() => router.push({ pathname: '/inspections/new', params: { buildingId, panelId } })}
      testID="inspect-panel"
    />
  );
}

const styles = StyleSheet.create({
  section: { gap: space.sm },
  head: { flexDirection: 'row', alignItems: 'center', gap: space.md },
  title: { flex: 1 },
});

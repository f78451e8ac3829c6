import { Stack, useLocalSearchParams, useRouter } from 'expo-router';
import { StyleSheet, View } from 'react-native';
import { BuildingDeficiencies } from '@/components/deficiencies/deficiency-building';
import { DirectorySearch } from '@/components/register/directory-search';
import { FeederTree } from '@/components/register/feeder-tree';
import { BuildingInspections } from '@/components/inspections/inspection-entry';
import { BuildingMaintenanceDue } from '@/components/register/maintenance-due';
import { Screen } from '@/components/ui/screen';
import { EmptyState, replicaGate } from '@/components/ui/states';
import { Text } from '@/components/ui/text';
import { space } from '@/components/ui/theme';
import { useBuilding } from '@/hooks/use-register';

export default function BuildingScreen() {
  const { buildingId } = useLocalSearchParams<{ buildingId: string }>();
  const router = useRouter();
  const query = useBuilding(buildingId);
  const gate = replicaGate(query, 'building');
  if (gate || !query.data) return gate;
  const { building, panels } = query.data;
  return (
    <>
      <Stack.Screen options={{ title: building.name }} />
      <Screen>
        <View style={styles.head}>
          <Text variant="title">{building.name}</Text>
          {building.address ? <Text tone="soft">{building.address}</Text> : null}
          {building.notes ? <Text variant="small" tone="faint">{building.notes}</Text> : null}
        </View>
        <DirectorySearch buildingId={building.id} />
        <Text variant="label" tone="soft" heading={2} caps>Panels, as the power flows</Text>
        {panels.length === 0 ? (
          <EmptyState title="No panels recorded" hint="Panels of this building will appear here, arranged by which panel feeds which." />
        ) : (
          <FeederTree
            panels={panels}
            onOpen={(panel) => router.push({ pathname: '/panels/[panelId]', params: { panelId: panel.id } })}
          />
        )}
        <BuildingInspections buildingId={building.id} />
        <BuildingDeficiencies buildingId={building.id} />
        <BuildingMaintenanceDue buildingId={building.id} />
      </Screen>
    </>
  );
}

const styles = StyleSheet.create({ head: { gap: space.xs } });

/**
 * A building's deficiencies at a glance, for the building screen: how many are outstanding (by
 * priority, in words) with a way into Findings, and "Raise a deficiency" for inspectors and admins.
 */
import { useRouter } from 'expo-router';
import { StyleSheet, View } from 'react-native';
import { useAllDeficiencies } from '@/hooks/use-records';
import { useBuilding } from '@/hooks/use-register';
import { isOutstanding, may } from '@/shared/deficiency';
import { PRIORITIES, PRIORITY_LABELS } from '@/shared/records';
import { Button } from '@/components/ui/button';
import { Text } from '@/components/ui/text';
import { space } from '@/components/ui/theme';

export function BuildingDeficiencies({ buildingId }: { buildingId: string }) {
  const router = useRouter();
  const building = useBuilding(buildingId).data?.building;
  const rows = useAllDeficiencies().data ?? [];
  if (!building) return null;
  const outstanding = rows.filter((r) => r.deficiency.buildingId === buildingId && isOutstanding(r.deficiency.status));
  const counts = PRIORITIES.map((p) => ({ p, n: outstanding.filter((r) => r.deficiency.priority === p).length })).filter((c) => c.n > 0);
  return (
    <View style={styles.wrap} testID="building-deficiencies">
      <Text variant="label" tone="soft" heading={2} caps>Deficiencies</Text>
      <Text testID="building-deficiency-count">
        {outstanding.length === 0
          ? 'No outstanding deficiencies in this building.'
          : `${outstanding.length} outstanding: ${counts.map((c) => `${c.n} ${PRIORITY_LABELS[c.p]}`).join(', ')}.`}
      </Text>
      <View style={styles.buttons}>
        {outstanding.length > 0 && (
          <Button
            label="See them in Findings"
            tone="secondary"
            onPress={() => router.push({ pathname: '/findings', params: { buildingId } })}
            testID="building-findings"
          />
        )}
        {may(building.role, 'raise') && (
          <Button
            label="Raise a deficiency"
            tone="secondary"
            onPress={() => router.push({ pathname: '/deficiencies/new', params: { buildingId } })}
            testID="raise-deficiency"
          />
        )}
      </View>
    </View>
  );
}

const styles = StyleSheet.create({
  wrap: { gap: space.sm },
  buttons: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
});

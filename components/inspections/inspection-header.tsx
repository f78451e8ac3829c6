/** The head of an inspection: what, when, who, the conditions at the time, and its sign-off. */
import { StyleSheet, View } from 'react-native';
import { Card } from '@/components/ui/card';
import { INSPECTION_KIND_LABELS, type Inspection } from '@/shared/records';
import type { Panel } from '@/shared/schemas';
import { Button } from '@/components/ui/button';
import { InspectionLoadWarning } from './inspection-form';
import { dateText, personName, signedLine } from './inspection-format';
import { Text } from '@/components/ui/text';
import { colours, radii, space } from '@/components/ui/theme';
import { useTemperatureUnit } from '@/hooks/use-temperature-unit';
import { formatTemp } from '@/shared/units';

function Fact({ label, value, testID }: { label: string; value: string; testID?: string }) {
  return (
    <View style={styles.fact}>
      <Text variant="label" tone="soft">{label}</Text>
      <Text variant="reading" testID={testID}>{value}</Text>
    </View>
  );
}

export function InspectionHeader({
  inspection,
  buildingName,
  panels,
  myId,
  onEdit,
}: {
  inspection: Inspection;
  buildingName: string;
  panels: Panel[];
  myId: string | null;
  /** absent when the details cannot be changed */
  onEdit?: () => void;
}) {
  const signed = signedLine(inspection, myId);
  const { unit } = useTemperatureUnit();
  return (
    <View style={styles.head} testID="inspection-header">
      <View style={styles.titleRow}>
        <View style={styles.titleText}>
          <Text variant="small" tone="soft">{buildingName}</Text>
          <Text variant="title" heading={2}>{INSPECTION_KIND_LABELS[inspection.kind]}</Text>
          <Text tone="soft">
            {dateText(inspection.performedOn)} · by {personName(inspection.inspectorName, inspection.inspectorId, myId)}
          </Text>
        </View>
        {onEdit && <Button label="Edit details" tone="secondary" onPress={onEdit} testID="edit-inspection" />}
      </View>
      <Card size="row" style={styles.facts}>
        <Fact label="PANELS" value={panels.map((p) => p.tag).join(' ') || '—'} />
        <Fact label="AMBIENT" value={formatTemp(inspection.ambientC, unit, 'absolute', 'not recorded')} testID="inspection-ambient" />
        <Fact label="LOAD AT THE TIME" value={inspection.loadPct === null ? 'not recorded' : `${inspection.loadPct} % of normal`} testID="inspection-load" />
      </Card>
      <InspectionLoadWarning kind={inspection.kind} loadPct={inspection.loadPct} />
      {inspection.notes ? <Text>{inspection.notes}</Text> : null}
      {signed ? (
        <View style={styles.signed} testID="signed-line">
          <Text variant="strong" tone="paper">✓ {signed}</Text>
          <Text variant="small" tone="paper">Frozen: later changes need a new inspection.</Text>
        </View>
      ) : (
        <Text variant="small" tone="faint" testID="not-signed">Not signed yet: readings can still be added and changed.</Text>
      )}
    </View>
  );
}

const styles = StyleSheet.create({
  head: { gap: space.md },
  titleRow: { flexDirection: 'row', alignItems: 'flex-start', gap: space.md, flexWrap: 'wrap' },
  titleText: { flex: 1, minWidth: 220, gap: 2 },
  facts: {
    flexDirection: 'row',
    flexWrap: 'wrap',
    gap: space.lg,
  },
  fact: { gap: 2, minWidth: 96 },
  signed: { backgroundColor: colours.ink, borderRadius: radii.md, padding: space.md, gap: 2 },
});

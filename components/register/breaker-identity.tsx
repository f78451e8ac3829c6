import { StyleSheet, View } from 'react-native';
import { PhotoStrip } from '@/components/documents/photos';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { Text } from '@/components/ui/text';
import { space } from '@/components/ui/theme';
import { useCircuitWrites } from '@/hooks/use-outbox';
import { useMembership } from '@/hooks/use-records';
import { can } from '@/shared/permissions';
import { todayISO } from '@/shared/deficiency';
import type { Building, Circuit, Panel } from '@/shared/schemas';
import { breakerFaultFinding } from './fault-check';

/**
 * The breaker itself on the circuit's record: make, catalogue number and interrupting rating (with
 * the NEC 110.9 flag against the panel's available fault current), whether the entry was traced at
 * the panel ("verified on … by …", set by "Verified at the panel"), and photos of the breaker.
 */
export function BreakerIdentity({ circuit, panel, building }: { circuit: Circuit; panel: Panel; building: Building }) {
  const writes = useCircuitWrites(panel.id);
  const membership = useMembership(building.organisationId);
  const canEdit = can(building.role, 'schedule.edit');
  const finding = breakerFaultFinding(panel, circuit);
  if (circuit.status === 'space') return null;
  const identity = [circuit.breakerMake, circuit.catalogueNumber].filter(Boolean).join(' ');
  const verifier = circuit.verifiedBy
    ? (membership?.people.find((p) => p.id === circuit.verifiedBy)?.name ?? 'someone no longer listed')
    : null;
  const verify = () => {
    if (!membership) return;
    writes.save(circuit.id, { verifiedOn: todayISO(), verifiedBy: membership.userId });
  };
  return (
    <Card testID="breaker-identity">
      <Text variant="label" heading={2}>Breaker</Text>
      <Text variant="body">{identity || 'Make and catalogue number not recorded'}</Text>
      <Text variant="small" tone={finding ? 'danger' : 'soft'} testID="breaker-interrupting">
        {circuit.interruptingKA ? `Interrupting rating ${circuit.interruptingKA} kA` : 'Interrupting rating not recorded'}
        {finding ? ` — ⚠ below the available fault current. ${finding}` : ''}
      </Text>
      <View style={styles.verified}>
        <Text variant="strong" tone={circuit.verifiedOn ? 'ink' : 'warn'} testID="breaker-verified">
          {circuit.verifiedOn ? `Verified on ${circuit.verifiedOn} by ${verifier ?? '—'}` : 'Not verified at the panel'}
        </Text>
        {canEdit && membership && (
          <Button
            label="Verified at the panel"
            tone="secondary"
            onPress={verify}
            testID="verify-breaker"
            accessibilityHint="Records today and your name: you traced this breaker to what it feeds"
          />
        )}
      </View>
      <PhotoStrip buildingId={building.id} parentKind="circuit" parentId={circuit.id} purpose="equipment" canAdd={can(building.role, 'inspection.record')} label="Add breaker photo" />
    </Card>
  );
}

const styles = StyleSheet.create({
  verified: { gap: space.sm },
});

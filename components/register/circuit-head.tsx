/**
 * The top of a circuit's record: what the door says, the breaker, the conductor and the load in a
 * few lines, and the checks that need a look. Everyone sees this first; the form is one action away.
 */
import { StyleSheet, View } from 'react-native';
import { circuitWarnings, occupiedPositions, phaseOf } from '@/shared/calc';
import type { Circuit, Panel } from '@/shared/schemas';
import { Card } from '@/components/ui/card';
import { Text } from '@/components/ui/text';
import { space } from '@/components/ui/theme';
import { BREAKER_TYPE_LABELS, CircuitWarningsBox, LOAD_KIND_LABELS, panelTermination, STATUS_LABELS } from './circuit-form';
import { breakerLabel, conductorLabel, directoryText, vaLabel } from './circuit-format';

function Fact({ label, value, testID }: { label: string; value: string; testID?: string }) {
  return (
    <View style={styles.fact} testID={testID}>
      <Text variant="label" tone="soft" heading={3} style={styles.factLabel}>
        {label}
      </Text>
      <Text style={styles.factValue}>{value || '—'}</Text>
    </View>
  );
}

export function CircuitHead({ circuit, panel }: { circuit: Circuit; panel: Panel }) {
  const isSpace = circuit.status === 'space';
  const phases = occupiedPositions(circuit.position, circuit.poles).map((p) => phaseOf(panel.system, p)).join('-');
  const positions = occupiedPositions(circuit.position, circuit.poles).join(', ');
  const breaker = isSpace
    ? 'none (space)'
    : [breakerLabel(circuit), BREAKER_TYPE_LABELS[circuit.breakerType], circuit.handleLock ? 'handle lock' : null].filter(Boolean).join(' · ');
  const conductor = [
    conductorLabel(circuit) ?? 'size not recorded',
    circuit.insulationTempC ? `${circuit.insulationTempC} °C insulation` : null,
    circuit.lengthFt ? `${circuit.lengthFt} ft one way` : null,
    circuit.terminationTempC ? `terminals ${circuit.terminationTempC} °C` : `terminals as the panel (${panelTermination(panel)})`,
  ]
    .filter(Boolean)
    .join(' · ');
  const load = [LOAD_KIND_LABELS[circuit.loadKind], vaLabel(circuit.loadVA), circuit.continuous ? 'continuous' : null].filter(Boolean).join(' · ');
  return (
    <View style={styles.wrap} testID="circuit-head">
      <Text variant="title" heading={2} testID="circuit-description">
        {directoryText(circuit)}
      </Text>
      <Text variant="small" tone="soft">
        Position {positions} · phase {phases} · {STATUS_LABELS[circuit.status]}
      </Text>
      <CircuitWarningsBox warnings={circuitWarnings(circuit, panel)} />
      <Card size="row" style={styles.facts}>
        <Fact label="Breaker" value={breaker} testID="circuit-breaker" />
        {!isSpace && <Fact label="Conductor" value={conductor} testID="circuit-conductor" />}
        {!isSpace && <Fact label="Load" value={load} />}
        {circuit.notes ? <Fact label="Notes" value={circuit.notes} /> : null}
      </Card>
    </View>
  );
}

const styles = StyleSheet.create({
  wrap: { gap: space.sm },
  facts: { gap: space.xs },
  fact: { flexDirection: 'row', flexWrap: 'wrap', columnGap: space.md },
  factLabel: { width: 84, paddingTop: 2 },
  factValue: { flex: 1, minWidth: 180 },
});

import { useMemo } from 'react';
import { StyleSheet, View } from 'react-native';
import { Card } from '@/components/ui/card';
import { Text } from '@/components/ui/text';
import { colours, radii, space } from '@/components/ui/theme';
import { faultSourceText, panelFaultCheck } from '@/shared/panel-checks';
import type { Circuit, Panel } from '@/shared/schemas';

const plural = (n: number, one: string, many: string) => `${n} ${n === 1 ? one : many}`;

/**
 * The panel's available fault current against its own short-circuit rating and every breaker's
 * interrupting rating (NEC 110.9, 110.10), with the series-rating note (240.86). The figure is
 * recorded from the 110.24 label, the utility or an engineer — this card never computes it.
 */
export function FaultCheckCard({ panel, circuits }: { panel: Panel; circuits: Circuit[] }) {
  const check = useMemo(() => panelFaultCheck(panel, circuits), [panel, circuits]);
  if (!check.judged) {
    return (
      <Card testID="fault-check">
        <Text variant="label" heading={2}>Available fault current</Text>
        <Text variant="small" tone="soft">{check.reason}</Text>
      </Card>
    );
  }
  const breakers = check.findings.filter((f) => f.subject === 'breaker');
  const panelFinding = check.findings.find((f) => f.subject === 'panel');
  const source = faultSourceText(panel);
  const verdict =
    check.findings.length === 0
      ? 'every recorded rating is at least that'
      : [breakers.length > 0 ? `${plural(breakers.length, 'breaker', 'breakers')} rated below it` : null, panelFinding ? 'the panel rated below it' : null]
          .filter(Boolean)
          .join(', ');
  return (
    <Card testID="fault-check" style={check.findings.length > 0 ? styles.flagged : undefined}>
      <Text variant="strong" heading={2} testID="fault-check-headline">
        Available fault current {check.availableKA} kA{source ? ` (${source})` : ''} — {verdict}
      </Text>
      <Text variant="small" tone="soft">
        NEC 110.9: a breaker’s interrupting rating must be at least the current available at its line terminals; 110.10:
        so must the panel’s short-circuit current rating.
      </Text>
      {check.findings.map((f) => (
        <Text key={f.id ?? 'panel'} variant="small" tone="danger" testID={f.id ? `fault-finding-${f.id}` : 'fault-finding-panel'}>
          ⚠ {f.message}
        </Text>
      ))}
      {check.notRecorded.length > 0 && (
        <Text variant="small" tone="faint">
          Not recorded, so not judged: {check.notRecorded.slice(0, 6).join(', ')}
          {check.notRecorded.length > 6 ? ` and ${check.notRecorded.length - 6} more` : ''}.
        </Text>
      )}
      {check.seriesNote && (
        <View style={styles.note}>
          <Text variant="small">{check.seriesNote}</Text>
          {panel.seriesRatingNote ? <Text variant="small" tone="soft">Marked: {panel.seriesRatingNote}</Text> : null}
        </View>
      )}
    </Card>
  );
}

/**
 * One breaker's interrupting rating against its panel's available fault current, for the circuit
 * record: null when it is not judged (no fault current or no rating recorded).
 */
export function breakerFaultFinding(panel: Panel, circuit: Circuit): string | null {
  const check = panelFaultCheck(panel, [circuit]);
  if (!check.judged) return null;
  return check.findings.find((f) => f.id === circuit.id)?.message ?? null;
}

const styles = StyleSheet.create({
  flagged: { borderColor: colours.danger, borderLeftWidth: 4 },
  note: { backgroundColor: colours.warnSoft, padding: space.sm, borderRadius: radii.sm, gap: space.xs },
});

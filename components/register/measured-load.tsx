import { useMemo } from 'react';
import { StyleSheet, View } from 'react-native';
import { Card } from '@/components/ui/card';
import { Text } from '@/components/ui/text';
import { colours, radii, space } from '@/components/ui/theme';
import { NEUTRAL_CAUTION, SAFETY_CAUTION, compareMeasured, neutralCurrentA, panelLoad } from '@/shared/calc';
import { SYSTEM_INFO } from '@/shared/domain';
import type { Circuit, Panel } from '@/shared/schemas';

const one = (x: number) => (Math.round(x * 10) / 10).toString();

/**
 * Clamp readings per phase beside the calculated load, and on a 3φ 4W panel the neutral current
 * the phase currents give by phasor sum (shared/calc/measured.ts) with its non-linear caution.
 * Clamping live conductors is energised work: the usual caution is shown with the readings.
 */
export function MeasuredLoad({ panel, circuits }: { panel: Panel; circuits: Circuit[] }) {
  const load = useMemo(() => panelLoad(panel, circuits), [panel, circuits]);
  const info = SYSTEM_INFO[panel.system];
  const measured = { A: panel.measuredA ?? undefined, B: panel.measuredB ?? undefined, C: panel.measuredC ?? undefined };
  const recorded = [measured.A, measured.B, measured.C, panel.measuredN ?? undefined].some((x) => x !== undefined);
  if (!recorded) {
    return (
      <Card testID="measured-load">
        <Text variant="label" heading={2}>Measured amps</Text>
        <Text variant="small" tone="soft">No clamp readings recorded. Record them under Edit panel.</Text>
      </Card>
    );
  }
  const calculated = Object.fromEntries(Object.entries(load.phases).map(([phase, p]) => [phase, p?.amps ?? 0]));
  const rows = compareMeasured(measured, calculated);
  const fourWire = info.phases === 3 && info.neutralV !== null;
  const neutral =
    fourWire && measured.A !== undefined && measured.B !== undefined && measured.C !== undefined
      ? neutralCurrentA(measured.A, measured.B, measured.C)
      : null;
  return (
    <Card testID="measured-load">
      <Text variant="label" heading={2}>Measured amps{panel.measuredOn ? ` · ${panel.measuredOn}` : ''}</Text>
      {rows.map((r) => (
        <Text key={r.phase} variant="reading" testID={`measured-${r.phase}`}>
          {r.phase}: {one(r.measuredA)} A measured · {one(r.calculatedA)} A calculated
        </Text>
      ))}
      {panel.measuredN !== null && panel.measuredN !== undefined && (
        <Text variant="reading">N: {one(panel.measuredN)} A measured</Text>
      )}
      {neutral !== null && (
        <View style={styles.neutral}>
          <Text variant="readingBold" testID="neutral-calculated">N from the phases: {one(neutral)} A (phasor sum)</Text>
          <Text variant="small">{NEUTRAL_CAUTION}</Text>
        </View>
      )}
      <Text variant="small" tone="faint">{SAFETY_CAUTION}</Text>
    </Card>
  );
}

const styles = StyleSheet.create({
  neutral: { backgroundColor: colours.warnSoft, padding: space.sm, borderRadius: radii.sm, gap: space.xs },
});

import { useMemo, useState } from 'react';
import { Pressable, StyleSheet, View } from 'react-native';
import { cardStyles } from '@/components/ui/card';
import { PANEL_LOAD_FIGURES, panelLoad } from '@/shared/calc';
import type { Phase } from '@/shared/domain';
import type { Circuit, Panel } from '@/shared/schemas';
import { Text } from '@/components/ui/text';
import { colours, space } from '@/components/ui/theme';

/** Phase currents further apart than this are worth a look; no standard sets a limit [CP]. */
const IMBALANCE_FLAG_PCT = 20;

const round = (n: number) => Math.round(n).toLocaleString('en-US');

/**
 * The panel's loading at a glance: amps per phase as bars against the main (or bus) rating, with
 * imbalance, the connected load and the sizing load (125 % of continuous) and utilisation. Tap for the numbers behind it.
 */
export function PanelLoadSummary({ panel, circuits }: { panel: Panel; circuits: Circuit[] }) {
  const [open, setOpen] = useState(false);
  const load = useMemo(() => panelLoad(panel, circuits), [panel, circuits]);
  const phases = Object.entries(load.phases) as [Phase, NonNullable<(typeof load.phases)['C']>][];
  const capacity = load.capacityA ?? 1;
  const utilisation = load.utilisationPct;
  const over = utilisation !== null && utilisation > 100;
  const unbalanced = load.imbalancePct > IMBALANCE_FLAG_PCT;
  return (
    <Pressable
      accessibilityRole="button"
      accessibilityState={{ expanded: open }}
      accessibilityHint="Shows the loading per phase"
      onPress={() => setOpen((v) => !v)}
      style={[cardStyles.row, styles.card]}
      testID="panel-load"
    >
      <View style={styles.bars}>
        {phases.map(([phase, p]) => {
          const fraction = Math.min(1, p.sizingA / capacity);
          return (
            <View key={phase} style={styles.barRow} accessibilityLabel={`Phase ${phase}: ${round(p.amps)} amperes`}>
              <Text variant="readingBold" style={styles.barLabel}>{phase}</Text>
              <View style={styles.track}>
                <View
                  style={[
                    styles.fill,
                    { width: `${Math.max(1, fraction * 100)}%` },
                    fraction > 0.8 && styles.fillHigh,
                  ]}
                />
              </View>
              <Text variant="reading" style={styles.barValue}>{round(p.amps)} A</Text>
            </View>
          );
        })}
      </View>
      <View style={styles.facts}>
        <Fact label={PANEL_LOAD_FIGURES.connected.label} value={`${round(load.totalVA)} VA`} testID="load-connected" />
        <Fact label={PANEL_LOAD_FIGURES.sizing.label} value={`${round(load.sizingVA)} VA`} testID="load-sizing" />
        <Fact
          label="Imbalance"
          value={`${load.imbalancePct.toFixed(1)} %`}
          note={unbalanced ? '⚠ phases far apart' : undefined}
        />
        <Fact
          label={`Of ${load.capacityA ?? '?'} A ${panel.mainRatingA ? 'main' : 'bus'}`}
          value={utilisation === null ? '—' : `${Math.round(utilisation)} %`}
          note={over ? '⚠ over the rating' : undefined}
        />
      </View>
      {open ? (
        <View style={styles.details} testID="panel-load-details">
          {phases.map(([phase, p]) => (
            <Text key={phase} variant="small">
              Phase {phase}: {round(p.va)} VA connected, {round(p.amps)} A; sizing {round(p.sizingVA)} VA, {round(p.sizingA)} A
            </Text>
          ))}
          <Text variant="small" tone="soft">
            {PANEL_LOAD_FIGURES.connected.label}: {PANEL_LOAD_FIGURES.connected.rule}. {PANEL_LOAD_FIGURES.sizing.label}: {PANEL_LOAD_FIGURES.sizing.rule}; it is larger than the connected load and is not an NEC 220 demand load.
            Imbalance is the largest deviation of a phase current from their average (NEMA MG 1 definition).
            Utilisation is the busiest phase's sizing current against the {panel.mainRatingA ? 'main breaker' : 'bus'} rating.
            Loads are as recorded on the schedule, not measured.
          </Text>
        </View>
      ) : (
        <Text variant="small" tone="faint">Tap for the numbers behind this</Text>
      )}
    </Pressable>
  );
}

function Fact({ label, value, note, testID }: { label: string; value: string; note?: string; testID?: string }) {
  return (
    <View style={styles.fact} testID={testID}>
      <Text variant="label" tone="soft">{label}</Text>
      <Text variant="readingBold">{value}</Text>
      {note && <Text variant="small" tone="warn">{note}</Text>}
    </View>
  );
}

const styles = StyleSheet.create({
  card: {
    gap: space.md,
  },
  bars: { gap: space.xs },
  barRow: { flexDirection: 'row', alignItems: 'center', gap: space.sm },
  barLabel: { width: 16 },
  track: { flex: 1, height: 14, backgroundColor: colours.paper, borderRadius: 7, overflow: 'hidden', borderWidth: 1, borderColor: colours.rule },
  fill: { height: '100%', backgroundColor: colours.copper },
  fillHigh: { backgroundColor: colours.danger },
  barValue: { width: 72, textAlign: 'right' },
  facts: { flexDirection: 'row', flexWrap: 'wrap', gap: space.lg },
  fact: { minWidth: 90, gap: 1 },
  details: { gap: space.xs },
});

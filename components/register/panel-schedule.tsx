import { useMemo } from 'react';
import { Pressable, StyleSheet, useWindowDimensions, View } from 'react-native';
import { circuitWarnings, panelLayout, type CircuitWarning } from '@/shared/calc';
import type { Phase } from '@/shared/domain';
import type { Circuit, Panel } from '@/shared/schemas';
import { breakerLabel, conductorLabel, directoryText, vaLabel } from './circuit-format';
import { Text } from '@/components/ui/text';
import { MARKS, useFirstMark } from '@/lib/perf-mark';
import { colours, MIN_TOUCH, radii, space, WIDE_MIN_WIDTH } from '@/components/ui/theme';

interface ScheduleProps {
  panel: Panel;
  circuits: Circuit[];
  /** warnings by circuit id, from {@link warningsByCircuit} */
  warnings: Map<string, CircuitWarning[]>;
  canEdit: boolean;
  onOpenCircuit: (circuit: Circuit) => void;
  onAddAt: (position: number) => void;
}

interface Position {
  position: number;
  phase: Phase;
  /** the circuit that starts here */
  starts: Circuit | null;
  /** the multi-pole circuit that started above and continues here */
  continues: Circuit | null;
}

const phaseTint: Record<Phase, string> = { A: colours.phaseA, B: colours.phaseB, C: colours.phaseC };
const ROW_HEIGHT = 64;

/** Warnings worth an electrician's attention (severity 'warning'), by circuit id. */
export function warningsByCircuit(panel: Panel, circuits: Circuit[]): Map<string, CircuitWarning[]> {
  return new Map(
    circuits.map((c) => [c.id, circuitWarnings(c, panel).filter((w) => w.severity === 'warning')]),
  );
}

function usePositions(panel: Panel, circuits: Circuit[]): Position[] {
  return useMemo(() => {
    const byId = new Map(circuits.map((c) => [c.id, c]));
    const { slots } = panelLayout(panel, circuits);
    return slots.map((slot) => {
      const circuit = slot.circuitId ? byId.get(slot.circuitId) ?? null : null;
      const starts = circuit && circuit.position === slot.position ? circuit : null;
      return { position: slot.position, phase: slot.phase, starts, continues: starts ? null : circuit };
    });
  }, [panel, circuits]);
}

/**
 * The panel schedule. On a phone one row per position; on a wide screen the two columns of the
 * panel itself, odd positions left and even right, the bus phase between them, multi-pole
 * breakers spanning their rows.
 */
export function PanelSchedule(props: ScheduleProps) {
  const { width } = useWindowDimensions();
  const positions = usePositions(props.panel, props.circuits);
  useFirstMark(MARKS.scheduleShown);
  return width >= WIDE_MIN_WIDTH ? (
    <WideSchedule {...props} positions={positions} />
  ) : (
    <PhoneSchedule {...props} positions={positions} />
  );
}

type Laid = ScheduleProps & { positions: Position[] };

function PhaseBadge({ phase }: { phase: Phase }) {
  return (
    <View style={[styles.phase, { backgroundColor: phaseTint[phase] }]} accessibilityLabel={`phase ${phase}`}>
      <Text variant="readingBold">{phase}</Text>
    </View>
  );
}

/** Icon and words, never colour alone: the first warning, and how many more. */
function WarningLine({ warnings, align }: { warnings: CircuitWarning[] | undefined; align: 'left' | 'right' }) {
  if (!warnings?.length) return null;
  const more = warnings.length > 1 ? ` (+${warnings.length - 1} more)` : '';
  return (
    <View style={[styles.warning, align === 'right' && styles.selfEnd]} testID="circuit-warning">
      <Text variant="small" style={align === 'right' && styles.textRight}>
        ⚠ {warnings[0].message}
        {more}
      </Text>
    </View>
  );
}

function CircuitSummary({
  circuit,
  warnings,
  align = 'left',
}: {
  circuit: Circuit;
  warnings: CircuitWarning[] | undefined;
  align?: 'left' | 'right';
}) {
  const meta = [conductorLabel(circuit), vaLabel(circuit.loadVA)].filter(Boolean).join(' · ');
  const muted = circuit.status !== 'in-use';
  return (
    <View style={[styles.summary, align === 'right' && styles.alignRight]}>
      <Text variant="strong" tone={muted ? 'soft' : 'ink'} style={align === 'right' && styles.textRight}>
        {directoryText(circuit)}
      </Text>
      {meta ? (
        <Text variant="small" tone="soft" style={align === 'right' && styles.textRight}>
          {meta}
        </Text>
      ) : null}
      <WarningLine warnings={warnings} align={align} />
    </View>
  );
}

function PhoneSchedule({ positions, warnings, canEdit, onOpenCircuit, onAddAt }: Laid) {
  return (
    <View style={styles.phoneList} role="list" aria-label="Positions" testID="schedule-phone">
      {positions.map(({ position, phase, starts, continues }) => {
        const circuit = starts ?? continues;
        const onPress = circuit ? () => onOpenCircuit(circuit) : canEdit ? () => onAddAt(position) : undefined;
        return (
          // a list of positions for a screen reader: each item holds its row's button
          <View key={position} role="listitem">
            <Pressable
              testID={`position-${position}`}
              accessibilityRole={onPress ? 'button' : undefined}
              // named by what it shows (position, phase, breaker, description, warnings): a label of
              // its own left out the words the row shows (WCAG 2.5.3 Label in Name)
              onPress={onPress}
              disabled={!onPress}
              style={({ pressed }) => [
                styles.phoneRow,
                circuit?.status === 'space' && styles.spaceRow,
                circuit?.status === 'spare' && styles.spareRow,
                continues && styles.continuationRow,
                pressed && styles.pressed,
              ]}
            >
              <Text variant="readingBold" style={styles.phonePosition}>
                {position}
              </Text>
              <PhaseBadge phase={phase} />
              {starts ? (
                <>
                  <View style={styles.breaker}>
                    <Text variant="reading">{breakerLabel(starts)}</Text>
                  </View>
                  <CircuitSummary circuit={starts} warnings={warnings.get(starts.id)} />
                </>
              ) : continues ? (
                <Text variant="small" tone="soft" style={styles.flex}>
                  ↳ pole {(position - continues.position) / 2 + 1} of {continues.poles} · breaker at {continues.position}
                </Text>
              ) : (
                <Text variant="small" tone="faint" style={styles.flex}>
                  Not recorded{canEdit ? ' — tap to add' : ''}
                </Text>
              )}
            </Pressable>
          </View>
        );
      })}
    </View>
  );
}

/**
 * Rows (odd and even position side by side) that must stay together because a multi-pole breaker
 * spans them; every other row is a group of its own. Each group is laid out as one flex row, so a
 * row is as tall as its taller side and never a fixed height that long text could spill out of.
 */
function rowGroups(positions: Position[]): Position[][][] {
  const rows: Position[][] = [];
  for (const p of positions) {
    const r = Math.floor((p.position - 1) / 2);
    (rows[r] ??= []).push(p);
  }
  const groups: Position[][][] = [];
  let reach = -1;
  rows.forEach((row, r) => {
    if (r > reach) groups.push([]);
    groups[groups.length - 1].push(row);
    for (const p of row) if (p.starts) reach = Math.max(reach, r + p.starts.poles - 1);
  });
  return groups;
}

function WideCell({ place, right, warnings, canEdit, onOpenCircuit, onAddAt }: Laid & { place: Position; right: boolean }) {
  const { position, starts } = place;
  const onPress = starts ? () => onOpenCircuit(starts) : canEdit ? () => onAddAt(position) : undefined;
  const positionsText = starts ? Array.from({ length: starts.poles }, (_, i) => position + 2 * i) : [position];
  return (
    <Pressable
      testID={`position-${position}`}
      accessibilityRole={onPress ? 'button' : undefined}
      accessibilityLabel={`Position ${positionsText.join(', ')}${starts ? `, ${directoryText(starts)}` : ', empty'}`}
      onPress={onPress}
      disabled={!onPress}
      style={({ pressed }) => [
        styles.wideCell,
        // a cell takes its share of the group (one row per pole) and more when its text needs it
        { flexGrow: starts?.poles ?? 1, minHeight: ROW_HEIGHT * (starts?.poles ?? 1), flexDirection: right ? 'row' : 'row-reverse' },
        starts?.status === 'space' && styles.spaceRow,
        starts?.status === 'spare' && styles.spareRow,
        !starts && styles.emptyCell,
        pressed && styles.pressed,
      ]}
    >
      <View style={styles.widePositions}>
        {positionsText.map((p) => (
          <View key={p} style={styles.widePosition}>
            <Text variant="readingBold">{p}</Text>
          </View>
        ))}
      </View>
      {starts && starts.poles > 1 && <View style={styles.tie} accessibilityLabel="multi-pole tie" />}
      <View style={[styles.breaker, styles.wideBreaker]}>
        <Text variant="reading">{starts ? breakerLabel(starts) : ''}</Text>
      </View>
      {starts ? (
        <CircuitSummary circuit={starts} warnings={warnings.get(starts.id)} align={right ? 'left' : 'right'} />
      ) : (
        <Text variant="small" tone="faint" style={[styles.flex, !right && styles.textRight]}>
          Not recorded
        </Text>
      )}
    </Pressable>
  );
}

function WideSchedule(props: Laid) {
  const groups = rowGroups(props.positions);
  return (
    <View style={styles.wide} testID="schedule-wide">
      {groups.map((group) => {
        const cells = group.flat();
        const side = (odd: boolean) =>
          cells.filter((p) => p.position % 2 === 1 === odd && !p.continues).map((p) => <WideCell key={p.position} {...props} place={p} right={!odd} />);
        return (
          <View key={group[0][0].position} style={styles.wideGroup}>
            <View style={styles.wideColumn}>{side(true)}</View>
            <View style={styles.spine} accessibilityLabel="bus phases">
              {group.map((row) => (
                <View key={row[0].position} style={[styles.spineCell, { backgroundColor: phaseTint[row[0].phase] }]}>
                  <Text variant="readingBold">{row[0].phase}</Text>
                </View>
              ))}
            </View>
            <View style={styles.wideColumn}>{side(false)}</View>
          </View>
        );
      })}
    </View>
  );
}

const styles = StyleSheet.create({
  flex: { flex: 1 },
  pressed: { opacity: 0.7 },
  phoneList: {
    borderWidth: 1,
    borderColor: colours.ruleStrong,
    borderRadius: radii.md,
    overflow: 'hidden',
    backgroundColor: colours.card,
  },
  phoneRow: {
    minHeight: MIN_TOUCH + 12,
    flexDirection: 'row',
    alignItems: 'center',
    gap: space.sm,
    paddingHorizontal: space.sm,
    paddingVertical: space.xs,
    borderBottomWidth: StyleSheet.hairlineWidth,
    borderBottomColor: colours.rule,
  },
  continuationRow: { backgroundColor: colours.rowContinuation },
  spareRow: { backgroundColor: colours.rowSpare },
  spaceRow: { backgroundColor: colours.rowSpace },
  phonePosition: { width: 28, textAlign: 'right' },
  phase: { width: 28, height: 28, borderRadius: 14, alignItems: 'center', justifyContent: 'center' },
  breaker: {
    minWidth: 72,
    paddingHorizontal: space.xs,
    paddingVertical: 2,
    borderWidth: 1,
    borderColor: colours.ruleStrong,
    borderRadius: radii.sm,
    alignItems: 'center',
  },
  summary: { flex: 1, minWidth: 0, gap: 1 },
  alignRight: { alignItems: 'flex-end' },
  textRight: { textAlign: 'right' },
  warning: {
    marginTop: 2,
    paddingHorizontal: space.xs,
    borderRadius: radii.sm,
    backgroundColor: colours.warnSoft,
    borderLeftWidth: 3,
    borderLeftColor: colours.warn,
  },
  selfEnd: { alignSelf: 'flex-end' },
  wide: {
    borderWidth: 2,
    borderColor: colours.ink,
    borderRadius: radii.md,
    backgroundColor: colours.card,
    overflow: 'hidden',
  },
  wideGroup: { flexDirection: 'row', borderBottomWidth: StyleSheet.hairlineWidth, borderBottomColor: colours.rule },
  wideColumn: { flex: 1, minWidth: 0 },
  wideCell: {
    alignItems: 'center',
    gap: space.sm,
    paddingHorizontal: space.sm,
    paddingVertical: space.xs,
  },
  emptyCell: { backgroundColor: colours.cellEmpty },
  widePositions: { alignSelf: 'stretch', justifyContent: 'space-around', width: 30 },
  widePosition: { alignItems: 'center' },
  tie: { width: 3, alignSelf: 'stretch', marginVertical: 10, backgroundColor: colours.copper, borderRadius: 2 },
  wideBreaker: { minWidth: 80 },
  spine: { width: 36, borderLeftWidth: 2, borderRightWidth: 2, borderColor: colours.ink },
  spineCell: {
    flexGrow: 1,
    minHeight: ROW_HEIGHT,
    alignItems: 'center',
    justifyContent: 'center',
  },
});

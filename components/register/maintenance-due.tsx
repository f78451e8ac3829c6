/**
 * The maintenance due list: each panel's next thermal survey and maintenance from its NFPA 70B
 * condition and its last inspection of that kind (shared/maintenance-due.ts), overdue first.
 * A section of the building screen, and the "Maintenance due" view of Findings (every building,
 * only what is overdue, never inspected or due within 30 days).
 */
import { useRouter } from 'expo-router';
import { useState } from 'react';
import { Pressable, StyleSheet, View } from 'react-native';
import { PressableCard } from '@/components/ui/card';
import { useMaintenanceDue, type DueRow } from '@/hooks/use-maintenance';
import { DUE_SOON_DAYS, dueWords, isDue, TASK_LABELS, type DueState } from '@/shared/maintenance-due';
import { INSPECTION_KIND_LABELS } from '@/shared/records';
import { SafetyNote } from '@/components/ui/safety-note';
import { EmptyState } from '@/components/ui/states';
import { Text } from '@/components/ui/text';
import { colours, MIN_TOUCH, radii, space } from '@/components/ui/theme';

/** Always a word with its mark, never colour alone. */
const STATE_WORDS: Record<DueState, { word: string; tone: 'danger' | 'warn' | 'ink' | 'soft' }> = {
  overdue: { word: '⚠ Overdue', tone: 'danger' },
  never: { word: '⚠ Due now', tone: 'danger' },
  soon: { word: '◔ Due soon', tone: 'warn' },
  later: { word: '✓ Not yet due', tone: 'soft' },
  'no-interval': { word: '? No interval on file', tone: 'soft' },
};

/**
 * Where the due date comes from (condition, interval and its source, and whether the figure is
 * from memory): behind a tap, so the row's main line says only what is due.
 */
function DueSource({ row }: { row: DueRow }) {
  const [open, setOpen] = useState(false);
  return (
    <View>
      <Pressable
        accessibilityRole="button"
        accessibilityState={{ expanded: open }}
        accessibilityLabel={`Where this comes from: ${row.tag} ${TASK_LABELS[row.task]}`}
        onPress={() => setOpen((o) => !o)}
        style={styles.sourceToggle}
        testID="due-source-toggle"
      >
        <Text variant="small" tone="soft">
          {open ? '▾' : '▸'} Where this comes from
        </Text>
      </Pressable>
      {open ? (
        <Text variant="small" tone="soft" testID="due-source">
          NFPA 70B condition {row.condition} · {row.basis}
        </Text>
      ) : null}
    </View>
  );
}

function DueRowView({ row, showBuilding }: { row: DueRow; showBuilding: boolean }) {
  const router = useRouter();
  const state = STATE_WORDS[row.state];
  const lastOther =
    row.state === 'never' && row.lastInspection
      ? ` · last inspection ${INSPECTION_KIND_LABELS[row.lastInspection.kind].toLowerCase()} ${row.lastInspection.performedOn}`
      : '';
  // the row opens its panel; where its figure comes from is a control of its own beside it, not
  // inside it (a button holding a button is one control to a screen reader)
  return (
    <View testID={`due-${row.tag}-${row.task}`}>
      <PressableCard
        size="compact"
        accessibilityRole="button"
        onPress={() => router.push({ pathname: '/panels/[panelId]', params: { panelId: row.panelId } })}
        style={[styles.row, (row.state === 'overdue' || row.state === 'never') && styles.urgent]}
        testID={`due-${row.tag}-${row.task}-open`}
      >
        <View style={styles.rowHead}>
          <View style={styles.tag}>
            <Text variant="readingBold" tone="paper">{row.tag}</Text>
          </View>
          <Text variant="strong" style={styles.task}>{TASK_LABELS[row.task]}</Text>
          <Text variant="label" tone={state.tone} testID="due-state">{state.word}</Text>
        </View>
        <Text variant="small" tone={state.tone === 'soft' ? 'ink' : state.tone} testID="due-words">
          {row.dueOn ? `${dueWords(row)} · due ${row.dueOn}` : dueWords(row)}
          {row.lastDoneOn ? ` · last ${row.lastDoneOn}` : lastOther}
          {showBuilding ? ` · ${row.buildingName}` : ''}
        </Text>
      </PressableCard>
      <DueSource row={row} />
    </View>
  );
}

function DueList({ rows, showBuilding }: { rows: readonly DueRow[]; showBuilding: boolean }) {
  return (
    <View style={styles.list}>
      {rows.map((row) => (
        <DueRowView key={`${row.panelId}-${row.task}`} row={row} showBuilding={showBuilding} />
      ))}
    </View>
  );
}

/** The building screen's section: every panel of the building, both tasks, most urgent first. */
export function BuildingMaintenanceDue({ buildingId }: { buildingId: string }) {
  const rows = useMaintenanceDue(buildingId).data ?? [];
  const due = rows.filter(isDue).length;
  return (
    <View style={styles.wrap} testID="building-maintenance-due">
      <Text variant="label" tone="soft" heading={2} caps>Maintenance due</Text>
      {rows.length === 0 ? (
        <Text tone="soft">No panels recorded yet: add one to see when it is due.</Text>
      ) : (
        <>
          <Text testID="maintenance-due-count">
            {due === 0
              ? 'Nothing overdue or due within 30 days.'
              : `${due} task${due === 1 ? '' : 's'} overdue, never recorded or due within ${DUE_SOON_DAYS} days.`}{' '}
            From each panel’s NFPA 70B condition and its last thermal survey or full maintenance.
          </Text>
          <DueList rows={rows} showBuilding={false} />
        </>
      )}
    </View>
  );
}

/** Findings' "Maintenance due" view: across buildings, only what is due within 30 days or overdue. */
export function MaintenanceDueAcross() {
  const rows = (useMaintenanceDue(null).data ?? []).filter(isDue);
  return (
    <View style={styles.wrap} testID="maintenance-due-view">
      <Text variant="small" tone="soft" testID="maintenance-due-summary">
        {rows.length} task{rows.length === 1 ? '' : 's'} overdue, never recorded or due within {DUE_SOON_DAYS} days · all buildings
      </Text>
      {rows.length === 0 ? (
        <EmptyState
          title="Nothing due"
          hint={`No panel is overdue or due within ${DUE_SOON_DAYS} days. Record a thermal survey or a full maintenance from a panel to keep it that way.`}
        />
      ) : (
        <DueList rows={rows} showBuilding />
      )}
      <SafetyNote />
    </View>
  );
}

const styles = StyleSheet.create({
  wrap: { gap: space.sm },
  list: { gap: space.sm },
  row: {
    minHeight: MIN_TOUCH,
    gap: 2,
  },
  urgent: { borderLeftWidth: 4, borderLeftColor: colours.danger },
  rowHead: { flexDirection: 'row', alignItems: 'center', gap: space.sm, flexWrap: 'wrap' },
  tag: { backgroundColor: colours.ink, borderRadius: radii.sm, paddingHorizontal: space.sm },
  task: { flexGrow: 1 },
  sourceToggle: { minHeight: MIN_TOUCH, justifyContent: 'center', alignSelf: 'flex-start' },
});

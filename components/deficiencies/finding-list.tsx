/**
 * The Findings list: every deficiency on the device across the user's buildings, outstanding ones
 * by default, filtered by priority, status, building and due date, most urgent first, with the
 * count of each priority at the top (each a filter button, with its word).
 */
import { Pressable, StyleSheet, View } from 'react-native';
import { PressableCard } from '@/components/ui/card';
import { byUrgency, type DeficiencyRow } from '@/hooks/use-records';
import { isOutstanding } from '@/shared/deficiency';
import { DEFICIENCY_STATUSES, PRIORITIES, PRIORITY_LABELS, STATUS_LABELS, type DeficiencyStatus, type Priority } from '@/shared/records';
import { daysBetween, dueLine, whereText } from './deficiency-format';
import { StatusWord } from './deficiency-parts';
import { ChoiceField } from '@/components/ui/fields';
import { PriorityChip, PriorityMark } from './priority-chip';
import { Text } from '@/components/ui/text';
import { colours, MIN_TOUCH, space } from '@/components/ui/theme';

export type StatusFilter = 'outstanding' | 'all' | DeficiencyStatus;
export type DueFilter = 'all' | 'overdue' | 'soon';
export interface FindingFilters {
  priority: Priority | null;
  status: StatusFilter;
  buildingId: string | null;
  due: DueFilter;
}
export const DEFAULT_FILTERS: FindingFilters = { priority: null, status: 'outstanding', buildingId: null, due: 'all' };

/** Due within this many days counts as "due soon" in the filter. */
export const SOON_DAYS = 30;

function matches(row: DeficiencyRow, f: FindingFilters, today: string, skipPriority = false): boolean {
  const d = row.deficiency;
  if (!skipPriority && f.priority !== null && d.priority !== f.priority) return false;
  if (f.status === 'outstanding' ? !isOutstanding(d.status) : f.status !== 'all' && d.status !== f.status) return false;
  if (f.buildingId && d.buildingId !== f.buildingId) return false;
  if (f.due === 'overdue' && !dueLine(d, today).overdue) return false;
  if (f.due === 'soon') {
    const days = daysBetween(today, d.dueOn);
    if (!isOutstanding(d.status) || days < 0 || days > SOON_DAYS) return false;
  }
  return true;
}

/** The rows the filters let through, most urgent first, and the count of each priority. */
export function applyFilters(rows: readonly DeficiencyRow[], f: FindingFilters, today: string) {
  const shown = rows.filter((r) => matches(r, f, today)).sort((a, b) => byUrgency(a.deficiency, b.deficiency));
  const base = rows.filter((r) => matches(r, f, today, true));
  const counts = Object.fromEntries(PRIORITIES.map((p) => [p, base.filter((r) => r.deficiency.priority === p).length])) as Record<Priority, number>;
  return { shown, counts };
}

/** Findings where they are walked to: one group per building and panel (building-wide ones apart). */
export interface PlaceGroup {
  key: string;
  building: string;
  /** "Panel LA", or "Building-wide" for a finding on no panel */
  place: string;
  rows: DeficiencyRow[];
}

/**
 * The shown rows by building, then panel. Rows come most urgent first, so a group sits where its
 * most urgent finding would: the panel to go to first comes first.
 */
export function groupByPlace(rows: readonly DeficiencyRow[]): PlaceGroup[] {
  const groups = new Map<string, PlaceGroup>();
  for (const row of rows) {
    const d = row.deficiency;
    const key = `${d.buildingId}/${d.panelId ?? ''}`;
    let group = groups.get(key);
    if (!group) {
      const panel = d.panelId ? row.view.panel(d.panelId) : null;
      group = {
        key,
        building: row.view.building.name,
        place: d.panelId ? `Panel ${panel?.tag ?? '(not on this device)'}` : 'Building-wide',
        rows: [],
      };
      groups.set(key, group);
    }
    group.rows.push(row);
  }
  return [...groups.values()];
}

const STATUS_FILTER_WORDS: Record<StatusFilter, string> = {
  outstanding: 'Outstanding',
  ...STATUS_LABELS,
  all: 'All',
};
const DUE_WORDS: Record<DueFilter, string> = { all: 'Any date', overdue: 'Overdue', soon: `Due in ${SOON_DAYS} days` };

/** One line saying what the filters show, e.g. "Outstanding · P2 soon · overdue · all buildings". */
export function filterSummary(f: FindingFilters, buildingName: (id: string) => string): string {
  return [
    STATUS_FILTER_WORDS[f.status],
    f.priority ? PRIORITY_LABELS[f.priority] : 'every priority',
    f.due === 'all' ? null : DUE_WORDS[f.due].toLowerCase(),
    f.buildingId ? buildingName(f.buildingId) : 'all buildings',
  ]
    .filter(Boolean)
    .join(' · ');
}

/** The counts of each priority as one compact line; each count filters by it (tap again for all). */
export function PriorityCounts({ counts, value, onChange }: { counts: Record<Priority, number>; value: Priority | null; onChange: (p: Priority | null) => void }) {
  return (
    <View style={styles.counts} accessibilityRole="radiogroup" accessibilityLabel="Filter by priority" testID="priority-counts">
      {PRIORITIES.map((p) => {
        const selected = value === p;
        return (
          <Pressable
            key={p}
            accessibilityRole="radio"
            aria-checked={selected}
            accessibilityLabel={`${PRIORITY_LABELS[p]}: ${counts[p]}`}
            onPress={() => onChange(selected ? null : p)}
            style={({ pressed }) => [styles.count, selected && styles.countSelected, pressed && styles.pressed]}
            testID={`count-p${p}`}
          >
            <PriorityMark priority={p} />
            <Text variant="strong">{counts[p]}</Text>
            <Text variant="small">{PRIORITY_LABELS[p]}</Text>
          </Pressable>
        );
      })}
    </View>
  );
}

export function FindingFiltersForm({
  filters,
  onChange,
  buildings,
}: {
  filters: FindingFilters;
  onChange: (f: FindingFilters) => void;
  buildings: readonly { id: string; name: string }[];
}) {
  return (
    <View style={styles.filters} testID="finding-filters">
      <ChoiceField
        label="Status"
        choices={(['outstanding', ...DEFICIENCY_STATUSES, 'all'] as StatusFilter[]).map((value) => ({ value, label: STATUS_FILTER_WORDS[value] }))}
        value={filters.status}
        onChange={(status) => onChange({ ...filters, status })}
        hint="Outstanding: open, scheduled, or repaired and waiting to be verified."
      />
      <ChoiceField
        label="Due"
        choices={(['all', 'overdue', 'soon'] as DueFilter[]).map((value) => ({ value, label: DUE_WORDS[value] }))}
        value={filters.due}
        onChange={(due) => onChange({ ...filters, due })}
      />
      {buildings.length > 1 && (
        <ChoiceField
          label="Building"
          choices={[{ value: null as string | null, label: 'All buildings' }, ...buildings.map((b) => ({ value: b.id as string | null, label: b.name }))]}
          value={filters.buildingId}
          onChange={(buildingId) => onChange({ ...filters, buildingId })}
        />
      )}
    </View>
  );
}

export function FindingRow({ row, today, selected, onOpen }: { row: DeficiencyRow; today: string; selected: boolean; onOpen: () => void }) {
  const d = row.deficiency;
  const due = dueLine(d, today);
  return (
    <PressableCard
      accessibilityRole="link"
      // named by what it shows (priority, title, status, due), so the words heard are the words seen
      aria-current={selected ? true : undefined}
      onPress={onOpen}
      style={[styles.row, selected && styles.rowSelected]}
      testID={`finding-${d.id}`}
    >
      <View style={styles.rowTop}>
        <PriorityChip priority={d.priority} size="small" />
        <StatusWord status={d.status} />
        {row.photoCount > 0 && (
          <Text variant="small" tone="soft" testID="finding-photos">
            ▣ {row.photoCount} photo{row.photoCount === 1 ? '' : 's'}
          </Text>
        )}
      </View>
      <Text variant="strong" testID="finding-title">
        {d.title}
      </Text>
      <Text variant="small" tone="soft" numberOfLines={2}>
        {whereText(row.view, d)}
      </Text>
      <Text variant="small" tone={due.overdue ? 'danger' : 'ink'} testID="finding-due">
        {due.overdue ? '⚠ ' : ''}
        {due.text}
      </Text>
    </PressableCard>
  );
}

const styles = StyleSheet.create({
  counts: { flexDirection: 'row', flexWrap: 'wrap', columnGap: space.md, rowGap: space.xs },
  count: {
    minHeight: MIN_TOUCH,
    flexDirection: 'row',
    alignItems: 'center',
    gap: space.xs,
    paddingHorizontal: space.xs,
    borderBottomWidth: 3,
    borderBottomColor: 'transparent',
  },
  // chosen: underlined, like a word picked out on the line (and aria-checked for a screen reader)
  countSelected: { borderBottomColor: colours.ink },
  filters: { gap: space.md },
  row: {
    minHeight: MIN_TOUCH,
    gap: space.xs,
  },
  rowSelected: { borderColor: colours.copper, borderWidth: 2, backgroundColor: colours.copperSoft },
  rowTop: { flexDirection: 'row', flexWrap: 'wrap', alignItems: 'center', gap: space.sm },
  pressed: { opacity: 0.75 },
});

export type FindingsView = 'deficiencies' | 'maintenance';

/** Deficiencies or the maintenance due list (components/maintenance-due.tsx), each with its word. */
export function FindingsViewSwitch({ value, onChange }: { value: FindingsView; onChange: (v: FindingsView) => void }) {
  return (
    <ChoiceField
      label="Show"
      value={value}
      onChange={onChange}
      choices={[
        { value: 'deficiencies', label: 'Deficiencies' },
        { value: 'maintenance', label: 'Maintenance due' },
      ]}
    />
  );
}

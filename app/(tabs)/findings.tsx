import { useLocalSearchParams, useRouter } from 'expo-router';
import { useState } from 'react';
import { ScrollView, StyleSheet, useWindowDimensions, View } from 'react-native';
import { Button } from '@/components/ui/button';
import { DeficiencyDetail } from '@/components/deficiencies/deficiency-detail';
import {
  applyFilters,
  DEFAULT_FILTERS,
  filterSummary,
  FindingFiltersForm,
  FindingRow,
  groupByPlace,
  FindingsViewSwitch,
  type FindingsView,
  PriorityCounts,
  type FindingFilters,
} from '@/components/deficiencies/finding-list';
import { MaintenanceDueAcross } from '@/components/register/maintenance-due';
import { Screen } from '@/components/ui/screen';
import { EmptyState, replicaGate } from '@/components/ui/states';
import { Text } from '@/components/ui/text';
import { colours, space, WIDE_MIN_WIDTH } from '@/components/ui/theme';
import { useAllDeficiencies } from '@/hooks/use-records';
import { useBuildings } from '@/hooks/use-register';
import { todayISO } from '@/shared/deficiency';
import { can } from '@/shared/permissions';

export default function Findings() {
  const router = useRouter();
  const params = useLocalSearchParams<{ buildingId?: string }>();
  const { width } = useWindowDimensions();
  const wide = width >= WIDE_MIN_WIDTH;
  const query = useAllDeficiencies();
  const buildings = useBuildings().data?.buildings ?? [];
  const [filters, setFilters] = useState<FindingFilters>({ ...DEFAULT_FILTERS, buildingId: params.buildingId ?? null });
  // "See them in Findings" from a building: adopt its building whenever the link changes
  const [seenParam, setSeenParam] = useState(params.buildingId);
  if (params.buildingId !== seenParam) {
    setSeenParam(params.buildingId);
    if (params.buildingId) setFilters({ ...DEFAULT_FILTERS, buildingId: params.buildingId });
  }
  const [showFilters, setShowFilters] = useState(false);
  const [selectedId, setSelectedId] = useState<string | null>(null);
  const [view, setView] = useState<FindingsView>('deficiencies');

  const gate = replicaGate(query, 'findings');
  if (gate || !query.data) return gate;
  const rows = query.data;
  const today = todayISO();
  const { shown, counts } = applyFilters(rows, filters, today);
  const buildingName = (id: string) => buildings.find((b) => b.id === id)?.name ?? 'a building';
  const canRaise = buildings.some((b) => can(b.role, 'deficiency.raise'));

  if (view === 'maintenance') {
    return (
      <Screen>
        <FindingsViewSwitch value={view} onChange={setView} />
        <MaintenanceDueAcross />
      </Screen>
    );
  }

  if (rows.length === 0) {
    return (
      <EmptyState
        title="No open deficiencies"
        hint={
          canRaise
            ? 'Record an inspection from a panel to raise one, or raise one by hand from a building’s page.'
            : 'Record an inspection from a panel to raise one. Deficiencies the inspectors raise in your buildings appear here.'
        }
      >
        <FindingsViewSwitch value={view} onChange={setView} />
      </EmptyState>
    );
  }

  // the chosen one stays in the pane after a change takes it out of the list (e.g. just verified)
  const selected = wide ? (rows.find((r) => r.deficiency.id === selectedId) ?? shown[0] ?? null) : null;
  const open = (id: string) => {
    if (wide) setSelectedId(id);
    else router.push({ pathname: '/deficiencies/[deficiencyId]', params: { deficiencyId: id } });
  };
  const filtered = JSON.stringify(filters) !== JSON.stringify(DEFAULT_FILTERS);
  const groups = groupByPlace(shown);

  const list = (
    <View style={styles.list}>
      <FindingsViewSwitch value={view} onChange={setView} />
      <PriorityCounts counts={counts} value={filters.priority} onChange={(priority) => setFilters({ ...filters, priority })} />
      <View style={styles.summary}>
        <Text variant="small" tone="soft" style={styles.summaryText} testID="finding-summary">
          {shown.length} shown · {filterSummary(filters, buildingName)}
        </Text>
        <Button
          label={showFilters ? 'Hide filters' : 'Filters'}
          tone="secondary"
          onPress={() => setShowFilters((s) => !s)}
          testID="toggle-filters"
        />
      </View>
      {showFilters && <FindingFiltersForm filters={filters} onChange={setFilters} buildings={buildings} />}
      {filtered && <Button label="Clear filters" tone="quiet" onPress={() => setFilters(DEFAULT_FILTERS)} testID="clear-filters" />}
      {shown.length === 0 ? (
        <EmptyState
          title="Nothing matches"
          hint={
            filters.status === 'outstanding' && !filters.priority && filters.due === 'all'
              ? 'No outstanding deficiencies here: every one is verified or deferred. Choose a status under Filters to see them.'
              : 'No deficiency matches these filters. Clear them to see every outstanding one.'
          }
        >
          {filters.status === 'outstanding' && (
            <Button label="Show every status" tone="secondary" onPress={() => setFilters({ ...filters, status: 'all' })} testID="show-all-statuses" />
          )}
        </EmptyState>
      ) : (
        <View style={styles.rows} testID="finding-rows">
          {groups.map((group, i) => (
            <View key={group.key} style={styles.group} testID="finding-group">
              <Text variant="label" heading={2} style={styles.groupHead}>
                {i === 0 || groups[i - 1].building !== group.building ? `${group.building} · ` : ''}
                {group.place} ({group.rows.length})
              </Text>
              {group.rows.map((row) => (
                <FindingRow key={row.deficiency.id} row={row} today={today} selected={selected?.deficiency.id === row.deficiency.id} onOpen={() => open(row.deficiency.id)} />
              ))}
            </View>
          ))}
        </View>
      )}
    </View>
  );

  if (!wide) return <Screen>{list}</Screen>;
  return (
    <View style={styles.panes}>
      <ScrollView style={styles.listPane} contentContainerStyle={styles.paneContent}>
        {list}
      </ScrollView>
      <ScrollView style={styles.detailPane} contentContainerStyle={styles.paneContent} testID="finding-detail-pane">
        {selected ? (
          <View style={styles.detail}>
            <DeficiencyDetail key={selected.deficiency.id} deficiencyId={selected.deficiency.id} onDeleted={() => setSelectedId(null)} />
          </View>
        ) : (
          <EmptyState title="Nothing selected" hint="Choose a deficiency on the left to see it here." />
        )}
      </ScrollView>
    </View>
  );
}

const styles = StyleSheet.create({
  list: { gap: space.md },
  summary: { flexDirection: 'row', alignItems: 'center', gap: space.sm },
  summaryText: { flex: 1 },
  rows: { gap: space.lg },
  group: { gap: space.sm },
  groupHead: { borderBottomWidth: 1, borderBottomColor: colours.ruleStrong, paddingBottom: 2 },
  panes: { flex: 1, flexDirection: 'row', backgroundColor: colours.paper },
  listPane: { width: 440, flexGrow: 0, flexShrink: 0, borderRightWidth: 1, borderRightColor: colours.rule },
  detailPane: { flex: 1 },
  paneContent: { padding: space.lg, flexGrow: 1 },
  detail: { maxWidth: 760, width: '100%', alignSelf: 'center' },
});

/** The preview of an import: every row of the file, what it will do, and what is wrong with it. */
import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import { Card } from '@/components/ui/card';
import { CSV_HEADER_OF, type CsvField, type ImportPlan } from '@/shared/csv';
import type { CircuitFields } from '@/shared/schemas';
import { Button } from '@/components/ui/button';
import { Text } from '@/components/ui/text';
import { colours, space } from '@/components/ui/theme';

type Kind = 'problem' | 'new' | 'changed' | 'same';
const KIND_WORDS: Record<Kind, string> = { problem: '⚠ Problem', new: '+ New', changed: '✎ Changed', same: '= Unchanged' };

function show(field: CsvField, value: unknown): string {
  if (value === null || value === undefined || value === '') return '(blank)';
  if (typeof value === 'boolean') return value ? 'yes' : 'no';
  if (field === 'feedsPanelId' || field === 'bandId') return 'set';
  return String(value);
}

function circuitLine(c: CircuitFields): string {
  if (c.status === 'space') return 'space';
  return `${c.poles}P ${c.ratingA ?? '—'} A · ${c.description || (c.status === 'spare' ? 'spare' : '(no description)')}`;
}

export function CsvPreview({ plan }: { plan: ImportPlan }) {
  const [showSame, setShowSame] = useState(false);
  const creates = new Map(plan.creates.map((c) => [c.row, c]));
  const patches = new Map(plan.patches.map((p) => [p.row, p]));
  const rows = plan.rows.map((r) => {
    const kind: Kind = r.problems.length > 0 ? 'problem' : creates.has(r.row) ? 'new' : patches.has(r.row) ? 'changed' : 'same';
    return { r, kind };
  });
  const same = rows.filter((x) => x.kind === 'same').length;
  const visible = showSame ? rows : rows.filter((x) => x.kind !== 'same');
  return (
    <View style={styles.wrap} testID="csv-preview">
      <Text variant="label" tone="soft">PREVIEW</Text>
      {visible.length === 0 && <Text tone="soft">Every row matches the schedule as it is.</Text>}
      {visible.map(({ r, kind }) => {
        const patch = patches.get(r.row);
        return (
          <Card size="compact" key={r.row} style={[styles.row, kind === 'problem' && styles.problem]} testID={`csv-row-${r.row}`}>
            <View style={styles.rowHead}>
              <Text variant="small" tone="faint" style={styles.rowNo}>row {r.row}</Text>
              <Text variant="readingBold" style={styles.pos}>{r.position !== null ? String(r.position).padStart(2, ' ') : '—'}</Text>
              <Text variant="strong" tone={kind === 'problem' ? 'danger' : 'ink'} testID={`csv-row-${r.row}-kind`}>{KIND_WORDS[kind]}</Text>
            </View>
            {r.circuit && <Text variant="small">{circuitLine(r.circuit)}</Text>}
            {patch &&
              (Object.keys(patch.fields) as CsvField[]).map((field) => (
                <Text key={field} variant="small" tone="soft">
                  {CSV_HEADER_OF[field]}: {show(field, patch.before[field])} → {show(field, patch.fields[field])}
                </Text>
              ))}
            {r.problems.map((p) => (
              <Text key={p} variant="small" tone="danger">{p}</Text>
            ))}
          </Card>
        );
      })}
      {plan.deletes.map((c) => (
        <Card size="compact" key={c.id} style={[styles.row, styles.remove]} testID={`csv-remove-${c.position}`}>
          <View style={styles.rowHead}>
            <Text variant="small" tone="faint" style={styles.rowNo}>not in file</Text>
            <Text variant="readingBold" style={styles.pos}>{String(c.position).padStart(2, ' ')}</Text>
            <Text variant="strong" tone="danger">− Removed</Text>
          </View>
          <Text variant="small">{circuitLine(c)}</Text>
        </Card>
      ))}
      {same > 0 && (
        <Button
          label={showSame ? 'Hide unchanged rows' : `Show ${same} unchanged row${same === 1 ? '' : 's'}`}
          tone="quiet"
          onPress={() => setShowSame((s) => !s)}
          testID="csv-show-same"
        />
      )}
    </View>
  );
}

const styles = StyleSheet.create({
  wrap: { gap: space.sm },
  row: { gap: 2 },
  problem: { borderColor: colours.danger, backgroundColor: colours.dangerSoft },
  remove: { borderColor: colours.ruleStrong, borderStyle: 'dashed' },
  rowHead: { flexDirection: 'row', alignItems: 'center', gap: space.sm, flexWrap: 'wrap' },
  rowNo: { minWidth: 56 },
  pos: { minWidth: 28 },
});

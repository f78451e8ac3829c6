/**
 * Import a panel schedule from a CSV file: choose a file → a preview of every row with what it
 * will do and what is wrong with it → apply (one batch of queued changes, works offline).
 * Nothing is written while any row has a problem; the apply button says why.
 */
import { useRouter } from 'expo-router';
import { useMemo, useState } from 'react';
import { StyleSheet, View } from 'react-native';
import { pickCsvFile, useScheduleImport } from '@/hooks/use-csv';
import { confirmAction } from '@/lib/confirm';
import { CSV_HEADER_OF, planSummary, type CsvField, type ImportPlan } from '@/shared/csv';
import { Button } from '@/components/ui/button';
import { CsvPreview } from './csv-preview';
import { ToggleField } from '@/components/ui/fields';
import { EmptyState, replicaGate } from '@/components/ui/states';
import { Text } from '@/components/ui/text';
import { colours, radii, space } from '@/components/ui/theme';
import { can } from '@/shared/permissions';

export function CsvImport({ panelId }: { panelId: string }) {
  const router = useRouter();
  const importer = useScheduleImport(panelId);
  const [file, setFile] = useState<{ name: string; text: string } | null>(null);
  const [removeMissing, setRemoveMissing] = useState(false);
  const [pickError, setPickError] = useState<string | null>(null);
  const [applied, setApplied] = useState<string | null>(null);
  const { plan: planOf, ready } = importer;
  const plan = useMemo(() => (file && ready ? planOf(file.text, removeMissing) : null), [file, removeMissing, ready, planOf]);

  const gate = replicaGate(importer.query, 'panel');
  if (gate || !importer.found) return gate;
  const { panel, building } = importer.found;
  if (!can(building.role, 'schedule.edit')) {
    return (
      <EmptyState
        title="Read only"
        hint={`As ${building.role} you can export this schedule but not import into it. Ask an electrician or an admin.`}
      />
    );
  }

  const choose = async () => {
    setPickError(null);
    setApplied(null);
    try {
      const picked = await pickCsvFile();
      if (picked) setFile(picked);
    } catch (e) {
      setPickError(e instanceof Error ? e.message : String(e));
    }
  };

  const apply = async (p: ImportPlan) => {
    if (p.deletes.length > 0) {
      const ok = await confirmAction(
        'Remove circuits not in the file?',
        `${p.deletes.length} circuit${p.deletes.length === 1 ? '' : 's'} of ${panel.tag} (position ${p.deletes.map((c) => c.position).join(', ')}) will be deleted.`,
        'Remove them',
      );
      if (!ok) return;
    }
    importer.apply(p);
    setApplied(planSummary(p));
    setFile(null);
  };

  const changes = plan ? plan.creates.length + plan.patches.length + plan.deletes.length : 0;
  const badRows = plan ? plan.rows.filter((r) => r.problems.length > 0).length : 0;
  const reason = !plan
    ? null
    : plan.fileProblems.length > 0
      ? 'Nothing is written: this file cannot be read as a schedule (see the reasons above). Export a panel to see the columns it needs.'
      : badRows > 0
        ? `Nothing is written while ${badRows} row${badRows === 1 ? ' has a problem' : 's have problems'}: fix ${badRows === 1 ? 'it' : 'them'} in the file and choose it again.`
        : changes === 0
          ? 'The file matches the schedule: there is nothing to change.'
          : null;

  return (
    <View style={styles.wrap}>
      <View style={styles.head}>
        <Text variant="title" heading={2}>Import into {panel.tag}</Text>
        <Text tone="soft">
          Each row of the file describes the circuit at its position. A position the panel already has is updated
          (only the values that differ); a new position is added. Positions the file leaves out stay as they are
          unless you choose to remove them. Nothing is written until you apply, and nothing while any row has a
          problem.
        </Text>
        <Text variant="small" tone="faint">
          Columns: {Object.values(CSV_HEADER_OF as Record<CsvField, string>).join(' · ')}. “Feeds panel” is the tag of
          a panel in this building; “Trip band” is the label of a band in your library.
        </Text>
      </View>
      {applied && (
        <View style={styles.done} testID="csv-applied">
          <Text variant="strong">Import queued: {applied}.</Text>
          <Text variant="small">The schedule shows it now on this device; it is sent as soon as there is a connection.</Text>
          <Button label={`Back to ${panel.tag}`} tone="secondary" onPress={() => router.back()} testID="csv-back" />
        </View>
      )}
      <Button label={file ? 'Choose another file' : 'Choose a CSV file'} tone={file ? 'secondary' : 'primary'} onPress={choose} testID="csv-pick" />
      {pickError && <Text tone="danger">{pickError}</Text>}
      {file && plan && (
        <>
          <Text variant="small" tone="soft" testID="csv-file-name">
            {file.name} · {plan.rows.length} row{plan.rows.length === 1 ? '' : 's'} · {planSummary(plan)}
          </Text>
          {plan.fileProblems.length > 0 && (
            <View style={styles.problems} testID="csv-file-problems" accessibilityRole="alert">
              <Text variant="strong" tone="danger">⚠ This file was refused</Text>
              {plan.fileProblems.map((p) => (
                <Text key={p} variant="small">{p}</Text>
              ))}
            </View>
          )}
          {plan.rows.length > 0 && <CsvPreview plan={plan} />}
          {(plan.kept.length > 0 || removeMissing) && (
            <ToggleField
              label="Remove circuits not in the file"
              hint={`${removeMissing ? plan.deletes.length : plan.kept.length} circuit(s) of ${panel.tag} are not in the file. You will be asked to confirm before any is deleted.`}
              value={removeMissing}
              onChange={setRemoveMissing}
            />
          )}
          {reason && (
            <Text tone={plan.blocked ? 'danger' : 'soft'} testID="csv-apply-reason">
              {plan.blocked ? '⚠ ' : ''}
              {reason}
            </Text>
          )}
          <Button
            label={changes > 0 ? `Apply ${changes} change${changes === 1 ? '' : 's'}` : 'Apply'}
            disabled={plan.blocked || changes === 0}
            onPress={() => void apply(plan)}
            testID="csv-apply"
          />
        </>
      )}
    </View>
  );
}

const styles = StyleSheet.create({
  wrap: { gap: space.md },
  head: { gap: space.xs },
  problems: { gap: space.xs, backgroundColor: colours.dangerSoft, padding: space.md, borderRadius: radii.md },
  done: { gap: space.xs, backgroundColor: colours.copperSoft, padding: space.md, borderRadius: radii.md },
});

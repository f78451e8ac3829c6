/**
 * What a reading means, as shown under a reading and live in the reading form: the priority (word
 * and colour), the one-line summary, the figures behind it, the basis it was judged on, and the
 * warnings and notes that go with it.
 */
import { StyleSheet, View } from 'react-native';
import { isJudged, type Assessment } from '@/shared/assess';
import { PriorityChip } from '@/components/deficiencies/priority-chip';
import { Text } from '@/components/ui/text';
import { colours, radii, space } from '@/components/ui/theme';
import { tripVerdictWords } from '@/components/inspections/inspection-format';
import { useTemperatureUnit } from '@/hooks/use-temperature-unit';
import { formatTemp } from '@/shared/units';

/** The priority a reading gives, or a plain "no action" mark (a word, never a colour alone). */
export function ReadingPriority({ assessment }: { assessment: Assessment }) {
  if (assessment.priority !== null) return <PriorityChip priority={assessment.priority} />;
  const judged = isJudged(assessment);
  return (
    <View style={[styles.noAction, !judged && styles.notJudged]} testID="reading-no-action">
      <Text variant="label" tone={judged ? 'ink' : 'soft'}>
        {judged ? '✓ No action' : '? Not judged'}
      </Text>
    </View>
  );
}

/** The figures behind the judgement, in the mono face readings use. */
function Figures({ assessment }: { assessment: Assessment }) {
  const { unit } = useTemperatureUnit();
  switch (assessment.kind) {
    case 'thermal':
      return (
        <Text variant="reading" testID="assessment-figures">
          ΔT {formatTemp(assessment.riseC, unit, 'rise')}
          {assessment.correctedRiseC !== null ? ` · at reference load ${formatTemp(assessment.correctedRiseC, unit, 'rise')}` : ''}
          {assessment.correction === 'too-light' ? ' · too lightly loaded to judge' : ''}
          {assessment.steadyState ? '' : ' · test pulse, not steady state'}
          {assessment.priority !== null ? ` · NETA priority ${assessment.priority}` : ''}
        </Text>
      );
    case 'torque': {
      // the table's value for this screw and wire, to compare with the one specified
      const table = assessment.verdict.fallback;
      if (!table) return null;
      return (
        <Text variant="reading" testID="assessment-figures">
          table value {table.lbfIn} lbf-in ({table.nm} N·m)
        </Text>
      );
    }
    case 'trip':
    case 'visual':
      // the summary already gives the multiple and the window
      return null;
  }
}

export function ReadingAssessment({ assessment, compact = false }: { assessment: Assessment; compact?: boolean }) {
  const warnings = assessment.kind === 'torque' ? assessment.verdict.warnings : [];
  const notes = assessment.kind === 'thermal' ? assessment.notes : [];
  return (
    <View style={styles.box} testID="reading-assessment">
      <View style={styles.head}>
        <ReadingPriority assessment={assessment} />
        {assessment.kind === 'trip' && assessment.result?.verdict && (
          <Text variant="strong">{tripVerdictWords(assessment.result.verdict)}</Text>
        )}
      </View>
      <Text variant={compact ? 'body' : 'strong'} testID="assessment-summary">{assessment.summary}</Text>
      <Figures assessment={assessment} />
      {assessment.kind === 'thermal' && !compact && <Text variant="small">{assessment.action}</Text>}
      {notes.map((note) => (
        <Text key={note} variant="small" tone="warn" testID="light-load-note">
          ⚠ {note}
        </Text>
      ))}
      {warnings.map((w) => (
        <Text key={w} variant="small" tone="warn" testID="torque-warning">
          ⚠ {w}
        </Text>
      ))}
      <Text variant="small" tone="faint" testID="assessment-basis">
        Basis: {assessment.basis}
      </Text>
    </View>
  );
}

const styles = StyleSheet.create({
  box: { gap: space.xs },
  head: { flexDirection: 'row', alignItems: 'center', gap: space.sm, flexWrap: 'wrap' },
  noAction: {
    alignSelf: 'flex-start',
    borderWidth: 1.5,
    borderColor: colours.ok,
    borderRadius: radii.sm,
    paddingHorizontal: space.sm,
    paddingVertical: 2,
    backgroundColor: colours.card,
  },
  notJudged: { borderColor: colours.rule },
});

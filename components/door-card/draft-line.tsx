/** One line of the draft: what was read, how sure, the photo it came from, and accept / skip / edit. */
import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import type { CardPhoto, LineEdit, ReviewLine } from '@/hooks/use-door-card';
import { needsLook } from '@/shared/door-card/parse';
import { Button } from '../ui/button';
import { ChoiceField, TextField } from '../ui/fields';
import { Text } from '../ui/text';
import { colours, radii, space } from '../ui/theme';
import { PhotoCrop } from './photo-crop';

const STATUS_CHOICES = [
  { value: 'in-use', label: 'In use' },
  { value: 'spare', label: 'Spare' },
  { value: 'space', label: 'Space' },
] as const;
const POLE_CHOICES = [1, 2, 3].map((p) => ({ value: p, label: `${p}P` }));

export function lineSummary(l: Pick<ReviewLine, 'poles' | 'ratingA' | 'description' | 'status'>): string {
  if (l.status === 'space') return 'space';
  const rating = `${l.poles}P ${l.ratingA ?? '—'} A`;
  return `${rating} · ${l.status === 'spare' ? 'spare' : l.description || '(no description)'}`;
}

interface Props {
  line: ReviewLine;
  photo: CardPhoto | null;
  problems: readonly string[];
  onDecide: (decision: ReviewLine['decision']) => void;
  onEdit: (fields: LineEdit) => void;
}

export function DraftLine({ line, photo, problems, onDecide, onEdit }: Props) {
  const [editing, setEditing] = useState(false);
  const marked = needsLook(line);
  const id = `door-card-line-${line.key}`;
  return (
    <View
      style={[styles.row, marked && styles.marked, line.decision === 'skip' && styles.skipped, problems.length > 0 && styles.problem]}
      testID={id}
    >
      <View style={styles.head}>
        <Text variant="readingBold" style={styles.pos} testID={`${id}-position`}>{String(line.position).padStart(2, ' ')}</Text>
        <Text style={styles.what} testID={`${id}-summary`}>{lineSummary(line)}</Text>
        <Text variant="small" tone={marked ? 'warn' : 'faint'} testID={`${id}-confidence`}>
          {marked ? '⚠ look · ' : ''}
          {line.confidence} %
        </Text>
      </View>
      {photo && <PhotoCrop photo={photo} box={line.bbox} label={`Photo of the card where position ${line.position} was read: ${line.source}`} />}
      <Text variant="small" tone="faint">read: “{line.source}”{line.edited ? ' · edited' : ''}</Text>
      {line.notes.map((n) => (
        <Text key={n} variant="small" tone="warn">{n}</Text>
      ))}
      {line.decision === 'accept' &&
        problems.map((p) => (
          <Text key={p} variant="small" tone="danger">⚠ {p}</Text>
        ))}
      {editing ? (
        <LineEditor line={line} onCancel={() => setEditing(false)} onSave={(f) => (onEdit(f), setEditing(false))} />
      ) : (
        <View style={styles.actions}>
          <Button
            label={line.decision === 'accept' ? '✓ Accepted' : 'Accept'}
            tone={line.decision === 'accept' ? 'primary' : 'secondary'}
            onPress={() => onDecide('accept')}
            testID={`${id}-accept`}
          />
          <Button
            label={line.decision === 'skip' ? '✗ Skipped' : 'Skip'}
            tone={line.decision === 'skip' ? 'primary' : 'secondary'}
            onPress={() => onDecide('skip')}
            testID={`${id}-skip`}
          />
          <Button label="Edit" tone="quiet" onPress={() => setEditing(true)} testID={`${id}-edit`} />
        </View>
      )}
    </View>
  );
}

function LineEditor({ line, onSave, onCancel }: { line: ReviewLine; onSave: (f: LineEdit) => void; onCancel: () => void }) {
  const [position, setPosition] = useState(String(line.position));
  const [poles, setPoles] = useState<number>(line.poles);
  const [rating, setRating] = useState(line.ratingA === null ? '' : String(line.ratingA));
  const [description, setDescription] = useState(line.description);
  const [status, setStatus] = useState<ReviewLine['status']>(line.status);
  const pos = Number(position);
  const amps = rating.trim() === '' ? null : Number(rating);
  const positionError = Number.isInteger(pos) && pos >= 1 ? undefined : 'A whole number from 1.';
  const ratingError = amps === null || (Number.isFinite(amps) && amps > 0) ? undefined : 'Amperes as a number, or blank.';
  return (
    <View style={styles.editor}>
      <TextField label="Position" value={position} onChangeText={setPosition} inputMode="numeric" mono error={positionError} testID={`door-card-edit-position`} />
      <ChoiceField label="Poles" choices={POLE_CHOICES} value={poles} onChange={setPoles} />
      <TextField label="Rating (A)" value={rating} onChangeText={setRating} inputMode="numeric" mono error={ratingError} testID={`door-card-edit-rating`} />
      <TextField label="Description" value={description} onChangeText={setDescription} testID={`door-card-edit-description`} />
      <ChoiceField label="Status" choices={STATUS_CHOICES} value={status} onChange={setStatus} />
      <View style={styles.actions}>
        <Button
          label="Use this"
          disabled={!!positionError || !!ratingError}
          onPress={() => onSave({ position: pos, poles: poles as 1 | 2 | 3, ratingA: status === 'space' ? null : amps, description: status === 'in-use' ? description.trim() : '', status })}
          testID="door-card-edit-save"
        />
        <Button label="Cancel" tone="quiet" onPress={onCancel} />
      </View>
    </View>
  );
}

const styles = StyleSheet.create({
  row: { backgroundColor: colours.card, borderWidth: 1, borderColor: colours.rule, borderRadius: radii.md, padding: space.sm, gap: space.xs },
  marked: { borderColor: colours.warn, borderLeftWidth: 4 },
  skipped: { opacity: 0.55 },
  problem: { borderColor: colours.danger, backgroundColor: colours.dangerSoft },
  head: { flexDirection: 'row', alignItems: 'center', gap: space.sm, flexWrap: 'wrap' },
  pos: { minWidth: 28 },
  what: { flex: 1, minWidth: 160 },
  actions: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
  editor: { gap: space.sm },
});

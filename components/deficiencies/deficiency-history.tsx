/**
 * A deficiency's history: every recorded change as "who · when · field: old → new" in plain
 * words, with the comments inline in time order, and a box to add a comment (every role).
 */
import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import type { BuildingView } from '@/hooks/building-view';
import { commentCreateBody, PRIORITY_LABELS, type DeficiencyEntry, type Priority } from '@/shared/records';
import { fieldErrors } from '@/shared/schemas';
import { Button } from '@/components/ui/button';
import { authorName, changeLines, dateTimeWords, dateWords } from './deficiency-format';
import { TextField } from '@/components/ui/fields';
import { Text } from '@/components/ui/text';
import { colours, space } from '@/components/ui/theme';

export interface DeficiencyHistoryProps {
  deficiencyId: string;
  entries: readonly DeficiencyEntry[];
  view: BuildingView;
  people: readonly { id: string; name: string }[];
  me: string | null;
  onComment: (text: string) => void;
}

export function DeficiencyHistory({ deficiencyId, entries, view, people, me, onComment }: DeficiencyHistoryProps) {
  const [text, setText] = useState('');
  const [error, setError] = useState<string | undefined>();
  const ctx = { view, people, me };
  const send = () => {
    const parsed = commentCreateBody.safeParse({ deficiencyId, text });
    if (!parsed.success) {
      setError(fieldErrors(parsed.error).text ?? 'write a comment first');
      return;
    }
    onComment(parsed.data.text);
    setText('');
    setError(undefined);
  };
  return (
    <View style={styles.wrap}>
      {entries.length === 0 ? (
        <Text tone="soft">Nothing recorded yet. Changes appear here once they reach the server; comments at once.</Text>
      ) : (
        <View testID="history">
          {entries.map((e) => {
            const who = authorName(e.userName, e.userId, me);
            const when = dateTimeWords(e.at);
            if (e.kind === 'comment') {
              return (
                <View key={e.id} style={[styles.entry, styles.comment]} testID="history-comment">
                  <Text variant="small" tone="soft">
                    {who} · {when} · commented
                  </Text>
                  <Text>{e.text}</Text>
                </View>
              );
            }
            const raised = e.text === 'raised';
            const raisedWith = raised ? raisedWords(e.changes) : null;
            return (
              <View key={e.id} style={styles.entry} testID="history-change">
                <Text variant="small" tone="soft">
                  {who} · {when}
                  {raised ? ' · raised this deficiency' : ''}
                </Text>
                {raised ? (
                  raisedWith ? <Text variant="small">{raisedWith}</Text> : null
                ) : (
                  changeLines(e.changes, ctx).map((line) => (
                    <Text key={line} variant="small">
                      {line}
                    </Text>
                  ))
                )}
              </View>
            );
          })}
        </View>
      )}
      <TextField
        label="Add a comment"
        value={text}
        onChangeText={(t) => {
          setText(t);
          setError(undefined);
        }}
        multiline
        error={error}
        placeholder="A note for everyone on this finding"
        testID="field-comment"
      />
      <Button label="Post comment" tone="secondary" onPress={send} testID="post-comment" style={styles.post} />
    </View>
  );
}

/** "P2 soon, due 3 Jan 2027" from the fields a raise recorded. */
function raisedWords(changes: Record<string, [unknown, unknown]>): string | null {
  const priority = changes.priority?.[1] as Priority | undefined;
  const due = changes.dueOn?.[1] as string | undefined;
  const parts = [priority ? PRIORITY_LABELS[priority] : null, due ? `due ${dateWords(due)}` : null].filter(Boolean);
  return parts.length ? parts.join(', ') : null;
}

const styles = StyleSheet.create({
  wrap: { gap: space.md },
  entry: {
    paddingVertical: space.sm,
    borderBottomWidth: StyleSheet.hairlineWidth,
    borderBottomColor: colours.rule,
    gap: 2,
  },
  comment: { borderLeftWidth: 3, borderLeftColor: colours.copper, paddingLeft: space.sm },
  post: { alignSelf: 'flex-start' },
});

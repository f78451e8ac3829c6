/**
 * Printed documents, made by the server: the panel door's circuit directory (Letter or A4) and an
 * inspection's report. Both open the PDF in a new tab (web) or the system viewer; they need a
 * connection, and say so instead of failing silently when the device is offline.
 */
import { onlineManager } from '@tanstack/react-query';
import { useState } from 'react';
import { Linking, Pressable, StyleSheet, View } from 'react-native';
import { useSendReport } from '@/hooks/use-access';
import { useOnline } from '@/hooks/use-outbox';
import { useTemperatureUnit } from '@/hooks/use-temperature-unit';
import { describeError } from '@/lib/api';
import { absoluteApiUrl } from '@/lib/api-base';
import { Button } from '@/components/ui/button';
import { Text } from '@/components/ui/text';
import { colours, MIN_TOUCH, radii, space } from '@/components/ui/theme';

type Paper = 'letter' | 'a4';
const PAPERS: { value: Paper; label: string }[] = [
  { value: 'letter', label: 'Letter' },
  { value: 'a4', label: 'A4' },
];
const OFFLINE_NOTE = 'Printing needs a connection: the PDF is made on the server. Try again once you are back online.';

/** Open a PDF the server makes, or say why not. */
function useOpenPdf() {
  const online = useOnline();
  const [note, setNote] = useState<string | null>(null);
  const open = (path: string) => {
    if (!onlineManager.isOnline()) {
      setNote(OFFLINE_NOTE);
      return;
    }
    setNote(null);
    Linking.openURL(absoluteApiUrl(path)).catch(() => setNote('The PDF could not be opened here: allow pop-ups for this site and try again.'));
  };
  return { online, note: note ?? (online ? null : 'Offline: printing waits for a connection.'), open };
}

/** "Print directory" with the choice of paper, for everyone who may see the panel. */
export function PrintDirectoryButton({ panelId }: { panelId: string }) {
  const [paper, setPaper] = useState<Paper>('letter');
  const { note, open } = useOpenPdf();
  return (
    <View style={styles.wrap}>
      <View style={styles.row}>
        <View style={styles.papers} role="radiogroup" aria-label="Paper size">
          {PAPERS.map((p) => {
            const chosen = p.value === paper;
            return (
              <Pressable
                key={p.value}
                role="radio"
                aria-checked={chosen}
                accessibilityLabel={`${p.label} paper`}
                testID={`print-paper-${p.value}`}
                onPress={() => setPaper(p.value)}
                style={[styles.paper, chosen && styles.paperChosen]}
              >
                <Text variant="strong" tone={chosen ? 'paper' : 'ink'}>{p.label}</Text>
              </Pressable>
            );
          })}
        </View>
        <Button
          label="Print directory"
          tone="secondary"
          testID="print-directory"
          onPress={() => open(`/panels/${panelId}/directory.pdf?paper=${paper}`)}
        />
      </View>
      {note && <Text variant="small" tone="soft" testID="print-note">{note}</Text>}
    </View>
  );
}

/** "Report (PDF)" of an inspection: readings with verdicts, deficiencies, load, sign-off. */
export function ReportPdfButton({ inspectionId }: { inspectionId: string }) {
  const { note, open } = useOpenPdf();
  // temperatures print in the reader's unit; °C is the server's default
  const { unit } = useTemperatureUnit();
  const query = unit === 'C' ? '' : `?temperature=${unit}`;
  return (
    <View style={styles.wrap}>
      <View style={styles.row}>
        <Button
          label="Report (PDF)"
          tone="secondary"
          testID="report-pdf"
          onPress={() => open(`/inspections/${inspectionId}/report.pdf${query}`)}
        />
      </View>
      {note && <Text variant="small" tone="soft" testID="print-note">{note}</Text>}
    </View>
  );
}

/**
 * "Send report to owner": e-mails the report PDF to the building's owners (admins and inspectors;
 * the server checks). Needs a connection; says whom it reached, or why not.
 */
export function SendReportButton({ inspectionId }: { inspectionId: string }) {
  const send = useSendReport(inspectionId);
  const online = useOnline();
  const answer = send.isSuccess
    ? send.data.sentTo.length > 0
      ? `✓ Sent to ${send.data.sentTo.join(', ')}.`
      : 'No owner has access to this building yet: grant one under Users and access.'
    : send.isError
      ? `${describeError(send.error)} Nothing was sent.`
      : !online
        ? 'Offline: sending waits for a connection.'
        : null;
  return (
    <View style={styles.wrap}>
      <View style={styles.row}>
        <Button
          label="Send report to owner"
          tone="secondary"
          busy={send.isPending}
          disabled={!online}
          testID="send-report"
          onPress={() => send.mutate(undefined)}
        />
      </View>
      {answer && (
        <Text variant="small" tone={send.isError ? 'danger' : 'soft'} testID="send-report-note">
          {answer}
        </Text>
      )}
    </View>
  );
}

const styles = StyleSheet.create({
  wrap: { gap: space.xs },
  row: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm, alignItems: 'center' },
  papers: {
    flexDirection: 'row',
    borderWidth: 1,
    borderColor: colours.ruleStrong,
    borderRadius: radii.md,
    overflow: 'hidden',
  },
  paper: { minHeight: MIN_TOUCH, minWidth: MIN_TOUCH + 12, paddingHorizontal: space.md, justifyContent: 'center', alignItems: 'center' },
  paperChosen: { backgroundColor: colours.ink },
});

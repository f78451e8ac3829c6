/** "Export CSV" (everyone who can see the panel) and "Import CSV" (those who edit schedules). */
import { useRouter } from 'expo-router';
import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import { useScheduleExport } from '@/hooks/use-csv';
import { Button } from '@/components/ui/button';
import { Text } from '@/components/ui/text';
import { space } from '@/components/ui/theme';

export function CsvButtons({ panelId, canImport }: { panelId: string; canImport: boolean }) {
  const router = useRouter();
  const { ready, exportCsv } = useScheduleExport(panelId);
  const [note, setNote] = useState<string | null>(null);
  return (
    <View style={styles.wrap}>
      <Button
        label="Export CSV"
        tone="secondary"
        disabled={!ready}
        testID="csv-export"
        onPress={() => {
          try {
            exportCsv();
            setNote(null);
          } catch (e) {
            setNote(e instanceof Error ? e.message : String(e));
          }
        }}
      />
      {canImport && (
        <Button
          label="Import CSV"
          tone="secondary"
          testID="csv-import"
          onPress={() => router.push({ pathname: '/panels/[panelId]/import', params: { panelId } })}
        />
      )}
      {note && <Text variant="small" tone="soft">{note}</Text>}
    </View>
  );
}

const styles = StyleSheet.create({ wrap: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm, alignItems: 'center' } });

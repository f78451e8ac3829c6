import { Stack, useLocalSearchParams } from 'expo-router';
import { CsvImport } from '@/components/csv/csv-import';
import { Screen } from '@/components/ui/screen';

export default function ImportScheduleScreen() {
  const { panelId } = useLocalSearchParams<{ panelId: string }>();
  return (
    <>
      <Stack.Screen options={{ title: 'Import a schedule' }} />
      <Screen>
        <CsvImport panelId={panelId} />
      </Screen>
    </>
  );
}

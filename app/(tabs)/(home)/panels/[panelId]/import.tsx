import { Stack, useLocalSearchParams } from 'expo-router';
import { CsvImport } from '@/components/csv-import';
import { Screen } from '@/components/screen';

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

import { Stack, useLocalSearchParams } from 'expo-router';
import { DoorCardReader } from '@/components/door-card/door-card-reader';
import { Screen } from '@/components/ui/screen';

export default function DoorCardScreen() {
  const { panelId } = useLocalSearchParams<{ panelId: string }>();
  return (
    <>
      <Stack.Screen options={{ title: 'Read a door card' }} />
      <Screen wide>
        <DoorCardReader panelId={panelId} />
      </Screen>
    </>
  );
}

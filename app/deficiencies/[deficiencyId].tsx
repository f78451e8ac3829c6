import { Stack, useLocalSearchParams, useRouter } from 'expo-router';
import { DeficiencyDetail } from '@/components/deficiencies/deficiency-detail';
import { Screen } from '@/components/ui/screen';

export default function DeficiencyScreen() {
  const { deficiencyId } = useLocalSearchParams<{ deficiencyId: string }>();
  const router = useRouter();
  return (
    <Screen>
      <Stack.Screen options={{ title: 'Deficiency' }} />
      <DeficiencyDetail
        deficiencyId={deficiencyId}
        onDeleted={() => (router.canGoBack() ? router.back() : router.replace('/findings'))}
      />
    </Screen>
  );
}

import { useLocalSearchParams } from 'expo-router';
import { ResetPassword } from '@/components/access-links';
import { Screen } from '@/components/screen';
import { Text } from '@/components/text';

export default function ResetPasswordScreen() {
  const { token } = useLocalSearchParams<{ token: string }>();
  return (
    <Screen>
      <Text variant="title">Ampwright</Text>
      <ResetPassword token={String(token)} />
    </Screen>
  );
}

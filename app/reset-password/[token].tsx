import { useLocalSearchParams } from 'expo-router';
import { ResetPassword } from '@/components/access/access-links';
import { Screen } from '@/components/ui/screen';
import { Text } from '@/components/ui/text';

export default function ResetPasswordScreen() {
  const { token } = useLocalSearchParams<{ token: string }>();
  return (
    <Screen>
      <Text variant="title" heading={1}>
        Ampwright
      </Text>
      <ResetPassword token={String(token)} />
    </Screen>
  );
}

import { ForgotPassword } from '@/components/access-links';
import { Screen } from '@/components/screen';
import { Text } from '@/components/text';

export default function ForgotPasswordScreen() {
  return (
    <Screen>
      <Text variant="title">Ampwright</Text>
      <ForgotPassword />
    </Screen>
  );
}

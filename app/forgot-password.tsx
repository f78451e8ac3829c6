import { ForgotPassword } from '@/components/access/access-links';
import { Screen } from '@/components/ui/screen';
import { Text } from '@/components/ui/text';

export default function ForgotPasswordScreen() {
  return (
    <Screen>
      <Text variant="title" heading={1}>
        Ampwright
      </Text>
      <ForgotPassword />
    </Screen>
  );
}

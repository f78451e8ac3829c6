import { useLocalSearchParams } from 'expo-router';
import { AcceptInvitation } from '@/components/access-links';
import { Screen } from '@/components/screen';
import { Text } from '@/components/text';

export default function InvitationScreen() {
  const { token } = useLocalSearchParams<{ token: string }>();
  return (
    <Screen>
      <Text variant="title">Ampwright</Text>
      <AcceptInvitation token={String(token)} />
    </Screen>
  );
}

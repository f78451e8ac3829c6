import { useLocalSearchParams } from 'expo-router';
import { AcceptInvitation } from '@/components/access/access-links';
import { Screen } from '@/components/ui/screen';
import { Text } from '@/components/ui/text';

export default function InvitationScreen() {
  const { token } = useLocalSearchParams<{ token: string }>();
  return (
    <Screen>
      <Text variant="title" heading={1}>
        Ampwright
      </Text>
      <AcceptInvitation token={String(token)} />
    </Screen>
  );
}

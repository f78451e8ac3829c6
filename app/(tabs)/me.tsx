import { StyleSheet, View } from 'react-native';
import { Button } from '@/components/button';
import { ReadOnlyField } from '@/components/fields';
import { SafetyNote } from '@/components/safety-note';
import { Screen } from '@/components/screen';
import { Text } from '@/components/text';
import { colours, radii, space } from '@/components/theme';
import { useSession, useSignOut } from '@/hooks/use-session';

export default function Me() {
  const session = useSession();
  const signOut = useSignOut();
  const me = session.data;
  if (!me) return null;
  return (
    <Screen>
      <View style={styles.card}>
        <Text variant="heading">{me.user.name}</Text>
        <ReadOnlyField label="E-mail" value={me.user.email} />
        {me.memberships.map((m) => (
          <ReadOnlyField key={m.organisationId} label={m.organisationName} value={m.role} />
        ))}
      </View>
      <SafetyNote />
      <Button label="Sign out" tone="secondary" onPress={() => signOut.mutate()} busy={signOut.isPending} testID="sign-out" />
    </Screen>
  );
}

const styles = StyleSheet.create({
  card: { gap: space.sm, padding: space.lg, backgroundColor: colours.card, borderRadius: radii.lg, borderWidth: 1, borderColor: colours.rule },
});

import { useRouter } from 'expo-router';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { ReadOnlyField } from '@/components/ui/fields';
import { SafetyNote } from '@/components/ui/safety-note';
import { Screen } from '@/components/ui/screen';
import { Text } from '@/components/ui/text';
import { ThemeChoice } from '@/components/ui/theme-choice';
import { useOutbox } from '@/hooks/use-outbox';
import { useWaitingPhotos } from '@/hooks/use-photos';
import { OrganisationSettingsCard } from '@/components/access/organisation-settings';
import { TemperatureUnitCard } from '@/components/settings/temperature-unit-card';
import { useSession, useSignOut } from '@/hooks/use-session';
import { confirmAction } from '@/lib/confirm';
import { can } from '@/shared/permissions';

export default function Me() {
  const session = useSession();
  const router = useRouter();
  const signOut = useSignOut();
  const unsynced = useOutbox().length + useWaitingPhotos().photos.length;
  const me = session.data;
  const onSignOut = async () => {
    if (unsynced > 0) {
      const ok = await confirmAction(
        'Changes not yet synced',
        `${unsynced} change${unsynced === 1 ? ' is' : 's are'} (photos included) still only on this device. Signing out deletes ${unsynced === 1 ? 'it' : 'them'}. Sync first if you can.`,
        'Sign out and delete',
      );
      if (!ok) return;
    }
    signOut.mutate();
  };
  if (!me) return null;
  return (
    <Screen>
      <Card>
        <Text variant="heading" heading={2}>
          {me.user.name}
        </Text>
        <ReadOnlyField label="E-mail" value={me.user.email} />
        {me.memberships.map((m) => (
          <ReadOnlyField key={m.organisationId} label={m.organisationName} value={m.role} />
        ))}
      </Card>
      <TemperatureUnitCard />
      {me.memberships
        .filter((m) => can(m.role, 'settings.edit'))
        .map((m) => (
          <OrganisationSettingsCard key={m.organisationId} membership={m} />
        ))}
      {me.memberships.some((m) => can(m.role, 'people.manage')) && (
        <Button label="Users and access" tone="secondary" onPress={() => router.push('/users')} testID="users-and-access" />
      )}
      <Card>
        <ThemeChoice />
      </Card>
      <Button label="Band library" tone="secondary" onPress={() => router.push('/bands')} testID="band-library" />
      <SafetyNote />
      <Button label="Sign out" tone="secondary" onPress={onSignOut} busy={signOut.isPending} testID="sign-out" />
    </Screen>
  );
}

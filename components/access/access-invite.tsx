/** The admin's invitation form: e-mail, role and, for an owner, the buildings granted. */
import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import { useInvite } from '@/hooks/use-access';
import { ApiError, describeError } from '@/lib/api';
import { inviteBody, INVITATION_DAYS, ROLE_LABELS } from '@/shared/access';
import { ROLES, type Role } from '@/shared/domain';
import { fieldErrors } from '@/shared/schemas';
import { BuildingChecklist, AccessCard, Notice } from './access-parts';
import { Button } from '@/components/ui/button';
import { ChoiceField, TextField } from '@/components/ui/fields';
import { Text } from '@/components/ui/text';
import { space } from '@/components/ui/theme';

export function AccessInvite({ organisationId, buildings }: { organisationId: string; buildings: { id: string; name: string }[] }) {
  const [email, setEmail] = useState('');
  const [role, setRole] = useState<Role>('electrician');
  const [buildingIds, setBuildingIds] = useState<Set<string>>(new Set());
  const [errors, setErrors] = useState<Record<string, string>>({});
  const invite = useInvite(organisationId);
  const serverFields = invite.error instanceof ApiError ? invite.error.fields : undefined;

  const submit = () => {
    const parsed = inviteBody.safeParse({ email: email.trim(), role, buildingIds: role === 'owner' ? [...buildingIds] : [] });
    if (!parsed.success) {
      setErrors(fieldErrors(parsed.error));
      return;
    }
    setErrors({});
    invite.mutate(parsed.data, {
      onSuccess: () => {
        setEmail('');
        setBuildingIds(new Set());
      },
    });
  };

  return (
    <AccessCard testID="access-invite">
      <Text variant="heading" heading={2}>Invite someone</Text>
      <Text tone="soft">They get an e-mail with a link that works once, for {INVITATION_DAYS} days, to choose their name and password.</Text>
      <TextField
        label="E-mail"
        value={email}
        onChangeText={(v) => {
          setEmail(v);
          setErrors(({ email: _e, ...rest }) => rest);
        }}
        autoCapitalize="none"
        autoComplete="email"
        keyboardType="email-address"
        error={errors.email ?? serverFields?.email}
        testID="invite-email"
      />
      <ChoiceField
        label="Role"
        value={role}
        onChange={(r) => {
          setRole(r);
          setErrors(({ buildingIds: _b, ...rest }) => rest);
        }}
        choices={ROLES.map((r) => ({ value: r, label: ROLE_LABELS[r] }))}
        hint={role === 'owner' ? 'An owner sees only the buildings granted and cannot record work.' : undefined}
      />
      {role === 'owner' && (
        <View style={styles.group}>
          <Text variant="label" tone="soft">Buildings they may see</Text>
          {buildings.length === 0 ? (
            <Text tone="soft">Add a building first: an owner needs at least one.</Text>
          ) : (
            <BuildingChecklist
              buildings={buildings}
              granted={buildingIds}
              testIDPrefix="invite-building"
              onToggle={(id, on) => {
                setBuildingIds((s) => {
                  const next = new Set(s);
                  if (on) next.add(id);
                  else next.delete(id);
                  return next;
                });
                setErrors(({ buildingIds: _b, ...rest }) => rest);
              }}
            />
          )}
          {(errors.buildingIds ?? serverFields?.buildingIds) && (
            <Text tone="danger" accessibilityRole="alert">{errors.buildingIds ?? serverFields?.buildingIds}</Text>
          )}
        </View>
      )}
      {invite.isSuccess && <Notice text={invite.data.message} testID="invite-result" />}
      {invite.error && !serverFields?.email && !serverFields?.buildingIds && (
        <Notice tone="danger" text={describeError(invite.error)} testID="invite-error" />
      )}
      <Button label="Send invitation" onPress={submit} busy={invite.isPending} testID="invite-submit" />
    </AccessCard>
  );
}

const styles = StyleSheet.create({ group: { gap: space.sm } });

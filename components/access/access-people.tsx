/**
 * The organisation's people (admin only): role, remove, an owner's buildings, and the invitations
 * still open. Every change needs a connection and takes effect at the person's next request.
 */
import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import { useBuildingGrant, useCancelInvitation, useChangeRole, useRemovePerson } from '@/hooks/use-access';
import { describeError } from '@/lib/api';
import { confirmAction } from '@/lib/confirm';
import { ROLE_LABELS, type PeopleResponse, type Person } from '@/shared/access';
import { ROLES, type Role } from '@/shared/domain';
import { AccessCard, BuildingChecklist, Notice } from './access-parts';
import { Button } from '@/components/ui/button';
import { ChoiceField } from '@/components/ui/fields';
import { Text } from '@/components/ui/text';
import { space } from '@/components/ui/theme';

export function AccessPeople({ data, myUserId }: { data: PeopleResponse; myUserId: string }) {
  const { organisationId } = data;
  const adminCount = data.people.filter((p) => p.role === 'admin').length;
  return (
    <View style={styles.list}>
      <Text variant="heading" heading={2}>People ({data.people.length})</Text>
      {data.people.map((p) => (
        <PersonCard
          key={p.userId}
          organisationId={organisationId}
          person={p}
          buildings={data.buildings}
          isMe={p.userId === myUserId}
          onlyAdmin={p.role === 'admin' && adminCount === 1}
        />
      ))}
      <PendingInvitations data={data} />
    </View>
  );
}

function PersonCard({
  organisationId,
  person,
  buildings,
  isMe,
  onlyAdmin,
}: {
  organisationId: string;
  person: Person;
  buildings: { id: string; name: string }[];
  isMe: boolean;
  onlyAdmin: boolean;
}) {
  const changeRole = useChangeRole(organisationId);
  const remove = useRemovePerson(organisationId);
  const grant = useBuildingGrant(organisationId);
  const [error, setError] = useState<unknown>(null);
  const slug = person.email.replace(/[^a-z0-9]/gi, '-');

  const onRole = async (role: Role) => {
    if (role === person.role) return;
    const owner = role === 'owner' || person.role === 'owner';
    const ok = await confirmAction(
      `Make ${person.name} ${ROLE_LABELS[role].toLowerCase()}?`,
      owner
        ? `${role === 'owner' ? 'An owner sees only the buildings you grant, starting with none.' : 'Their building grants are dropped: the new role sees every building.'} It takes effect at once.`
        : 'It takes effect at once.',
      'Change role',
    );
    if (!ok) return;
    setError(null);
    changeRole.mutate({ userId: person.userId, role }, { onError: setError });
  };
  const onRemove = async () => {
    const ok = await confirmAction(
      `Remove ${person.name}?`,
      `${person.name} loses access to this organisation at once; their devices drop its buildings at the next sync. Their records stay.`,
      'Remove',
    );
    if (!ok) return;
    setError(null);
    remove.mutate(person.userId, { onError: setError });
  };
  const onGrant = async (buildingId: string, on: boolean) => {
    const name = buildings.find((b) => b.id === buildingId)?.name ?? 'this building';
    if (!on) {
      const ok = await confirmAction(
        `Revoke ${name}?`,
        `${person.name} stops seeing ${name} at once, and their device drops its copy at the next sync.`,
        'Revoke',
      );
      if (!ok) return;
    }
    setError(null);
    grant.mutate({ userId: person.userId, buildingId, granted: on }, { onError: setError });
  };

  return (
    <AccessCard testID={`person-${slug}`}>
      <View>
        <Text variant="strong" heading={3}>{person.name}{isMe ? ' (you)' : ''}</Text>
        <Text tone="soft">{person.email}</Text>
      </View>
      <ChoiceField
        label="Role"
        value={person.role}
        onChange={onRole}
        disabled={changeRole.isPending || onlyAdmin}
        choices={ROLES.map((r) => ({ value: r, label: ROLE_LABELS[r] }))}
        hint={onlyAdmin ? 'The only admin: make someone else an admin before changing this role.' : undefined}
      />
      {person.role === 'owner' && (
        <View style={styles.group}>
          <Text variant="label" tone="soft">Buildings granted</Text>
          {person.buildingIds.length === 0 && <Text tone="soft">None yet: choose the buildings this owner may see.</Text>}
          <BuildingChecklist
            buildings={buildings}
            granted={new Set(person.buildingIds)}
            onToggle={onGrant}
            disabled={grant.isPending}
            testIDPrefix={`grant-${slug}`}
          />
        </View>
      )}
      {error != null && <Notice tone="danger" text={describeError(error)} />}
      {isMe ? (
        <Text variant="small" tone="faint">You cannot remove yourself; another admin can.</Text>
      ) : onlyAdmin ? null : (
        <Button label={`Remove ${person.name}…`} tone="secondary" onPress={onRemove} busy={remove.isPending} testID={`remove-${slug}`} />
      )}
    </AccessCard>
  );
}

function PendingInvitations({ data }: { data: PeopleResponse }) {
  const cancel = useCancelInvitation(data.organisationId);
  if (data.invitations.length === 0) return null;
  const names = new Map(data.buildings.map((b) => [b.id, b.name]));
  return (
    <AccessCard testID="pending-invitations">
      <Text variant="heading" heading={2}>Invitations not yet accepted</Text>
      {data.invitations.map((i) => (
        <View key={i.id} style={styles.invitation}>
          <Text variant="strong" heading={3}>{i.email}</Text>
          <Text tone="soft">
            {ROLE_LABELS[i.role]}
            {i.buildingIds.length ? ` · ${i.buildingIds.map((id) => names.get(id) ?? 'a removed building').join(', ')}` : ''}
            {` · link works until ${new Date(i.expiresAt).toLocaleDateString()}`}
          </Text>
          <Button
            label="Cancel invitation"
            tone="secondary"
            busy={cancel.isPending && cancel.variables === i.id}
            onPress={async () => {
              if (await confirmAction('Cancel this invitation?', `The link sent to ${i.email} stops working.`, 'Cancel invitation')) {
                cancel.mutate(i.id);
              }
            }}
          />
        </View>
      ))}
    </AccessCard>
  );
}

const styles = StyleSheet.create({
  list: { gap: space.md },
  group: { gap: space.sm },
  invitation: { gap: space.xs },
});

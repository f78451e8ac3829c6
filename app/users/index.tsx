import { useState } from 'react';
import { AccessInvite } from '@/components/access/access-invite';
import { AccessPeople } from '@/components/access/access-people';
import { ChoiceField } from '@/components/ui/fields';
import { Screen } from '@/components/ui/screen';
import { EmptyState, ErrorState, LoadingState } from '@/components/ui/states';
import { usePeople } from '@/hooks/use-access';
import { useSession } from '@/hooks/use-session';
import { can } from '@/shared/permissions';

export default function UsersAndAccess() {
  const me = useSession().data;
  const adminOf = me?.memberships.filter((m) => can(m.role, 'people.manage')) ?? [];
  const [picked, setPicked] = useState<string | undefined>(undefined);
  const organisationId = picked ?? adminOf[0]?.organisationId;
  const people = usePeople(organisationId);

  if (!me) return null;
  if (adminOf.length === 0) {
    return (
      <Screen>
        <EmptyState title="For admins" hint="Only an admin of an organisation manages its people. Ask yours to invite someone or change a role." />
      </Screen>
    );
  }
  return (
    <Screen>
      {adminOf.length > 1 && (
        <ChoiceField
          label="Organisation"
          value={organisationId ?? ''}
          onChange={setPicked}
          choices={adminOf.map((m) => ({ value: m.organisationId, label: m.organisationName }))}
        />
      )}
      {people.isPending ? (
        <LoadingState what="people" />
      ) : people.isError ? (
        <ErrorState error={people.error} onRetry={() => people.refetch()} />
      ) : (
        <>
          <AccessInvite organisationId={people.data.organisationId} buildings={people.data.buildings} />
          <AccessPeople data={people.data} myUserId={me.user.id} />
        </>
      )}
    </Screen>
  );
}

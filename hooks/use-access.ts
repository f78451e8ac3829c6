/**
 * Users and access (server/routes/access.ts). These are online actions, like adding a band: an
 * invitation or a password needs the server at once, so nothing here is queued in the outbox.
 */
import { useContext } from 'react';
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api';
import {
  forgotPasswordAnswer,
  invitationView,
  inviteResponse,
  passwordResetView,
  peopleResponse,
  sendReportAnswer,
  type AcceptInvitationRequest,
  type InviteBody,
} from '@/shared/access';
import type { Role } from '@/shared/domain';
import { meResponse } from '@/shared/schemas';
import { AccountContext } from './use-session';
import { keys } from './keys';

const accessKeys = {
  people: (organisationId: string) => ['access', 'people', organisationId] as const,
  invitation: (token: string) => ['access', 'invitation', token] as const,
  reset: (token: string) => ['access', 'reset', token] as const,
};

export function usePeople(organisationId: string | undefined) {
  return useQuery({
    queryKey: accessKeys.people(organisationId ?? ''),
    queryFn: () => api.get(`/organisations/${organisationId}/people`, peopleResponse),
    enabled: !!organisationId,
  });
}

/** Every change to people refreshes the list and the signed-in user's own `me` (people for assignment). */
function usePeopleChange<V, R = unknown>(organisationId: string, fn: (v: V) => Promise<R>) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: fn,
    onSettled: () => {
      void queryClient.invalidateQueries({ queryKey: accessKeys.people(organisationId) });
      void queryClient.invalidateQueries({ queryKey: keys.me });
    },
  });
}

export function useInvite(organisationId: string) {
  return usePeopleChange(organisationId, (body: InviteBody) =>
    api.post(`/organisations/${organisationId}/invitations`, body, inviteResponse),
  );
}

export function useCancelInvitation(organisationId: string) {
  return usePeopleChange(organisationId, (id: string) => api.del(`/organisations/${organisationId}/invitations/${id}`));
}

export function useChangeRole(organisationId: string) {
  return usePeopleChange(organisationId, ({ userId, role }: { userId: string; role: Role }) =>
    api.patch(`/organisations/${organisationId}/people/${userId}`, { role }),
  );
}

export function useRemovePerson(organisationId: string) {
  return usePeopleChange(organisationId, (userId: string) => api.del(`/organisations/${organisationId}/people/${userId}`));
}

export function useBuildingGrant(organisationId: string) {
  return usePeopleChange(organisationId, ({ userId, buildingId, granted }: { userId: string; buildingId: string; granted: boolean }) => {
    const path = `/organisations/${organisationId}/people/${userId}/buildings/${buildingId}`;
    return granted ? api.post(path) : api.del(path);
  });
}

/** After a one-time link signs the user in: mount their cache, as a sign-in does. */
function useSignedInBy<V>(fn: (v: V) => Promise<unknown>) {
  const queryClient = useQueryClient();
  const account = useContext(AccountContext);
  return useMutation({
    mutationFn: async (v: V) => {
      await fn(v);
      return api.get('/me', meResponse);
    },
    onSuccess: (me) => {
      if (account.userId === me.user.id) {
        queryClient.setQueryData(keys.me, me);
        // an invitation accepted while signed in adds an organisation: pull its buildings
        void queryClient.invalidateQueries({ queryKey: keys.replica });
      } else account.switchTo(me.user.id);
    },
  });
}

export function useInvitation(token: string) {
  return useQuery({
    queryKey: accessKeys.invitation(token),
    queryFn: () => api.get(`/invitations/${token}`, invitationView),
    retry: false,
  });
}

export function useAcceptInvitation(token: string) {
  return useSignedInBy((body: AcceptInvitationRequest) => api.post(`/invitations/${token}/accept`, body));
}

export function useForgotPassword() {
  return useMutation({
    mutationFn: (email: string) => api.post('/auth/forgot-password', { email }, forgotPasswordAnswer),
  });
}

export function usePasswordReset(token: string) {
  return useQuery({
    queryKey: accessKeys.reset(token),
    queryFn: () => api.get(`/password-resets/${token}`, passwordResetView),
    retry: false,
  });
}

export function useResetPassword(token: string) {
  return useSignedInBy((password: string) => api.post(`/password-resets/${token}`, { password }));
}

/** "Send report to owner" for an inspection (admin or inspector). */
export function useSendReport(inspectionId: string) {
  return useMutation({
    mutationFn: (to?: string) => api.post(`/inspections/${inspectionId}/send-report`, to ? { to } : {}, sendReportAnswer),
  });
}

import { useMutation, useQuery, useQueryClient, type QueryClient } from '@tanstack/react-query';
import { api, isUnauthorised } from '@/lib/api';
import type { MeResponse, SignInBody } from '@/shared/schemas';
import { keys } from './keys';

/** The signed-in user and their roles; `data` is null when signed out. */
export function useSession() {
  return useQuery({
    queryKey: keys.me,
    queryFn: async (): Promise<MeResponse | null> => {
      try {
        return await api.get<MeResponse>('/me');
      } catch (error) {
        if (isUnauthorised(error)) return null;
        throw error;
      }
    },
    staleTime: 5 * 60_000,
  });
}

/**
 * Drop another user's data without removing the session query itself: the root layout observes
 * it, and an observer of a removed query would never hear of the new user.
 */
function forgetEverythingBut(queryClient: QueryClient, keep: readonly unknown[]) {
  queryClient.removeQueries({ predicate: (q) => q.queryKey[0] !== keep[0] });
  queryClient.getMutationCache().clear();
}

export function useSignIn() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: SignInBody) => api.post<MeResponse>('/auth/sign-in', body),
    onSuccess: (me) => {
      forgetEverythingBut(queryClient, keys.me);
      queryClient.setQueryData(keys.me, me);
    },
  });
}

export function useSignOut() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => api.post('/auth/sign-out'),
    onSettled: () => {
      queryClient.setQueryData(keys.me, null);
      forgetEverythingBut(queryClient, keys.me);
    },
  });
}

/** Schedule editing is for electricians and admins (the server checks the same). */
export function canEditSchedules(role: string | undefined): boolean {
  return role === 'admin' || role === 'electrician';
}

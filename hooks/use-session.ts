import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { createContext, useContext } from 'react';
import { api, isUnauthorised } from '@/lib/api';
import { meResponse, sessionResponse, type MeResponse, type SignInBody } from '@/shared/schemas';
import { keys } from './keys';

/** Which user's cache is mounted, and how to change it (app/_layout.tsx provides it). */
export interface Account {
  userId: string | null;
  /** mount this user's cache (after a sign-in) */
  switchTo(userId: string): void;
  /** forget this user's cache on the device and show the sign-in screen */
  forget(): Promise<void>;
}
export const AccountContext = createContext<Account>({
  userId: null,
  switchTo: () => undefined,
  forget: async () => undefined,
});

/**
 * The signed-in user and their roles; `data` is null when signed out. Kept in the persisted
 * cache, so the app opens offline as the last user.
 */
export function useSession() {
  return useQuery({
    queryKey: keys.me,
    queryFn: async (): Promise<MeResponse | null> => {
      try {
        // signed out is `{ user: null }`, not a 401: a cold load logs no failed request
        const session = await api.get('/me', sessionResponse);
        return 'memberships' in session ? session : null;
      } catch (error) {
        // a server of the previous release still answers 401
        if (isUnauthorised(error)) return null;
        throw error;
      }
    },
    staleTime: 5 * 60_000,
    networkMode: 'offlineFirst',
    retry: false,
  });
}

export function useSignIn() {
  const queryClient = useQueryClient();
  const account = useContext(AccountContext);
  return useMutation({
    mutationFn: (body: SignInBody) => api.post('/auth/sign-in', body, meResponse),
    onSuccess: (me) => {
      // the same user signing in again (an expired session) keeps their queue and copy
      if (account.userId === me.user.id) queryClient.setQueryData(keys.me, me);
      else account.switchTo(me.user.id);
    },
  });
}

export function useSignOut() {
  const account = useContext(AccountContext);
  return useMutation({
    mutationFn: async () => {
      // signing out offline still clears the device; the server session then simply expires
      await api.post('/auth/sign-out').catch(() => undefined);
      await account.forget();
    },
  });
}

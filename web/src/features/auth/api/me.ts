import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { Me } from '@midgray/shared';
import { api } from '../../../lib/api-client.ts';

/** The signed-in user with their channels. */
export type SignedIn = Me & { user: NonNullable<Me['user']> };

/** Fetches the signed-in user and their channels; null when nobody is signed in. */
export async function getMe(): Promise<SignedIn | null> {
  const me = await api<Me>('GET', '/api/auth/me');
  return me.user ? (me as SignedIn) : null;
}

export const meQueryOptions = () => queryOptions({ queryKey: ['auth', 'me'], queryFn: getMe, staleTime: 60_000 });

/** The signed-in user (null when signed out). */
export const useMe = () => useQuery(meQueryOptions());

/** Signs out, then forgets every cached query. */
export function useSignOut() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: () => api<void>('POST', '/api/auth/logout'),
    onSettled: () => {
      qc.clear();
      window.location.assign('/sign-in');
    },
  });
}

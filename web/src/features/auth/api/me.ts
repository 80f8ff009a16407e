import { queryOptions, useMutation, useQuery } from '@tanstack/react-query';
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

/**
 * Signs out, then loads the sign-in page afresh: the full page load forgets every cached query. (Clearing
 * the cache first made the shell redirect on its own as well, and the second navigation cut off the next one.)
 */
export function useSignOut() {
  return useMutation({
    mutationFn: () => api<void>('POST', '/api/auth/logout'),
    onSettled: () => window.location.assign('/sign-in'),
  });
}

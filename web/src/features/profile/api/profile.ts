// The signed-in user's profile: e-mail kinds on/off, and the private calendar feed (made, reset, off).
import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { CalendarFeedCreated, MailKind, Profile } from '@midgray/shared';
import { api } from '../../../lib/api-client.ts';

export const profileQueryOptions = () => queryOptions({ queryKey: ['profile'], queryFn: () => api<Profile>('GET', '/api/me/profile') });

/** The user's e-mail settings and feed state. */
export const useProfile = () => useQuery(profileQueryOptions());

export function useSetEmailOptOuts() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (optOuts: MailKind[]) => api<Profile>('PUT', '/api/me/email-preferences', { optOuts }),
    onSuccess: (p) => qc.setQueryData(profileQueryOptions().queryKey, p),
  });
}

/** Makes or resets the feed; the answer holds the URL, shown once (only a hash is kept). */
export function useResetCalendarFeed() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: () => api<CalendarFeedCreated>('POST', '/api/me/calendar-feed'),
    onSuccess: () => void qc.invalidateQueries({ queryKey: profileQueryOptions().queryKey }),
  });
}

export function useDisableCalendarFeed() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: () => api<void>('DELETE', '/api/me/calendar-feed'),
    onSuccess: () => void qc.invalidateQueries({ queryKey: profileQueryOptions().queryKey }),
  });
}

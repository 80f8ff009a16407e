import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { CreateInvitationInput, Invitation, Member, Role } from '@midgray/shared';
import { api } from '../../../lib/api-client.ts';

export const membersQueryOptions = (channelId: string) =>
  queryOptions({ queryKey: ['channels', channelId, 'members'], queryFn: () => api<Member[]>('GET', `/api/channels/${channelId}/members`) });

export const invitationsQueryOptions = (channelId: string) =>
  queryOptions({ queryKey: ['channels', channelId, 'invitations'], queryFn: () => api<Invitation[]>('GET', `/api/channels/${channelId}/invitations`) });

/** The channel's members. */
export const useMembers = (channelId: string) => useQuery(membersQueryOptions(channelId));
/** Open invitations (admins only). */
export const useInvitations = (channelId: string, enabled: boolean) => useQuery({ ...invitationsQueryOptions(channelId), enabled });

export function useInvite(channelId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: CreateInvitationInput) => api<{ invitation: Invitation; mailSent: boolean }>('POST', `/api/channels/${channelId}/invitations`, input),
    onSuccess: () => qc.invalidateQueries({ queryKey: invitationsQueryOptions(channelId).queryKey }),
  });
}

export function useRevokeInvitation(channelId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (id: string) => api<void>('DELETE', `/api/channels/${channelId}/invitations/${id}`),
    onSuccess: () => qc.invalidateQueries({ queryKey: invitationsQueryOptions(channelId).queryKey }),
  });
}

export function useChangeRole(channelId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ memberId, role }: { memberId: string; role: Role }) => api<Member>('PATCH', `/api/channels/${channelId}/members/${memberId}`, { role }),
    onSettled: () => qc.invalidateQueries({ queryKey: membersQueryOptions(channelId).queryKey }),
  });
}

export function useRemoveMember(channelId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (memberId: string) => api<void>('DELETE', `/api/channels/${channelId}/members/${memberId}`),
    onSettled: () => qc.invalidateQueries({ queryKey: membersQueryOptions(channelId).queryKey }),
  });
}

// The episode's footage: the list (with test steps and the size limit), pickup, release,
// reassign, and the browser's checksum of an upload.
import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { Footage, FootageList, Member } from '@midgray/shared';
import { api } from '../../../lib/api-client.ts';

export const footageListQueryOptions = (episodeId: string) =>
  queryOptions({
    queryKey: ['footage', 'list', episodeId],
    queryFn: () => api<FootageList>('GET', `/api/episodes/${episodeId}/footage`),
    // While files upload or wait for their checks, keep the table fresh.
    refetchInterval: (q) => (q.state.data?.footage.some((f) => f.status === 'receiving' || (f.status === 'received' && (!f.serverSha256 || (!f.probe && !f.probeError)))) ? 3000 : false),
  });

/** The episode's footage (newest first), its test steps and the server's size limit. */
export const useFootageList = (episodeId: string) => useQuery(footageListQueryOptions(episodeId));

/** Replaces one row in the cached list after a change the server answered with. */
function useReplaceRow(episodeId: string) {
  const qc = useQueryClient();
  return (row: Footage) =>
    qc.setQueryData(footageListQueryOptions(episodeId).queryKey, (old) => (old ? { ...old, footage: old.footage.map((f) => (f.id === row.id ? row : f)) } : old));
}

/** Picks up (claims) a file; 409 when someone else holds it or the row changed. */
export function usePickUp(episodeId: string) {
  const replace = useReplaceRow(episodeId);
  return useMutation({ mutationFn: (f: Footage) => api<Footage>('POST', `/api/footage/${f.id}/pickup`, { version: f.version }), onSuccess: replace });
}

/** Releases a held file. */
export function useRelease(episodeId: string) {
  const replace = useReplaceRow(episodeId);
  return useMutation({ mutationFn: (f: Footage) => api<Footage>('POST', `/api/footage/${f.id}/release`, { version: f.version }), onSuccess: replace });
}

/** Hands a file to another member (producers and admins). */
export function useReassign(episodeId: string) {
  const replace = useReplaceRow(episodeId);
  return useMutation({
    mutationFn: ({ footage, userId }: { footage: Footage; userId: string }) => api<Footage>('POST', `/api/footage/${footage.id}/reassign`, { version: footage.version, userId }),
    onSuccess: replace,
  });
}

/** Sends the SHA-256 the browser computed for an upload (by upload id). */
export function sendClientChecksum(uploadId: string, sha256: string) {
  return api<Footage>('PUT', `/api/upload-checksums/${uploadId}`, { sha256 });
}

/** Members who may hold footage (editors, producers, admins), for the reassign picker. */
export const footageHoldersQueryOptions = (channelId: string) =>
  queryOptions({
    queryKey: ['footage', 'holders', channelId],
    queryFn: async () => (await api<Member[]>('GET', `/api/channels/${channelId}/members`)).filter((m) => m.role !== 'host'),
    staleTime: 60_000,
  });
export const useFootageHolders = (channelId: string, enabled: boolean) => useQuery({ ...footageHoldersQueryOptions(channelId), enabled });

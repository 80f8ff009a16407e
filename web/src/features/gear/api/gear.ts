// The channel's gear list: read by everyone, created and edited by producers and admins.
import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { CreateGearInput, Gear, UpdateGearInput } from '@midgray/shared';
import { api } from '../../../lib/api-client.ts';

export const gearQueryOptions = (channelId: string, archived: boolean) =>
  queryOptions({ queryKey: ['gear', channelId, { archived }], queryFn: () => api<Gear[]>('GET', `/api/channels/${channelId}/gear${archived ? '?archived=true' : ''}`) });

export const useGear = (channelId: string, archived: boolean) => useQuery(gearQueryOptions(channelId, archived));

/** After a gear change: every gear list of the channel, the board (names, dates) and episode pages. */
function useRefresh(channelId: string) {
  const qc = useQueryClient();
  return () => {
    void qc.invalidateQueries({ queryKey: ['gear', channelId] });
    void qc.invalidateQueries({ queryKey: ['board', channelId] });
    void qc.invalidateQueries({ queryKey: ['episodes', 'detail'] });
  };
}

export function useCreateGear(channelId: string) {
  const refresh = useRefresh(channelId);
  return useMutation({ mutationFn: (input: CreateGearInput) => api<Gear>('POST', `/api/channels/${channelId}/gear`, input), onSuccess: refresh });
}

export function useUpdateGear(channelId: string) {
  const refresh = useRefresh(channelId);
  return useMutation({
    mutationFn: ({ gearId, input }: { gearId: string; input: UpdateGearInput }) => api<Gear>('PATCH', `/api/gear/${gearId}`, input),
    onSettled: refresh,
  });
}

export function useDeleteGear(channelId: string) {
  const refresh = useRefresh(channelId);
  return useMutation({ mutationFn: (gearId: string) => api<void>('DELETE', `/api/gear/${gearId}`), onSettled: refresh });
}

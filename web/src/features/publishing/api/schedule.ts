// Publish slots of an episode: the schedule (current slot, history, embargoes), proposing a slot,
// approving or rejecting it, and marking the episode live. Decisions also refresh the approval
// queue, the calendar and the board, whose cards change stage.
import { queryOptions, useMutation, useQuery, useQueryClient, type QueryClient } from '@tanstack/react-query';
import type { ApproveSlotInput, EpisodeSchedule, MarkLiveInput, ProposeSlotInput, RejectSlotInput } from '@midgray/shared';
import { api } from '../../../lib/api-client.ts';

export const scheduleQueryOptions = (episodeId: string) =>
  queryOptions({ queryKey: ['publishing', 'schedule', episodeId], queryFn: () => api<EpisodeSchedule>('GET', `/api/episodes/${episodeId}/schedule`) });

/** The Schedule tab's data. */
export const useSchedule = (episodeId: string) => useQuery(scheduleQueryOptions(episodeId));

/** After a slot changes: this episode's schedule, the queue, the calendar, the board and the episode page. */
function refreshAfterSlotChange(qc: QueryClient, schedule: EpisodeSchedule) {
  qc.setQueryData(scheduleQueryOptions(schedule.episode.id).queryKey, schedule);
  for (const key of [['publishing', 'approvals'], ['calendar'], ['board'], ['episodes']]) void qc.invalidateQueries({ queryKey: key });
}

export function useProposeSlot(episodeId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: ProposeSlotInput) => api<EpisodeSchedule>('POST', `/api/episodes/${episodeId}/slots`, input),
    onSuccess: (s) => refreshAfterSlotChange(qc, s),
  });
}

export function useApproveSlot() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ slotId, ...input }: ApproveSlotInput & { slotId: string }) => api<EpisodeSchedule>('POST', `/api/slots/${slotId}/approve`, input),
    onSuccess: (s) => refreshAfterSlotChange(qc, s),
    // A refusal may mean the queue is out of date (someone else decided): refetch it.
    onError: () => void qc.invalidateQueries({ queryKey: ['publishing', 'approvals'] }),
  });
}

export function useRejectSlot() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ slotId, ...input }: RejectSlotInput & { slotId: string }) => api<EpisodeSchedule>('POST', `/api/slots/${slotId}/reject`, input),
    onSuccess: (s) => refreshAfterSlotChange(qc, s),
    onError: () => void qc.invalidateQueries({ queryKey: ['publishing', 'approvals'] }),
  });
}

export function useMarkLive(episodeId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: MarkLiveInput) => api<EpisodeSchedule>('POST', `/api/episodes/${episodeId}/live`, input),
    onSuccess: (s) => refreshAfterSlotChange(qc, s),
  });
}

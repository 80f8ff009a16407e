// One episode (its page), creating and editing episodes, archiving and restoring them.
import { queryOptions, useMutation, useQuery, useQueryClient, type QueryClient } from '@tanstack/react-query';
import type { ArchivedEpisode, CreateEpisodeInput, EpisodeDetail, UpdateEpisodeInput } from '@midgray/shared';
import { api } from '../../../lib/api-client.ts';

export const episodeQueryOptions = (episodeId: string) =>
  queryOptions({ queryKey: ['episodes', 'detail', episodeId], queryFn: () => api<EpisodeDetail>('GET', `/api/episodes/${episodeId}`) });

export const archivedQueryOptions = (channelId: string) =>
  queryOptions({ queryKey: ['episodes', 'archived', channelId], queryFn: () => api<ArchivedEpisode[]>('GET', `/api/channels/${channelId}/episodes/archived`) });

/** The episode page's data: header, gear, people, counts, slots and activity. */
export const useEpisode = (episodeId: string) => useQuery(episodeQueryOptions(episodeId));
/** The archive page's list. */
export const useArchivedEpisodes = (channelId: string) => useQuery(archivedQueryOptions(channelId));

function refresh(qc: QueryClient, episode: EpisodeDetail) {
  qc.setQueryData(episodeQueryOptions(episode.id).queryKey, episode);
  void qc.invalidateQueries({ queryKey: ['board', episode.channelId] });
  void qc.invalidateQueries({ queryKey: ['episodes', 'archived', episode.channelId] });
}

export function useCreateEpisode(channelId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: CreateEpisodeInput) => api<EpisodeDetail>('POST', `/api/channels/${channelId}/episodes`, input),
    onSuccess: (ep) => refresh(qc, ep),
  });
}

export function useUpdateEpisode(episodeId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: UpdateEpisodeInput) => api<EpisodeDetail>('PATCH', `/api/episodes/${episodeId}`, input),
    onSuccess: (ep) => refresh(qc, ep),
    // A stale version means someone else saved first: read the episode again.
    onError: () => void qc.invalidateQueries({ queryKey: episodeQueryOptions(episodeId).queryKey }),
  });
}

/** Archives (`archive: true`) or restores an episode. */
export function useArchiveEpisode() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ episodeId, version, archive }: { episodeId: string; version: number; archive: boolean }) =>
      api<EpisodeDetail>('POST', `/api/episodes/${episodeId}/${archive ? 'archive' : 'unarchive'}`, { version }),
    onSuccess: (ep) => refresh(qc, ep),
  });
}

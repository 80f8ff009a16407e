// The episode description: load (with the composer's context, so the preview composes locally),
// save with its version, list versions, restore one, and parse pasted chapter lines.
import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { DescriptionVersion, EpisodeDescription, ParsedChapters, SaveDescriptionInput } from '@midgray/shared';
import { api } from '../../../lib/api-client.ts';

export const descriptionQueryOptions = (episodeId: string) =>
  queryOptions({ queryKey: ['publishing', 'description', episodeId], queryFn: () => api<EpisodeDescription>('GET', `/api/episodes/${episodeId}/description`) });

export const descriptionVersionsQueryOptions = (episodeId: string) =>
  queryOptions({ queryKey: ['publishing', 'description', episodeId, 'versions'], queryFn: () => api<DescriptionVersion[]>('GET', `/api/episodes/${episodeId}/description/versions`) });

/** The episode's description: parts, context, composed text, warnings, version. */
export const useDescription = (episodeId: string) => useQuery(descriptionQueryOptions(episodeId));
/** Saved versions, newest first. */
export const useDescriptionVersions = (episodeId: string) => useQuery(descriptionVersionsQueryOptions(episodeId));

/** Saves the parts; the answer (new version) replaces the cached description. A 409 leaves the cache as it was. */
export function useSaveDescription(episodeId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: SaveDescriptionInput) => api<EpisodeDescription>('PUT', `/api/episodes/${episodeId}/description`, input),
    onSuccess: (saved) => {
      qc.setQueryData(descriptionQueryOptions(episodeId).queryKey, saved);
      void qc.invalidateQueries({ queryKey: descriptionVersionsQueryOptions(episodeId).queryKey });
    },
  });
}

/** Restores an old version as a new one. */
export function useRestoreDescription(episodeId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ versionId, version }: { versionId: string; version: number }) =>
      api<EpisodeDescription>('POST', `/api/episodes/${episodeId}/description/versions/${versionId}/restore`, { version }),
    onSuccess: (saved) => {
      qc.setQueryData(descriptionQueryOptions(episodeId).queryKey, saved);
      void qc.invalidateQueries({ queryKey: descriptionVersionsQueryOptions(episodeId).queryKey });
    },
  });
}

/** Turns pasted lines ("0:00 Intro") into chapters on the server, with an error per line that is not one. */
export function useParseChapters(episodeId: string) {
  return useMutation({ mutationFn: (text: string) => api<ParsedChapters>('POST', `/api/episodes/${episodeId}/description/chapters/parse`, { text }) });
}

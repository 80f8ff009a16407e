// Readouts of an episode's tests, running them, the measuring region, and the compare page's
// data. Runs answer 202 with queued rows; the tab polls while any readout is queued or measuring.
import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { ComparableTestDto, CompareDto, EpisodeReadoutsDto, ReadoutRegion, RunReadoutsInput, RunReadoutsResultDto } from '@midgray/shared';
import { api } from '../../../lib/api-client.ts';

/** How often the tab asks again while readouts are queued or measuring, in ms. */
export const READOUT_POLL_MS = 1500;

export const episodeReadoutsQueryOptions = (episodeId: string) =>
  queryOptions({ queryKey: ['readouts', 'episode', episodeId], queryFn: () => api<EpisodeReadoutsDto>('GET', `/api/episodes/${episodeId}/readouts`) });

const busy = (data: EpisodeReadoutsDto | undefined) => !!data?.tests.some((t) => t.steps.some((s) => s.pending));

/** The episode's tests with readouts per step and verdicts; polls while a readout is pending. */
export const useEpisodeReadouts = (episodeId: string) =>
  useQuery({ ...episodeReadoutsQueryOptions(episodeId), refetchInterval: (q) => (busy(q.state.data) ? READOUT_POLL_MS : false) });

/** Runs readouts for a whole test (or some of its steps). */
export function useRunTestReadouts(episodeId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ testId, ...input }: RunReadoutsInput & { testId: string }) => api<RunReadoutsResultDto>('POST', `/api/tests/${testId}/readouts`, input),
    onSettled: () => qc.invalidateQueries({ queryKey: episodeReadoutsQueryOptions(episodeId).queryKey }),
  });
}

/** Runs a readout of one step again (a new row; the old one stays in the history). */
export function useRunStepReadout(episodeId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ stepId, ...input }: RunReadoutsInput & { stepId: string }) => api<RunReadoutsResultDto>('POST', `/api/steps/${stepId}/readouts`, input),
    onSettled: () => qc.invalidateQueries({ queryKey: episodeReadoutsQueryOptions(episodeId).queryKey }),
  });
}

/** Saves the region every step of a test is measured on (null: the centre tenth). */
export function useSaveReadoutRegion(episodeId: string) {
  const qc = useQueryClient();
  const key = episodeReadoutsQueryOptions(episodeId).queryKey;
  return useMutation({
    mutationFn: ({ testId, region }: { testId: string; region: ReadoutRegion | null }) => api<{ readoutRegion: ReadoutRegion | null }>('PUT', `/api/tests/${testId}/readout-region`, { region }),
    onSuccess: (saved, { testId }) =>
      qc.setQueryData<EpisodeReadoutsDto>(key, (d) => d && { ...d, tests: d.tests.map((t) => (t.test.id === testId ? { ...t, test: { ...t.test, readoutRegion: saved.readoutRegion } } : t)) }),
  });
}

/** Path of the CSV export of a test's readout table. */
export const readoutsCsvPath = (testId: string) => `/api/tests/${testId}/readouts.csv`;
/** Paths of a readout's images. */
export const readoutImagePath = (readoutId: string, which: 'frame' | 'reference' | 'difference-map') =>
  which === 'difference-map' ? `/api/readouts/${readoutId}/difference-map.png` : which === 'reference' ? `/api/readouts/${readoutId}/reference-frame.jpg` : `/api/readouts/${readoutId}/frame.jpg`;
/** Path of the frame a readout of the step would measure (for drawing the region). */
export const stepFramePath = (stepId: string) => `/api/steps/${stepId}/frame.jpg`;

export const comparableTestsQueryOptions = (channelId: string) =>
  queryOptions({ queryKey: ['readouts', 'comparable', channelId], queryFn: () => api<ComparableTestDto[]>('GET', `/api/channels/${channelId}/readouts/tests`) });

/** Tests of the channel that can be compared, with how many steps are measured. */
export const useComparableTests = (channelId: string) => useQuery(comparableTestsQueryOptions(channelId));

export const compareQueryOptions = (channelId: string, testIds: string[]) =>
  queryOptions({
    queryKey: ['readouts', 'compare', channelId, testIds],
    queryFn: () => api<CompareDto>('GET', `/api/channels/${channelId}/readouts/compare?tests=${testIds.map(encodeURIComponent).join(',')}`),
  });

/** Curves and verdicts of two or more tests (disabled until two are picked). */
export const useCompare = (channelId: string, testIds: string[]) => useQuery({ ...compareQueryOptions(channelId, testIds), enabled: testIds.length >= 2 });

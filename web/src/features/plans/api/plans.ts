// The episode's plan (tests, steps, spec sheets, lighting) and every write to it. Writes answer
// with the saved record, which goes straight into the cache so the next edit sends the new version.
import { queryOptions, useMutation, useQuery, useQueryClient, type QueryClient } from '@tanstack/react-query';
import type {
  CreateSpecLineInput,
  CreateTestInput,
  EpisodePlanDto,
  LightingInput,
  MarkStepShotInput,
  SpecSheetLineDto,
  TestDto,
  TestStepDto,
  UpdateSpecLineInput,
  UpdateStepInput,
  UpdateTestInput,
} from '@midgray/shared';
import { api } from '../../../lib/api-client.ts';

export const episodePlanQueryOptions = (episodeId: string) =>
  queryOptions({ queryKey: ['plans', 'episode', episodeId], queryFn: () => api<EpisodePlanDto>('GET', `/api/episodes/${episodeId}/tests`) });

/** The episode's plan: its tests with steps, spec sheets and lighting, and whether the caller may edit. */
export const useEpisodePlan = (episodeId: string) => useQuery(episodePlanQueryOptions(episodeId));

/** Path of the shot list CSV of an episode. */
export const shotListCsvPath = (episodeId: string) => `/api/episodes/${episodeId}/shot-list.csv`;

type Plan = EpisodePlanDto;
const key = (episodeId: string) => episodePlanQueryOptions(episodeId).queryKey;

function patchTest(qc: QueryClient, episodeId: string, testId: string, change: (t: TestDto) => TestDto) {
  qc.setQueryData<Plan>(key(episodeId), (plan) => plan && { ...plan, tests: plan.tests.map((t) => (t.id === testId ? change(t) : t)) });
}
function putTest(qc: QueryClient, episodeId: string, test: TestDto) {
  qc.setQueryData<Plan>(key(episodeId), (plan) => {
    if (!plan) return plan;
    const exists = plan.tests.some((t) => t.id === test.id);
    return { ...plan, tests: exists ? plan.tests.map((t) => (t.id === test.id ? test : t)) : [...plan.tests, test] };
  });
}
const putLine = (qc: QueryClient, episodeId: string, testId: string, line: SpecSheetLineDto) =>
  patchTest(qc, episodeId, testId, (t) => ({ ...t, specLines: t.specLines.some((l) => l.id === line.id) ? t.specLines.map((l) => (l.id === line.id ? line : l)) : [...t.specLines, line] }));
const putStep = (qc: QueryClient, episodeId: string, testId: string, step: TestStepDto) =>
  patchTest(qc, episodeId, testId, (t) => ({ ...t, steps: t.steps.map((s) => (s.id === step.id ? step : s)) }));

export function useCreateTest(episodeId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: CreateTestInput) => api<TestDto>('POST', `/api/episodes/${episodeId}/tests`, input),
    onSuccess: (test) => putTest(qc, episodeId, test),
  });
}

export function useUpdateTest(episodeId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ id, ...input }: UpdateTestInput & { id: string }) => api<TestDto>('PATCH', `/api/tests/${id}`, input),
    onSuccess: (test) => putTest(qc, episodeId, test),
    onError: () => qc.invalidateQueries({ queryKey: key(episodeId) }),
  });
}

export function useDeleteTest(episodeId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ id, version }: { id: string; version: number }) => api<void>('DELETE', `/api/tests/${id}?version=${version}`),
    onSuccess: (_v, { id }) => qc.setQueryData<Plan>(key(episodeId), (plan) => plan && { ...plan, tests: plan.tests.filter((t) => t.id !== id) }),
    onError: () => qc.invalidateQueries({ queryKey: key(episodeId) }),
  });
}

export function useSetLighting(episodeId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ testId, ...input }: LightingInput & { testId: string }) => api<TestDto>('PUT', `/api/tests/${testId}/lighting`, input),
    onSuccess: (test) => putTest(qc, episodeId, test),
    onError: () => qc.invalidateQueries({ queryKey: key(episodeId) }),
  });
}

export function useAddSpecLine(episodeId: string, testId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: CreateSpecLineInput) => api<SpecSheetLineDto>('POST', `/api/tests/${testId}/spec-lines`, input),
    onSuccess: (line) => putLine(qc, episodeId, testId, line),
  });
}

/** Changes a spec-sheet line, optimistically: the tick or text shows at once and rolls back on failure. */
export function useUpdateSpecLine(episodeId: string, testId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ id, ...input }: UpdateSpecLineInput & { id: string }) => api<SpecSheetLineDto>('PATCH', `/api/spec-lines/${id}`, input),
    onMutate: async ({ id, version: _v, ...change }) => {
      // 1. stop refetches that could overwrite the optimistic value; 2. keep a snapshot; 3. apply.
      await qc.cancelQueries({ queryKey: key(episodeId) });
      const snapshot = qc.getQueryData<Plan>(key(episodeId));
      patchTest(qc, episodeId, testId, (t) => ({ ...t, specLines: t.specLines.map((l) => (l.id === id ? { ...l, ...change } : l)) }));
      return { snapshot };
    },
    // 4. on failure put the snapshot back, then refetch the truth.
    onError: (_e, _v, context) => {
      if (context?.snapshot) qc.setQueryData(key(episodeId), context.snapshot);
      void qc.invalidateQueries({ queryKey: key(episodeId) });
    },
    onSuccess: (line) => putLine(qc, episodeId, testId, line),
  });
}

export function useRemoveSpecLine(episodeId: string, testId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ id, version }: { id: string; version: number }) => api<void>('DELETE', `/api/spec-lines/${id}?version=${version}`),
    onSuccess: (_v, { id }) => patchTest(qc, episodeId, testId, (t) => ({ ...t, specLines: t.specLines.filter((l) => l.id !== id) })),
    onError: () => qc.invalidateQueries({ queryKey: key(episodeId) }),
  });
}

export function useMarkShot(episodeId: string, testId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ id, ...input }: MarkStepShotInput & { id: string }) => api<TestStepDto>('POST', `/api/steps/${id}/shot`, input),
    onSuccess: (step) => putStep(qc, episodeId, testId, step),
    onError: () => qc.invalidateQueries({ queryKey: key(episodeId) }),
  });
}

export function useUnmarkShot(episodeId: string, testId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ id, version }: { id: string; version: number }) => api<TestStepDto>('DELETE', `/api/steps/${id}/shot?version=${version}`),
    onSuccess: (step) => putStep(qc, episodeId, testId, step),
    onError: () => qc.invalidateQueries({ queryKey: key(episodeId) }),
  });
}

export function useUpdateStep(episodeId: string, testId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ id, ...input }: UpdateStepInput & { id: string }) => api<TestStepDto>('PATCH', `/api/steps/${id}`, input),
    onSuccess: (step) => putStep(qc, episodeId, testId, step),
    onError: () => qc.invalidateQueries({ queryKey: key(episodeId) }),
  });
}

import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { Schedule } from '../../shared/journey/schedule-schema';
import type { JourneySummary, SaveJourneyInput } from '../../shared/schemas/journeys';
import { api } from '../api-client';
import type { HarImportAnswer, JourneyDetail, SavedJourney, TimingPoint, TryAnswer } from './journey-views';
import type { JourneyDocumentInput } from '../../shared/journey/journey-schema';
import { secretKeys } from './secrets';
import { REFETCH_INTERVALS, STALE_TIMES } from './stale-times';

export const journeyKeys = {
  all: ['journeys'] as const,
  list: () => [...journeyKeys.all, 'list'] as const,
  details: (id: number) => [...journeyKeys.all, 'detail', id] as const,
  detail: (id: number, version?: number) => [...journeyKeys.details(id), version ?? 'current'] as const,
  timings: (id: number, hours: number) => [...journeyKeys.all, 'timings', id, hours] as const,
  schedulePreview: (schedule: Schedule | null, journeyId: number | undefined) =>
    [...journeyKeys.all, 'schedule-preview', schedule, journeyId ?? 'draft'] as const,
  /** The draft of the last HAR import, handed from the import screen to the editor. */
  imported: () => [...journeyKeys.all, 'imported-draft'] as const,
};

export function useJourneysQuery() {
  return useQuery({
    queryKey: journeyKeys.list(),
    queryFn: async () => (await api.get<{ items: JourneySummary[] }>('/api/journeys')).items,
    staleTime: STALE_TIMES.journeys,
    refetchInterval: REFETCH_INTERVALS.journeys,
  });
}

export function useJourneyQuery(id: number, version?: number) {
  return useQuery({
    queryKey: journeyKeys.detail(id, version),
    queryFn: () => api.get<JourneyDetail>(`/api/journeys/${id}${version ? `?version=${version}` : ''}`),
    staleTime: STALE_TIMES.journey,
    refetchInterval: REFETCH_INTERVALS.journey,
    enabled: Number.isInteger(id) && id > 0,
  });
}

export function useJourneyTimingsQuery(id: number, hours = 24) {
  return useQuery({
    queryKey: journeyKeys.timings(id, hours),
    queryFn: async () => (await api.get<{ items: TimingPoint[] }>(`/api/journeys/${id}/timings?hours=${hours}`)).items,
    staleTime: STALE_TIMES.timings,
    refetchInterval: REFETCH_INTERVALS.journey,
  });
}

/** The next five slots of a schedule (null while the schedule is not valid yet). */
export function useSchedulePreviewQuery(schedule: Schedule | null, journeyId?: number) {
  return useQuery({
    queryKey: journeyKeys.schedulePreview(schedule, journeyId),
    queryFn: async () =>
      (await api.post<{ times: string[] }>('/api/journeys/schedule-preview', { schedule, count: 5, ...(journeyId ? { journeyId } : {}) })).times,
    staleTime: STALE_TIMES.schedulePreview,
    enabled: schedule !== null,
    retry: false,
  });
}

export function useSaveJourneyMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ id, input }: { id?: number; input: SaveJourneyInput }) =>
      id ? api.put<SavedJourney>(`/api/journeys/${id}`, input) : api.post<SavedJourney>('/api/journeys', input),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: journeyKeys.all }),
  });
}

export function useDeleteJourneyMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (id: number) => api.delete(`/api/journeys/${id}`),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: journeyKeys.all }),
  });
}

/** "Try it now": runs the draft once on a vantage; nothing is stored as a scheduled run. */
export function useTryJourneyMutation() {
  return useMutation({
    mutationFn: (input: { document: JourneyDocumentInput; vantage: string }) => api.post<TryAnswer>('/api/journeys/try', input),
  });
}

export function useImportHarMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (form: FormData) => api.upload<HarImportAnswer>('/api/journeys/import-har', form),
    onSuccess: (answer) => {
      // Kept until replaced (not garbage-collected after a few minutes unobserved): reading the
      // preview can take a while before the draft is opened in the editor.
      queryClient.setQueryDefaults(journeyKeys.imported(), { gcTime: Infinity, staleTime: STALE_TIMES.importedDraft });
      queryClient.setQueryData(journeyKeys.imported(), answer);
      // The recording's credentials were stored as secrets.
      return queryClient.invalidateQueries({ queryKey: secretKeys.all });
    },
  });
}

/** The last imported draft, read once by the editor. */
export function useImportedDraft(): HarImportAnswer | undefined {
  return useQueryClient().getQueryData<HarImportAnswer>(journeyKeys.imported());
}

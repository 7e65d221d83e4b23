import { useInfiniteQuery, useQuery } from '@tanstack/react-query';
import { api } from '../api-client';
import type { RunDetail, RunsFilter, RunsPage } from './journey-views';
import { STALE_TIMES } from './stale-times';

const PAGE_SIZE = 25;

export const runKeys = {
  all: ['runs'] as const,
  lists: (journeyId: number) => [...runKeys.all, 'list', journeyId] as const,
  list: (journeyId: number, filter: RunsFilter) => [...runKeys.lists(journeyId), filter] as const,
  detail: (id: number) => [...runKeys.all, 'detail', id] as const,
};

function runsPath(journeyId: number, filter: RunsFilter, cursor: string | null): string {
  const query = new URLSearchParams({ limit: String(PAGE_SIZE) });
  if (filter.verdict) query.set('verdict', filter.verdict);
  if (filter.vantage) query.set('vantage', filter.vantage);
  if (cursor) query.set('cursor', cursor);
  return `/api/journeys/${journeyId}/runs?${query.toString()}`;
}

/** Run history, newest first, a page at a time ("load more"). */
export function useJourneyRunsQuery(journeyId: number, filter: RunsFilter) {
  return useInfiniteQuery({
    queryKey: runKeys.list(journeyId, filter),
    queryFn: ({ pageParam }) => api.get<RunsPage>(runsPath(journeyId, filter, pageParam)),
    initialPageParam: null as string | null,
    getNextPageParam: (last) => last.nextCursor,
    staleTime: STALE_TIMES.runs,
  });
}

export function useRunQuery(id: number) {
  return useQuery({
    queryKey: runKeys.detail(id),
    queryFn: () => api.get<RunDetail>(`/api/runs/${id}`),
    staleTime: STALE_TIMES.run,
    enabled: Number.isInteger(id) && id > 0,
  });
}

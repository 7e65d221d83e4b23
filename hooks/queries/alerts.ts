import { useQuery } from '@tanstack/react-query';
import type { AlertDetail, AlertsList } from '../../shared/rules/api-schemas';
import { api } from '../api-client';
import { REFETCH_INTERVALS, STALE_TIMES } from './stale-times';

export const alertKeys = {
  all: ['alerts'] as const,
  lists: () => [...alertKeys.all, 'list'] as const,
  list: () => [...alertKeys.lists()] as const,
  details: () => [...alertKeys.all, 'detail'] as const,
  detail: (id: number) => [...alertKeys.details(), id] as const,
};

// stale-times.ts has no alerts entry yet (its owner adds one); alerts move with the evaluator's
// 15 s cycle, like live signal queries, so they share that freshness and refresh until then.
const ALERTS_STALE = STALE_TIMES.signalQuery;
const ALERTS_REFETCH = REFETCH_INTERVALS.signalQuery;

/** Open alerts (raised, no data, pending) first, then history. */
export function useAlertsQuery() {
  return useQuery({
    queryKey: alertKeys.list(),
    queryFn: () => api.get<AlertsList>('/api/alerts?limit=50'),
    staleTime: ALERTS_STALE,
    refetchInterval: ALERTS_REFETCH,
  });
}

/** One alert with its state spans and the rule's value around it. */
export function useAlertQuery(id: number | null) {
  return useQuery({
    queryKey: alertKeys.detail(id ?? 0),
    queryFn: () => api.get<AlertDetail>(`/api/alerts/${id}`),
    staleTime: ALERTS_STALE,
    refetchInterval: ALERTS_REFETCH,
    enabled: id !== null,
  });
}

import { useQuery } from '@tanstack/react-query';
import type { OutgoingMailList } from '../../shared/rules/api-schemas';
import { api } from '../api-client';
import { REFETCH_INTERVALS, STALE_TIMES } from './stale-times';

export const outgoingMailKeys = {
  all: ['outgoing-mail'] as const,
  list: (limit: number) => [...outgoingMailKeys.all, 'list', limit] as const,
};

// stale-times.ts has no entry for the mail sink yet (its owner adds one); messages arrive with the
// evaluator's cycle, so the list shares the live signal queries' freshness until then.
export function useOutgoingMailQuery(limit = 50, options: { enabled?: boolean } = {}) {
  return useQuery({
    queryKey: outgoingMailKeys.list(limit),
    queryFn: () => api.get<OutgoingMailList>(`/api/outgoing-mail?limit=${limit}`),
    staleTime: STALE_TIMES.signalQuery,
    refetchInterval: REFETCH_INTERVALS.signalQuery,
    enabled: options.enabled ?? true,
  });
}

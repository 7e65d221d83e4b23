import { useQuery } from '@tanstack/react-query';
import type { WorkerView } from '../../shared/api-types';
import { api } from '../api-client';
import { REFETCH_INTERVALS, STALE_TIMES } from './stale-times';

export const workerKeys = {
  all: ['workers'] as const,
  list: () => [...workerKeys.all, 'list'] as const,
};

export function useWorkersQuery() {
  return useQuery({
    queryKey: workerKeys.list(),
    queryFn: async () => (await api.get<{ items: WorkerView[] }>('/api/workers')).items,
    staleTime: STALE_TIMES.workers,
    refetchInterval: REFETCH_INTERVALS.workers,
  });
}

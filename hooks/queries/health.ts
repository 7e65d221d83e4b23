import { useQuery } from '@tanstack/react-query';
import type { HealthView } from '../../shared/api-types';
import { api, isApiError } from '../api-client';
import { REFETCH_INTERVALS, STALE_TIMES } from './stale-times';

export const healthKeys = {
  all: ['health'] as const,
  current: () => [...healthKeys.all, 'current'] as const,
};

// The server answers 503 when its database is down; that is a health reading, not a failed request.
async function fetchHealth(): Promise<HealthView> {
  try {
    return await api.get<HealthView>('/api/health');
  } catch (error) {
    if (isApiError(error) && error.status === 503) return { status: 'degraded', database: 'down', time: new Date().toISOString() };
    throw error;
  }
}

export function useHealthQuery() {
  return useQuery({
    queryKey: healthKeys.current(),
    queryFn: fetchHealth,
    staleTime: STALE_TIMES.health,
    refetchInterval: REFETCH_INTERVALS.health,
  });
}

import { useQuery } from '@tanstack/react-query';
import type { ServiceView } from '../../shared/schemas/signals';
import { api } from '../api-client';
import { STALE_TIMES } from './stale-times';

export const serviceKeys = {
  all: ['services'] as const,
  list: () => [...serviceKeys.all, 'list'] as const,
};

/** Services with their signal and series counts and newest sample (created on first sight by the intake). */
export function useServicesQuery() {
  return useQuery({
    queryKey: serviceKeys.list(),
    queryFn: async () => (await api.get<{ items: ServiceView[] }>('/api/services')).items,
    staleTime: STALE_TIMES.services,
    retry: false,
  });
}

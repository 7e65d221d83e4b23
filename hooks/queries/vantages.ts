import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { api } from '../api-client';
import { REFETCH_INTERVALS, STALE_TIMES } from './stale-times';

export interface VantageView {
  name: string;
  region: string;
  createdAt: string;
  lastBeatAt: string | null;
  /** Derived by the server: a vantage whose worker has been silent for 3 beats is down. */
  up: boolean;
}

export const vantageKeys = {
  all: ['vantages'] as const,
  list: () => [...vantageKeys.all, 'list'] as const,
};

export function useVantagesQuery() {
  return useQuery({
    queryKey: vantageKeys.list(),
    queryFn: async () => (await api.get<{ items: VantageView[] }>('/api/vantages')).items,
    staleTime: STALE_TIMES.vantages,
    refetchInterval: REFETCH_INTERVALS.vantages,
  });
}

export function useAddVantageMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: { name: string; region: string }) => api.post<{ name: string; region: string }>('/api/vantages', input),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: vantageKeys.all }),
  });
}

export function useDeleteVantageMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (name: string) => api.delete(`/api/vantages/${encodeURIComponent(name)}`),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: vantageKeys.all }),
  });
}

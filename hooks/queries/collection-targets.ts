import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { CollectionTargetInput, CollectionTargetView, UpdateCollectionTargetInput } from '../../shared/schemas/signals';
import { api } from '../api-client';
import { serviceKeys } from './services';
import { REFETCH_INTERVALS, STALE_TIMES } from './stale-times';

export const collectionTargetKeys = {
  all: ['collection-targets'] as const,
  list: () => [...collectionTargetKeys.all, 'list'] as const,
};

const PATH = '/api/signals/collection-targets';

/** JSON endpoints the worker collects from, with when each last ran and what went wrong. */
export function useCollectionTargetsQuery(options: { enabled?: boolean } = {}) {
  return useQuery({
    queryKey: collectionTargetKeys.list(),
    queryFn: async () => (await api.get<{ items: CollectionTargetView[] }>(PATH)).items,
    staleTime: STALE_TIMES.collectionTargets,
    refetchInterval: REFETCH_INTERVALS.collectionTargets,
    enabled: options.enabled ?? true,
  });
}

export function useCreateCollectionTargetMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: CollectionTargetInput) => api.post<CollectionTargetView>(PATH, input),
    onSuccess: () => {
      void queryClient.invalidateQueries({ queryKey: collectionTargetKeys.all });
      // A target may name a service that did not exist yet.
      void queryClient.invalidateQueries({ queryKey: serviceKeys.all });
    },
  });
}

export function useUpdateCollectionTargetMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ id, patch }: { id: number; patch: UpdateCollectionTargetInput }) => api.patch<CollectionTargetView>(`${PATH}/${id}`, patch),
    onSuccess: () => {
      void queryClient.invalidateQueries({ queryKey: collectionTargetKeys.all });
      void queryClient.invalidateQueries({ queryKey: serviceKeys.all });
    },
  });
}

export function useDeleteCollectionTargetMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (id: number) => api.delete(`${PATH}/${id}`),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: collectionTargetKeys.all }),
  });
}

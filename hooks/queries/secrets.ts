import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { api } from '../api-client';
import { STALE_TIMES } from './stale-times';

/** A stored secret as the API lists it: its name and dates, never its value. */
export interface SecretMeta {
  name: string;
  createdAt: string;
  updatedAt: string;
}

export const secretKeys = {
  all: ['secrets'] as const,
  list: () => [...secretKeys.all, 'list'] as const,
};

export function useSecretsQuery(options: { enabled?: boolean } = {}) {
  return useQuery({
    queryKey: secretKeys.list(),
    queryFn: async () => (await api.get<{ items: SecretMeta[] }>('/api/secrets')).items,
    staleTime: STALE_TIMES.secrets,
    enabled: options.enabled ?? true,
  });
}

export function useSaveSecretMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ name, value }: { name: string; value: string }) =>
      api.put<{ name: string; outcome: 'created' | 'updated' }>(`/api/secrets/${encodeURIComponent(name)}`, { value }),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: secretKeys.all }),
  });
}

export function useDeleteSecretMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (name: string) => api.delete(`/api/secrets/${encodeURIComponent(name)}`),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: secretKeys.all }),
  });
}

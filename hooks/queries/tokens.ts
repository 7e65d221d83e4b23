import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { CreateTokenInput, CreatedToken, TokenView } from '../../shared/schemas/tokens';
import { api } from '../api-client';
import { STALE_TIMES } from './stale-times';

export const tokenKeys = {
  all: ['tokens'] as const,
  list: () => [...tokenKeys.all, 'list'] as const,
};

export function useTokensQuery(options: { enabled?: boolean } = {}) {
  return useQuery({
    queryKey: tokenKeys.list(),
    queryFn: async () => (await api.get<{ items: TokenView[] }>('/api/tokens')).items,
    staleTime: STALE_TIMES.tokens,
    enabled: options.enabled ?? true,
  });
}

export function useCreateTokenMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: CreateTokenInput) => api.post<CreatedToken>('/api/tokens', input),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: tokenKeys.all }),
  });
}

export function useRevokeTokenMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (id: number) => api.delete(`/api/tokens/${id}`),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: tokenKeys.all }),
  });
}

import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { TargetPolicy, TargetPolicyInput } from '../../shared/journey/target-policy-schema';
import { api } from '../api-client';
import { STALE_TIMES } from './stale-times';

// Admin settings of the prober: target rules (which addresses it may connect to) and run retention.
export const probeSettingsKeys = {
  all: ['probe-settings'] as const,
  targetRules: () => [...probeSettingsKeys.all, 'target-rules'] as const,
  retention: () => [...probeSettingsKeys.all, 'retention'] as const,
};

export function useTargetRulesQuery(options: { enabled?: boolean } = {}) {
  return useQuery({
    queryKey: probeSettingsKeys.targetRules(),
    queryFn: () => api.get<TargetPolicy>('/api/target-rules'),
    staleTime: STALE_TIMES.targetRules,
    enabled: options.enabled ?? true,
  });
}

export function useSaveTargetRulesMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: TargetPolicyInput) => api.put<TargetPolicy>('/api/target-rules', input),
    onSuccess: (saved) => {
      queryClient.setQueryData(probeSettingsKeys.targetRules(), saved);
      return queryClient.invalidateQueries({ queryKey: probeSettingsKeys.targetRules() });
    },
  });
}

export function useRetentionQuery(options: { enabled?: boolean } = {}) {
  return useQuery({
    queryKey: probeSettingsKeys.retention(),
    queryFn: () => api.get<{ runRetentionDays: number }>('/api/retention'),
    staleTime: STALE_TIMES.retention,
    enabled: options.enabled ?? true,
  });
}

export function useSaveRetentionMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: { runRetentionDays: number }) => api.put<{ runRetentionDays: number }>('/api/retention', input),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: probeSettingsKeys.retention() }),
  });
}

import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { ReplayResponse, RuleView } from '../../shared/rules/api-schemas';
import type { RuleDraft } from '../../shared/rules/rule-schema';
import { api } from '../api-client';
import { alertKeys } from './alerts';
import { STALE_TIMES } from './stale-times';

export const ruleKeys = {
  all: ['rules'] as const,
  lists: () => [...ruleKeys.all, 'list'] as const,
  list: () => [...ruleKeys.lists()] as const,
  details: () => [...ruleKeys.all, 'detail'] as const,
  detail: (id: number) => [...ruleKeys.details(), id] as const,
};

// stale-times.ts has no rules entry yet (its owner adds one); rules change about as often as
// collection targets, so they share that freshness until then.
const RULES_STALE = STALE_TIMES.collectionTargets;

export function useRulesQuery() {
  return useQuery({
    queryKey: ruleKeys.list(),
    queryFn: async () => (await api.get<{ items: RuleView[] }>('/api/rules')).items,
    staleTime: RULES_STALE,
  });
}

export function useRuleQuery(id: number | null) {
  return useQuery({
    queryKey: ruleKeys.detail(id ?? 0),
    queryFn: () => api.get<RuleView>(`/api/rules/${id}`),
    staleTime: RULES_STALE,
    enabled: id !== null,
  });
}

function useInvalidateRules() {
  const queryClient = useQueryClient();
  return () => {
    void queryClient.invalidateQueries({ queryKey: ruleKeys.all });
    void queryClient.invalidateQueries({ queryKey: alertKeys.all });
  };
}

/** Create (id null) or replace a rule with a whole document. */
export function useSaveRuleMutation() {
  const invalidate = useInvalidateRules();
  return useMutation({
    mutationFn: ({ id, draft }: { id: number | null; draft: RuleDraft }) =>
      id === null ? api.post<RuleView>('/api/rules', draft) : api.put<RuleView>(`/api/rules/${id}`, draft),
    onSuccess: invalidate,
  });
}

export function useSetRuleEnabledMutation() {
  const invalidate = useInvalidateRules();
  return useMutation({
    mutationFn: ({ id, enabled }: { id: number; enabled: boolean }) => api.post<RuleView>(`/api/rules/${id}/${enabled ? 'enable' : 'disable'}`),
    onSuccess: invalidate,
  });
}

export function useDuplicateRuleMutation() {
  const invalidate = useInvalidateRules();
  return useMutation({
    mutationFn: (id: number) => api.post<RuleView>(`/api/rules/${id}/duplicate`),
    onSuccess: invalidate,
  });
}

export function useDeleteRuleMutation() {
  const invalidate = useInvalidateRules();
  return useMutation({
    mutationFn: (id: number) => api.delete(`/api/rules/${id}`),
    onSuccess: invalidate,
  });
}

/** Evaluates a draft over a past period; changes nothing, so nothing is invalidated. */
export function useReplayMutation() {
  return useMutation({
    mutationFn: ({ draft, from, to }: { draft: RuleDraft; from: number; to: number }) =>
      api.post<ReplayResponse>('/api/rules/replay', { rule: draft, from, to }),
  });
}

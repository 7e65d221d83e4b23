import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { MaintenanceWindowInput, MaintenanceWindowView } from '../../shared/rules/api-schemas';
import { api } from '../api-client';
import { alertKeys } from './alerts';
import { STALE_TIMES } from './stale-times';

export const maintenanceKeys = {
  all: ['maintenance-windows'] as const,
  list: () => [...maintenanceKeys.all, 'list'] as const,
};

// stale-times.ts has no entry for windows yet (its owner adds one); they change as rarely as secrets.
const MAINTENANCE_STALE = STALE_TIMES.secrets;

export function useMaintenanceWindowsQuery() {
  return useQuery({
    queryKey: maintenanceKeys.list(),
    queryFn: async () => (await api.get<{ items: MaintenanceWindowView[] }>('/api/maintenance-windows')).items,
    staleTime: MAINTENANCE_STALE,
  });
}

export function useCreateMaintenanceWindowMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: MaintenanceWindowInput) => api.post<MaintenanceWindowView>('/api/maintenance-windows', input),
    onSuccess: () => {
      void queryClient.invalidateQueries({ queryKey: maintenanceKeys.all });
      void queryClient.invalidateQueries({ queryKey: alertKeys.all });
    },
  });
}

export function useDeleteMaintenanceWindowMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (id: number) => api.delete(`/api/maintenance-windows/${id}`),
    onSuccess: () => {
      void queryClient.invalidateQueries({ queryKey: maintenanceKeys.all });
      void queryClient.invalidateQueries({ queryKey: alertKeys.all });
    },
  });
}

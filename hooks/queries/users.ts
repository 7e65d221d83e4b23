import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { CreateUserInput, UpdateUserInput, UserView } from '../../shared/schemas/users';
import { api } from '../api-client';
import { STALE_TIMES } from './stale-times';

export const userKeys = {
  all: ['users'] as const,
  list: () => [...userKeys.all, 'list'] as const,
};

export function useUsersQuery(options: { enabled?: boolean } = {}) {
  return useQuery({
    queryKey: userKeys.list(),
    queryFn: async () => (await api.get<{ items: UserView[] }>('/api/users')).items,
    staleTime: STALE_TIMES.users,
    enabled: options.enabled ?? true,
  });
}

export function useCreateUserMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: CreateUserInput) => api.post<UserView>('/api/users', input),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: userKeys.all }),
  });
}

export function useUpdateUserMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ id, ...change }: UpdateUserInput & { id: number }) =>
      api.patch<UserView>(`/api/users/${id}`, change),
    onSuccess: (updated) => {
      queryClient.setQueryData<UserView[]>(userKeys.list(), (list) =>
        list?.map((user) => (user.id === updated.id ? updated : user)),
      );
      return queryClient.invalidateQueries({ queryKey: userKeys.all });
    },
  });
}

import { useMutation, useQuery, useQueryClient, type QueryClient } from '@tanstack/react-query';
import type { SessionInfo } from '../../shared/api-types';
import type { SignInInput } from '../../shared/schemas/auth';
import { api, setCsrfToken } from '../api-client';
import { STALE_TIMES } from './stale-times';

export const sessionKeys = {
  all: ['session'] as const,
  current: () => [...sessionKeys.all, 'current'] as const,
};

async function fetchSession(): Promise<SessionInfo> {
  const session = await api.get<SessionInfo>('/api/auth/session');
  setCsrfToken(session.csrfToken);
  return session;
}

export function useSessionQuery() {
  return useQuery({
    queryKey: sessionKeys.current(),
    queryFn: fetchSession,
    staleTime: STALE_TIMES.session,
    retry: 1,
  });
}

/** The signed-in person, or null. */
export function useSessionUser() {
  return useSessionQuery().data?.user ?? null;
}

/** Forget everything cached for the previous person and mark the session as signed out. */
export function markSignedOut(queryClient: QueryClient): void {
  const previous = queryClient.getQueryData<SessionInfo>(sessionKeys.current());
  queryClient.removeQueries({ predicate: (query) => query.queryKey[0] !== sessionKeys.all[0] });
  queryClient.setQueryData<SessionInfo>(sessionKeys.current(), {
    user: null,
    csrfToken: previous?.csrfToken ?? '',
  });
  void queryClient.invalidateQueries({ queryKey: sessionKeys.all });
}

export function useSignInMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: SignInInput) => api.post<SessionInfo>('/api/auth/sign-in', input),
    onSuccess: (session) => {
      // The server regenerates the session at sign-in, so its token changes too.
      setCsrfToken(session.csrfToken);
      queryClient.removeQueries({ predicate: (query) => query.queryKey[0] !== sessionKeys.all[0] });
      queryClient.setQueryData(sessionKeys.current(), session);
    },
  });
}

export function useSignOutMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => api.post<void>('/api/auth/sign-out'),
    // Signed out locally even if the server could not be reached: the guard takes over.
    onSettled: () => markSignedOut(queryClient),
  });
}

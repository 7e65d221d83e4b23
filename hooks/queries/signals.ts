import { keepPreviousData, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { ApiErrorCode } from '../../shared/api-types';
import {
  DENOMINATOR_LABEL_FILTER_PREFIX,
  LABEL_FILTER_PREFIX,
  type CsvImportResult,
  type CsvMapping,
  type CsvPreview,
  type QueryFunction,
  type QueryResult,
  type SignalView,
} from '../../shared/schemas/signals';
import { api, ApiError, getCsrfToken, isApiError } from '../api-client';
import { serviceKeys } from './services';
import { REFETCH_INTERVALS, STALE_TIMES } from './stale-times';

/** What the explorer asks for. Times are a span ending now, so a refetch moves with the clock. */
export interface SignalQueryParams {
  service: string;
  signal: string;
  fn: QueryFunction;
  /** null: every series is its own line; []: one line for everything; else one line per value set. */
  by: string[] | null;
  agg: 'sum' | 'mean';
  /** Durations as the API reads them ("5m"); step null lets the server choose (about 200 points). */
  window: string;
  step: string | null;
  rangeMs: number;
  q?: number;
  bound?: number;
  limit?: number;
  denominator?: string;
  filters: Record<string, string>;
  denominatorFilters: Record<string, string>;
}

export const signalKeys = {
  all: ['signals'] as const,
  lists: () => [...signalKeys.all, 'list'] as const,
  list: (service: string) => [...signalKeys.lists(), service] as const,
  queries: () => [...signalKeys.all, 'query'] as const,
  query: (params: SignalQueryParams) => [...signalKeys.queries(), params] as const,
};

export function useSignalsQuery(service: string | null) {
  return useQuery({
    queryKey: signalKeys.list(service ?? ''),
    queryFn: async () => (await api.get<{ items: SignalView[] }>(`/api/signals?service=${encodeURIComponent(service!)}`)).items,
    staleTime: STALE_TIMES.signals,
    enabled: !!service,
  });
}

export function signalQueryPath(p: SignalQueryParams, now: number): string {
  const qs = new URLSearchParams({ service: p.service, signal: p.signal, fn: p.fn });
  if (p.by !== null) qs.set('by', p.by.join(','));
  if (p.by !== null && p.fn !== 'ratio') qs.set('agg', p.agg);
  if (p.fn !== 'raw') {
    qs.set('window', p.window);
    if (p.step) qs.set('step', p.step);
  }
  qs.set('from', String(now - p.rangeMs));
  qs.set('to', String(now));
  if (p.fn === 'quantile' && p.q !== undefined) qs.set('q', String(p.q));
  if (p.fn === 'share_above' && p.bound !== undefined) qs.set('bound', String(p.bound));
  if (p.fn === 'trend' && p.limit !== undefined) qs.set('limit', String(p.limit));
  if (p.fn === 'ratio' && p.denominator) qs.set('denominator', p.denominator);
  for (const [k, v] of Object.entries(p.filters)) qs.set(`${LABEL_FILTER_PREFIX}${k}`, v);
  if (p.fn === 'ratio') for (const [k, v] of Object.entries(p.denominatorFilters)) qs.set(`${DENOMINATOR_LABEL_FILTER_PREFIX}${k}`, v);
  return `/api/signals/query?${qs.toString()}`;
}

/** Aligned points per group; the previous answer stays on screen while the same signal refetches. */
export function useSignalQuery(params: SignalQueryParams | null) {
  return useQuery({
    queryKey: signalKeys.query(params!),
    queryFn: () => api.get<QueryResult>(signalQueryPath(params!, Date.now())),
    staleTime: STALE_TIMES.signalQuery,
    refetchInterval: REFETCH_INTERVALS.signalQuery,
    enabled: params !== null,
    placeholderData: (previous, previousQuery) => {
      const before = previousQuery?.queryKey[2] as SignalQueryParams | undefined;
      return before && params && before.service === params.service && before.signal === params.signal && before.fn === params.fn
        ? keepPreviousData(previous)
        : undefined;
    },
  });
}

/** A file the person picked (the browser's File on the web). */
export type UploadFile = Blob & { name: string };

export function useCsvPreviewMutation() {
  return useMutation({
    mutationFn: (file: UploadFile) => {
      const form = new FormData();
      form.append('file', file, file.name);
      return api.upload<CsvPreview>('/api/signals/csv?preview=1', form);
    },
  });
}

export function useCsvImportMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: async ({ file, mapping, onProgress }: { file: UploadFile; mapping: CsvMapping; onProgress: (share: number) => void }) => {
      // The server reads the mapping first and then stores rows while the file arrives.
      const form = new FormData();
      form.append('mapping', JSON.stringify(mapping));
      form.append('file', file, file.name);
      try {
        return await uploadWithProgress<CsvImportResult>('/api/signals/csv', form, onProgress);
      } catch (error) {
        // A stale CSRF token: the API client fetches a fresh one and retries (re-upload is idempotent).
        if (isApiError(error) && error.code === 'csrf') return api.upload<CsvImportResult>('/api/signals/csv', form);
        throw error;
      }
    },
    onSuccess: () => {
      void queryClient.invalidateQueries({ queryKey: serviceKeys.all });
      void queryClient.invalidateQueries({ queryKey: signalKeys.all });
    },
  });
}

const STATUS_CODES: Record<number, ApiErrorCode> = { 400: 'validation', 401: 'unauthorized', 403: 'forbidden', 404: 'not_found', 413: 'payload_too_large', 429: 'rate_limited', 503: 'unavailable' };
const ERROR_CODES: readonly string[] = ['validation', 'unauthorized', 'forbidden', 'not_found', 'conflict', 'rate_limited', 'payload_too_large', 'csrf', 'unavailable', 'internal'];

// fetch() cannot report how much of a request body has been sent, so this one upload goes through
// XMLHttpRequest to show progress on large files. Same session cookie, CSRF header and typed error
// as hooks/api-client.ts.
function uploadWithProgress<T>(path: string, form: FormData, onProgress: (share: number) => void): Promise<T> {
  return new Promise<T>((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open('POST', path);
    xhr.withCredentials = true;
    xhr.setRequestHeader('accept', 'application/json');
    const csrf = getCsrfToken();
    if (csrf) xhr.setRequestHeader('x-csrf-token', csrf);
    xhr.upload.onprogress = (event) => {
      if (event.lengthComputable && event.total > 0) onProgress(event.loaded / event.total);
    };
    xhr.onerror = () => reject(new ApiError(0, 'network', 'Could not reach the Parallax server'));
    xhr.onload = () => {
      let body: unknown;
      try {
        body = xhr.responseText ? JSON.parse(xhr.responseText) : undefined;
      } catch {
        body = undefined;
      }
      if (xhr.status >= 200 && xhr.status < 300) {
        onProgress(1);
        resolve(body as T);
        return;
      }
      const error = (body as { error?: { code?: string; message?: string; field?: string } } | undefined)?.error;
      const code = (error?.code && ERROR_CODES.includes(error.code) ? error.code : (STATUS_CODES[xhr.status] ?? 'internal')) as ApiErrorCode;
      reject(new ApiError(xhr.status, code, error?.message ?? `The server answered ${xhr.status}`, error?.field));
    };
    xhr.send(form);
  });
}

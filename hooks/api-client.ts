// The one place the app talks HTTP. Same-origin JSON with the session cookie; every write carries
// the CSRF token the server handed out with the session.
import type { ApiErrorBody, ApiErrorCode } from '../shared/api-types';

export class ApiError extends Error {
  readonly code: ApiErrorCode | 'network';
  readonly field: string | undefined;
  readonly status: number;

  constructor(status: number, code: ApiErrorCode | 'network', message: string, field?: string) {
    super(message);
    this.name = 'ApiError';
    this.status = status;
    this.code = code;
    this.field = field;
  }
}

export function isApiError(value: unknown): value is ApiError {
  return value instanceof ApiError;
}

type Method = 'GET' | 'POST' | 'PATCH' | 'PUT' | 'DELETE';

const SESSION_PATH = '/api/auth/session';
const SIGN_IN_PATH = '/api/auth/sign-in';

let csrfToken: string | null = null;
let onUnauthorized: (() => void) | null = null;

export function setCsrfToken(token: string | null): void {
  csrfToken = token;
}

export function getCsrfToken(): string | null {
  return csrfToken;
}

/** Called when a request made with a session comes back 401: the session has ended. */
export function setUnauthorizedHandler(handler: (() => void) | null): void {
  onUnauthorized = handler;
}

const KNOWN_CODES: readonly string[] = [
  'validation',
  'unauthorized',
  'forbidden',
  'not_found',
  'conflict',
  'rate_limited',
  'payload_too_large',
  'csrf',
  'unavailable',
  'internal',
];

function isErrorBody(value: unknown): value is ApiErrorBody {
  if (typeof value !== 'object' || value === null || !('error' in value)) return false;
  const error = (value as { error: unknown }).error;
  return typeof error === 'object' && error !== null && typeof (error as { message?: unknown }).message === 'string';
}

function fallbackCode(status: number): ApiErrorCode {
  if (status === 400) return 'validation';
  if (status === 401) return 'unauthorized';
  if (status === 403) return 'forbidden';
  if (status === 404) return 'not_found';
  if (status === 409) return 'conflict';
  if (status === 413) return 'payload_too_large';
  if (status === 429) return 'rate_limited';
  if (status === 503) return 'unavailable';
  return 'internal';
}

async function readBody(response: Response): Promise<unknown> {
  if (response.status === 204) return undefined;
  const text = await response.text();
  if (text.length === 0) return undefined;
  try {
    return JSON.parse(text) as unknown;
  } catch {
    return text;
  }
}

function toApiError(status: number, body: unknown): ApiError {
  if (isErrorBody(body)) {
    const { code, message, field } = body.error;
    const known = KNOWN_CODES.includes(code) ? code : fallbackCode(status);
    return new ApiError(status, known, message, field);
  }
  return new ApiError(status, fallbackCode(status), `The server answered ${status}`);
}

async function fetchCsrfToken(): Promise<void> {
  const response = await fetch(SESSION_PATH, { credentials: 'include', headers: { accept: 'application/json' } });
  const body = await readBody(response);
  if (response.ok && typeof body === 'object' && body !== null && 'csrfToken' in body) {
    const token = (body as { csrfToken: unknown }).csrfToken;
    if (typeof token === 'string') csrfToken = token;
  }
}

async function send(method: Method, path: string, body: unknown): Promise<Response> {
  const headers: Record<string, string> = { accept: 'application/json' };
  // A form (file upload) sets its own multipart content type with the boundary.
  const isForm = typeof FormData !== 'undefined' && body instanceof FormData;
  if (body !== undefined && !isForm) headers['content-type'] = 'application/json';
  if (method !== 'GET' && csrfToken) headers['x-csrf-token'] = csrfToken;
  try {
    return await fetch(path, {
      method,
      headers,
      credentials: 'include',
      body: body === undefined ? undefined : isForm ? body : JSON.stringify(body),
    });
  } catch {
    throw new ApiError(0, 'network', 'Could not reach the Parallax server');
  }
}

export async function request<T>(method: Method, path: string, body?: unknown): Promise<T> {
  if (method !== 'GET' && !csrfToken) await fetchCsrfToken().catch(() => undefined);
  let response = await send(method, path, body);
  let parsed = await readBody(response);

  // A stale token (the session was renewed elsewhere): fetch a fresh one and try once more.
  if (response.status === 403 && method !== 'GET' && isErrorBody(parsed) && parsed.error.code === 'csrf') {
    await fetchCsrfToken().catch(() => undefined);
    response = await send(method, path, body);
    parsed = await readBody(response);
  }

  if (!response.ok) {
    const error = toApiError(response.status, parsed);
    // A wrong password on the sign-in form is not a lost session.
    if (response.status === 401 && path !== SIGN_IN_PATH && path !== SESSION_PATH) onUnauthorized?.();
    throw error;
  }
  return parsed as T;
}

export const api = {
  get: <T>(path: string) => request<T>('GET', path),
  post: <T>(path: string, body?: unknown) => request<T>('POST', path, body ?? {}),
  patch: <T>(path: string, body: unknown) => request<T>('PATCH', path, body),
  put: <T>(path: string, body: unknown) => request<T>('PUT', path, body),
  /** multipart/form-data, for file uploads. */
  upload: <T>(path: string, form: FormData) => request<T>('POST', path, form),
  delete: <T = void>(path: string) => request<T>('DELETE', path),
};

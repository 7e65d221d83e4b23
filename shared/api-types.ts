// Response shapes shared by the server and the client.
import type { Role, TokenScope } from './roles';

export interface ApiErrorBody {
  error: { code: ApiErrorCode; message: string; field?: string };
}
export type ApiErrorCode =
  | 'validation'
  | 'unauthorized'
  | 'forbidden'
  | 'not_found'
  | 'conflict'
  | 'rate_limited'
  | 'payload_too_large'
  | 'csrf'
  | 'unavailable'
  | 'internal';

export interface SessionUser {
  id: number;
  email: string;
  name: string;
  role: Role;
}

export interface SessionInfo {
  user: SessionUser | null;
  csrfToken: string;
}

export interface HealthView {
  status: 'ok' | 'degraded';
  database: 'ok' | 'down';
  time: string;
}

export interface WorkerView {
  name: string;
  kind: 'worker';
  lastBeatAt: string;
  startedAt: string;
  /** Derived by the server: a worker silent for longer than 3 beats is down. */
  up: boolean;
}

export interface TokenPrincipal {
  name: string;
  scopes: TokenScope[];
}

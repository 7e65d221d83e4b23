import type { Role, TokenScope } from '../../shared/roles';

export type Principal =
  | { type: 'user'; id: number; email: string; name: string; role: Role }
  | { type: 'token'; id: number; name: string; scopes: TokenScope[] };

export function principalLabel(p: Principal): string {
  return p.type === 'user' ? p.email : `token:${p.name}`;
}

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    interface User {
      id: number;
      email: string;
      name: string;
      role: Role;
    }
    interface Locals {
      principal?: Principal;
    }
  }
}

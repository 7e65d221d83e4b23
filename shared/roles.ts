// Roles and token scopes (DESIGN.md §2). One list, used by the server's guard and the client's menus.
export const ROLES = ['admin', 'engineer', 'release_manager', 'reviewer'] as const;
export type Role = (typeof ROLES)[number];

export const ROLE_LABELS: Record<Role, string> = {
  admin: 'Admin',
  engineer: 'Engineer',
  release_manager: 'Release manager',
  reviewer: 'Reviewer',
};

export const TOKEN_SCOPES = ['ingest', 'releases', 'read'] as const;
export type TokenScope = (typeof TOKEN_SCOPES)[number];

export const SCOPE_LABELS: Record<TokenScope, string> = {
  ingest: 'Send metrics',
  releases: 'Record releases',
  read: 'Read reports',
};

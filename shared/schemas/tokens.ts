import { z } from 'zod';
import { TOKEN_SCOPES } from '../roles';

export const createTokenSchema = z.object({
  name: z.string().trim().min(1, 'Give the token a name').max(80),
  scopes: z
    .array(z.enum(TOKEN_SCOPES, { message: `Scopes are: ${TOKEN_SCOPES.join(', ')}` }))
    .min(1, 'Choose at least one scope')
    .refine((s) => new Set(s).size === s.length, 'Each scope once'),
});
export type CreateTokenInput = z.infer<typeof createTokenSchema>;

export interface TokenView {
  id: number;
  name: string;
  scopes: (typeof TOKEN_SCOPES)[number][];
  prefix: string;
  createdAt: string;
  createdBy: string | null;
  lastUsedAt: string | null;
  revokedAt: string | null;
}

export interface CreatedToken {
  token: TokenView;
  /** The whole secret, shown once and never again. */
  secret: string;
}

import crypto from 'node:crypto';
import type { Knex } from 'knex';
import type { CreatedToken, CreateTokenInput, TokenView } from '../../shared/schemas/tokens';
import type { Principal } from '../auth/principal';
import { NotFoundError } from '../errors';
import { auditRepo } from '../repositories/audit';
import { tokensRepo } from '../repositories/tokens';

const PREFIX = 'plx_';

export function hashToken(secret: string): string {
  return crypto.createHash('sha256').update(secret).digest('hex');
}

export function tokensService(db: Knex) {
  return {
    list(): Promise<TokenView[]> {
      return tokensRepo.list(db);
    },

    async create(actor: Principal, input: CreateTokenInput): Promise<CreatedToken> {
      const secret = PREFIX + crypto.randomBytes(24).toString('base64url');
      const id = await db.transaction(async (tx) => {
        const tokenId = await tokensRepo.insert(tx, {
          name: input.name,
          prefix: secret.slice(0, PREFIX.length + 6),
          tokenHash: hashToken(secret),
          scopes: input.scopes,
          createdBy: actor.type === 'user' ? actor.id : null,
        });
        await auditRepo.record(tx, actor, {
          action: 'token.create',
          subjectType: 'api_token',
          subjectId: tokenId,
          detail: { name: input.name, scopes: input.scopes },
        });
        return tokenId;
      });
      return { token: (await tokensRepo.byId(db, id))!, secret };
    },

    async revoke(actor: Principal, id: number): Promise<void> {
      await db.transaction(async (tx) => {
        const t = await tokensRepo.byId(tx, id);
        if (!t) throw new NotFoundError('Token');
        if (await tokensRepo.revoke(tx, id)) {
          await auditRepo.record(tx, actor, { action: 'token.revoke', subjectType: 'api_token', subjectId: id, detail: { name: t.name } });
        }
      });
    },

    async authenticate(secret: string): Promise<Principal | null> {
      if (!secret.startsWith(PREFIX)) return null;
      const t = await tokensRepo.useByHash(db, hashToken(secret));
      return t ? { type: 'token', ...t } : null;
    },
  };
}

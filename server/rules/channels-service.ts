// Webhook channels: engineers add them; the signing secret is made here and shown once (on create
// and on rotation), stored sealed, never echoed again. Every change is audited (never the secret).
import crypto from 'node:crypto';
import type { Knex } from 'knex';
import type { ChannelInput, ChannelView, ChannelWithSecret, UpdateChannelInput } from '../../shared/rules/api-schemas';
import type { Principal } from '../auth/principal';
import { ConflictError, NotFoundError } from '../errors';
import { auditRepo } from '../repositories/audit';
import { open, seal } from '../secrets/cipher';
import { channelsRepo, type ChannelSecretWrite } from './repositories/channels-repo';
import { rulesRepo } from './repositories/rules-repo';

/** Additional data bound into every sealed channel secret (see cipher.ts). */
export const CHANNEL_SECRET_AAD = 'notification-channel-secret';

function newSecret(key: Buffer): { secret: string; write: ChannelSecretWrite } {
  const secret = `pxwh_${crypto.randomBytes(32).toString('hex')}`;
  return { secret, write: { sealed: seal(key, CHANNEL_SECRET_AAD, secret), hint: `${secret.slice(0, 9)}…` } };
}

export function channelsService(db: Knex, key: Buffer) {
  async function view(id: number, tx: Knex = db): Promise<ChannelView> {
    const c = await channelsRepo.byId(tx, id);
    if (!c) throw new NotFoundError('Channel');
    return c;
  }
  return {
    list: () => channelsRepo.list(db),
    get: (id: number) => view(id),

    async create(actor: Principal, input: ChannelInput): Promise<ChannelWithSecret> {
      const { secret, write } = newSecret(key);
      const id = await db.transaction(async (tx) => {
        const newId = await channelsRepo.insert(tx, input, write, actor.type === 'user' ? actor.id : null);
        if (newId === null) throw new ConflictError(`A channel named ${input.name} already exists`, 'name');
        await auditRepo.record(tx, actor, { action: 'channel.create', subjectType: 'notification_channel', subjectId: newId, detail: { name: input.name, url: input.url } });
        return newId;
      });
      return { ...(await view(id)), secret };
    },

    async update(actor: Principal, id: number, patch: UpdateChannelInput): Promise<ChannelView | ChannelWithSecret> {
      const fresh = patch.rotateSecret ? newSecret(key) : null;
      await db.transaction(async (tx) => {
        const { rotateSecret: _r, ...fields } = patch;
        const outcome = await channelsRepo.update(tx, id, fields, fresh?.write);
        if (outcome === 'missing') throw new NotFoundError('Channel');
        if (outcome === 'conflict') throw new ConflictError(`A channel named ${patch.name} already exists`, 'name');
        await auditRepo.record(tx, actor, { action: 'channel.update', subjectType: 'notification_channel', subjectId: id, detail: { ...fields, rotatedSecret: !!fresh } });
      });
      const v = await view(id);
      return fresh ? { ...v, secret: fresh.secret } : v;
    },

    async remove(actor: Principal, id: number): Promise<void> {
      await db.transaction(async (tx) => {
        const before = await view(id, tx);
        const users = await rulesRepo.namesUsingChannel(tx, id);
        if (users.length) throw new ConflictError(`Rules still send to this channel: ${users.slice(0, 5).join(', ')}${users.length > 5 ? '…' : ''}; remove it from them first`);
        if (!(await channelsRepo.remove(tx, id))) throw new NotFoundError('Channel');
        await auditRepo.record(tx, actor, { action: 'channel.delete', subjectType: 'notification_channel', subjectId: id, detail: { name: before.name } });
      });
    },

    /** The channel's URL and secret in clear, for the notifier only. */
    async forDelivery(id: number): Promise<{ url: string; enabled: boolean; name: string; secret: string } | null> {
      const c = await channelsRepo.forDelivery(db, id);
      return c ? { url: c.url, enabled: c.enabled, name: c.name, secret: open(key, CHANNEL_SECRET_AAD, c.sealed) } : null;
    },
  };
}

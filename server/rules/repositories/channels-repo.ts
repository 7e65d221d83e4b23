// Webhook channels; the signing secret is stored sealed (AES-256-GCM) and opened only to sign.
import type { Knex } from 'knex';
import type { ChannelView } from '../../../shared/rules/api-schemas';
import type { Sealed } from '../../secrets/cipher';

interface Row {
  id: number;
  name: string;
  url: string;
  enabled: boolean;
  secret_hint: string;
  created_at: Date;
  updated_at: Date;
}

function toView(r: Row): ChannelView {
  return { id: r.id, kind: 'webhook', name: r.name, url: r.url, enabled: r.enabled, secretHint: r.secret_hint, createdAt: r.created_at.toISOString(), updatedAt: r.updated_at.toISOString() };
}

const COLUMNS = ['id', 'name', 'url', 'enabled', 'secret_hint', 'created_at', 'updated_at'];

export interface ChannelSecretWrite {
  sealed: Sealed;
  hint: string;
}

export const channelsRepo = {
  async list(db: Knex): Promise<ChannelView[]> {
    return ((await db('notification_channels').orderBy('name').select(COLUMNS)) as Row[]).map(toView);
  },

  async byId(db: Knex, id: number): Promise<ChannelView | null> {
    const r = (await db('notification_channels').where({ id }).first(COLUMNS)) as Row | undefined;
    return r ? toView(r) : null;
  },

  /** Returns null when the name is taken. */
  async insert(db: Knex, c: { name: string; url: string; enabled: boolean }, secret: ChannelSecretWrite, by: number | null): Promise<number | null> {
    const rows = await db('notification_channels')
      .insert({
        name: c.name,
        url: c.url,
        enabled: c.enabled,
        secret_iv: secret.sealed.iv,
        secret_ciphertext: secret.sealed.ciphertext,
        secret_tag: secret.sealed.tag,
        secret_hint: secret.hint,
        created_by: by,
      })
      .onConflict('name')
      .ignore()
      .returning('id');
    return rows.length ? (rows[0] as { id: number }).id : null;
  },

  async update(db: Knex, id: number, patch: { name?: string; url?: string; enabled?: boolean }, secret?: ChannelSecretWrite): Promise<'ok' | 'missing' | 'conflict'> {
    const set: Record<string, unknown> = { updated_at: db.fn.now() };
    if (patch.name !== undefined) set.name = patch.name;
    if (patch.url !== undefined) set.url = patch.url;
    if (patch.enabled !== undefined) set.enabled = patch.enabled;
    if (secret) Object.assign(set, { secret_iv: secret.sealed.iv, secret_ciphertext: secret.sealed.ciphertext, secret_tag: secret.sealed.tag, secret_hint: secret.hint });
    try {
      return (await db('notification_channels').where({ id }).update(set)) > 0 ? 'ok' : 'missing';
    } catch (e) {
      if ((e as { code?: string }).code === '23505') return 'conflict';
      throw e;
    }
  },

  async remove(db: Knex, id: number): Promise<boolean> {
    return (await db('notification_channels').where({ id }).del()) > 0;
  },

  async existingIds(db: Knex, ids: number[]): Promise<Set<number>> {
    if (ids.length === 0) return new Set();
    return new Set<number>(await db('notification_channels').whereIn('id', ids).pluck('id'));
  },

  async enabledIds(db: Knex): Promise<Set<number>> {
    return new Set<number>(await db('notification_channels').where({ enabled: true }).pluck('id'));
  },

  /** What the notifier needs to deliver: where, and the sealed secret. */
  async forDelivery(db: Knex, id: number): Promise<{ url: string; enabled: boolean; name: string; sealed: Sealed } | null> {
    const r = await db('notification_channels').where({ id }).first('url', 'enabled', 'name', 'secret_iv', 'secret_ciphertext', 'secret_tag');
    return r ? { url: r.url, enabled: r.enabled, name: r.name, sealed: { iv: r.secret_iv, ciphertext: r.secret_ciphertext, tag: r.secret_tag } } : null;
  },
};

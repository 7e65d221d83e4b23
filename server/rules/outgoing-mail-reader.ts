// Settings → Outgoing mail: what the local SMTP sink (scripts/smtp-sink.ts) received, read from its
// directory (one <time>-<id>.json per message, written by the sink). Only the newest `limit`
// files are opened, so a long-running sink does not make the page slow.
import fs from 'node:fs';
import path from 'node:path';
import type { OutgoingMailItem, OutgoingMailList } from '../../shared/rules/api-schemas';
import { dataDir } from '../config';

export function mailDirFromEnv(env: NodeJS.ProcessEnv = process.env): string {
  return env.PARALLAX_MAIL_DIR ?? path.join(dataDir(env), 'mail');
}

export async function readOutgoingMail(dir: string, limit: number): Promise<OutgoingMailList> {
  let names: string[];
  try {
    names = (await fs.promises.readdir(dir)).filter((f) => f.endsWith('.json'));
  } catch (e) {
    if ((e as NodeJS.ErrnoException).code === 'ENOENT') return { items: [], total: 0 };
    throw e;
  }
  // Names start with the receive time (ISO with ':' and '.' as '-'), so they sort by time.
  names.sort();
  const newest = names.slice(-limit).reverse();
  const items: OutgoingMailItem[] = [];
  for (const name of newest) {
    try {
      const m = JSON.parse(await fs.promises.readFile(path.join(dir, name), 'utf8')) as Partial<OutgoingMailItem>;
      items.push({
        id: String(m.id ?? name),
        receivedAt: String(m.receivedAt ?? ''),
        from: String(m.from ?? ''),
        to: Array.isArray(m.to) ? m.to.map(String) : [],
        subject: String(m.subject ?? ''),
        text: String(m.text ?? ''),
      });
    } catch {
      // A file still being written or damaged is skipped, not a failed page.
    }
  }
  return { items, total: names.length };
}

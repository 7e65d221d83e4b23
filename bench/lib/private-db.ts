// A migrated database on a throwaway private cluster (bench/lib/private-cluster.ts), for benchmarks.
import type { Knex } from 'knex';
import type { DbSettings } from '../../server/config';
import { createKnex } from '../../server/db/knex';
import { freePort, privateCluster } from './private-cluster';

export interface PrivateDb {
  settings: DbSettings;
  knex: Knex;
  close(): Promise<void>;
}

/** `port` 0 (or none) picks a free one, so two benchmarks at once never share a cluster. */
export async function startPrivateDb(port = 0): Promise<PrivateDb> {
  const cluster = privateCluster({ port: port || (await freePort()), label: 'bench' });
  cluster.start();
  const settings = await cluster.createMigratedDatabase('bench');
  const knex = createKnex(settings, { max: 20 });
  return {
    settings,
    knex,
    async close() {
      await knex.destroy();
      cluster.destroy();
    },
  };
}

export function percentile(sorted: number[], p: number): number {
  if (!sorted.length) return NaN;
  const i = Math.min(sorted.length - 1, Math.max(0, Math.ceil(p * sorted.length) - 1));
  return sorted[i]!;
}

// Knex's own loader cannot import .ts migrations under vitest, so the files are listed and
// imported here (the surrounding runner, tsx or vitest, compiles them); a migration is a module exporting up() and down().
import fs from 'node:fs';
import path from 'node:path';
import type { Knex } from 'knex';

const dir = path.resolve(__dirname, '../../migrations');

interface MigrationModule {
  up(knex: Knex): Promise<void>;
  down(knex: Knex): Promise<void>;
}

export const migrationSource: Knex.MigrationSource<string> = {
  async getMigrations() {
    return fs
      .readdirSync(dir)
      .filter((f) => /^\d{14}_[a-z0-9-_]+\.ts$/.test(f))
      .sort();
  },
  getMigrationName(name) {
    return name;
  },
  async getMigration(name): Promise<MigrationModule> {
    const mod = (await import(path.join(dir, name))) as MigrationModule & { default?: MigrationModule };
    return mod.default ?? mod;
  },
};

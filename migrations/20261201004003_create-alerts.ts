import type { Knex } from 'knex';

// One alert: one rule holding for one label group, from the moment it opened (pending, or no
// data) until it ended (cleared). An open alert row *is* the evaluator's persisted state for its
// group (shared/rules/state-machine.ts), so a restarted evaluator carries on from pending_since;
// a group without an open alert is ok. At most one open alert per rule and group.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('alerts', (t) => {
    t.bigIncrements('id');
    t.bigInteger('rule_id').notNullable().references('alert_rules.id').onDelete('CASCADE');
    t.text('group_key').notNullable();
    t.jsonb('labels').notNullable().defaultTo('{}');
    t.text('state').notNullable().checkIn(['pending', 'raised', 'no_data', 'cleared']);
    t.text('no_data_reason').checkIn(['no_data', 'no_traffic', 'too_few_peers']);
    t.boolean('held_raised').notNullable().defaultTo(false);
    t.double('value');
    t.timestamp('opened_at', { useTz: true }).notNullable();
    t.timestamp('pending_since', { useTz: true });
    t.timestamp('raised_at', { useTz: true });
    t.timestamp('false_since', { useTz: true });
    t.timestamp('no_data_since', { useTz: true });
    t.timestamp('cleared_at', { useTz: true });
    t.text('end_reason');
    t.boolean('planned').notNullable().defaultTo(false);
    t.boolean('raise_notified').notNullable().defaultTo(false);
    t.timestamp('last_evaluated_at', { useTz: true });
    t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
  });
  await knex.raw("CREATE UNIQUE INDEX alerts_open_group_idx ON alerts (rule_id, group_key) WHERE state <> 'cleared'");
  await knex.raw('CREATE INDEX alerts_rule_idx ON alerts (rule_id, id)');
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('alerts');
}

import type { Knex } from 'knex'
import { tableOptions } from '../schema-helpers'

export async function up(knex: Knex): Promise<void> {
  // What the server last sent a phone's daybook refresh, as each record's fingerprint, so that the next
  // refresh sends only what changed since (server/utils/snapshot-changes.ts). One sign-in is one phone;
  // its rows go with it.
  await knex.schema.createTable('snapshot_bases', (t) => {
    tableOptions(t)
    t.string('id', 32).primary()
    t.uuid('session_id').notNullable().references('user_sessions.id').onDelete('CASCADE')
    t.text('manifest', 'mediumtext').notNullable()
    t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3))
    t.index(['session_id', 'created_at'])
  })
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('snapshot_bases')
}

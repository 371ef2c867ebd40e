import type { Knex } from 'knex'

/** Every table: InnoDB, utf8mb4. */
export function tableOptions(t: Knex.CreateTableBuilder): void {
  t.engine('InnoDB')
  t.charset('utf8mb4')
  t.collate('utf8mb4_unicode_ci')
}

/** created_at / updated_at in UTC with milliseconds. */
export function timestamps(knex: Knex, t: Knex.CreateTableBuilder): void {
  t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3))
  t.datetime('updated_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3))
}

/** Records a phone creates: a client-generated UUID key and the revision the next edit must name. */
export function phoneRecord(knex: Knex, t: Knex.CreateTableBuilder): void {
  t.uuid('id').primary()
  t.integer('revision').unsigned().notNullable().defaultTo(1)
  timestamps(knex, t)
}

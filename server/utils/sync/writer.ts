// A sync batch's transaction in as few round trips as MariaDB allows: BEGIN travels with the batch's
// first statements (the locked reads, when rows exist), and every write of the batch, its audit line,
// its receipt and COMMIT travel together as one multi-statement query. A batch of new records is thus
// one round trip. Multiple statements are allowed only on this pool, and only statements compiled by
// Knex with bound values are ever sent through it.
import knex, { type Knex } from 'knex'
import { connectionConfig } from '../../../db/connection'

let pool: Knex | undefined

function useBatchWriter(): Knex {
  if (!pool) {
    const { db } = useRuntimeConfig()
    const config = connectionConfig({ host: db.host, port: Number(db.port), user: db.user, password: db.password, database: db.name })
    pool = knex({ ...config, connection: { ...config.connection as Knex.MySql2ConnectionConfig, multipleStatements: true } })
    useNitroApp().hooks.hook('close', closeBatchWriter)
  }
  return pool
}

async function closeBatchWriter(): Promise<void> {
  const closing = pool
  pool = undefined
  await closing?.destroy()
}

type Row = Record<string, unknown> & { id: string }
/** The pool's mysql2 connection, used directly: Knex has no way to send a raw query on a chosen connection. */
interface Connection { query: (sql: string, values: unknown[], done: (error: Error | null, results: unknown) => void) => void }

export interface BatchTransaction {
  /** Builds statements (never runs them). */
  knex: Knex
  /** Runs reads inside the transaction (opening it if need be), in one round trip; the rows of each. */
  read: (statements: Knex.QueryBuilder[]) => Promise<Row[][]>
}

/**
 * Runs `work` in one transaction on one connection: `work` reads through `tx.read` and answers the
 * statements that write its decisions, which are sent with COMMIT. MariaDB stops at the first statement
 * that fails; the transaction is then rolled back and the error thrown.
 */
export async function inBatchTransaction<T>(work: (tx: BatchTransaction) => Promise<{ value: T, statements: Knex.QueryBuilder[] }>): Promise<T> {
  const writer = useBatchWriter()
  const connection: Connection = await writer.client.acquireConnection()
  let open = false
  const trip = async (statements: Knex.QueryBuilder[], commit: boolean): Promise<unknown[]> => {
    const compiled = statements.map(statement => statement.toSQL().toNative())
    const lead = open ? [] : ['BEGIN']
    const sql = [...lead, ...compiled.map(c => c.sql), ...(commit ? ['COMMIT'] : [])]
    open = true
    const results = await new Promise<unknown>((resolve, reject) => connection.query(sql.join(';\n'), compiled.flatMap(c => c.bindings), (error, answer) => error ? reject(error) : resolve(answer)))
    // One statement answers its result alone; several answer one result each.
    return (sql.length === 1 ? [results] : results as unknown[]).slice(lead.length, lead.length + compiled.length)
  }
  try {
    const { value, statements } = await work({ knex: writer, read: async statements => await trip(statements, false) as Row[][] })
    await trip(statements, true)
    open = false
    return value
  }
  catch (error) {
    if (open) await new Promise(resolve => connection.query('ROLLBACK', [], resolve))
    throw error
  }
  finally {
    await writer.client.releaseConnection(connection)
  }
}

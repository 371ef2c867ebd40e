// A job's rollup: crew-days, hours, weather, zones and materials against the bid and the estimate,
// each part one SQL aggregate (server/utils/rollup-sql.ts), run side by side on the pool.
import type { JobRollup, RollupMaterial, RollupPoint, RollupTotals, RollupZone } from '../../shared/types/rollup'
import type { Member } from './members'
import { rollupStatements, type Statement } from './rollup-sql'

async function rowsOf<T>(statement: Statement): Promise<T[]> {
  const [rows] = await useDb().raw(statement.sql, statement.bindings) as unknown as [T[]]
  return rows
}

/**
 * The rollup of a job, or 404 when the member may not see it. The access rule (visibleJobs) is part
 * of the totals statement rather than a query before it: one round trip fewer, and nothing is
 * answered unless the totals come back.
 */
export async function jobRollupFor(member: Member, jobId: string): Promise<JobRollup> {
  const visible = visibleJobs(member).andWhere('jobs.id', jobId).select('jobs.id').toSQL().toNative()
  const statements = rollupStatements(jobId, { sql: visible.sql, bindings: visible.bindings as (string | number)[] })
  const [totals, zones, materials, series] = await Promise.all([
    rowsOf<RollupTotals>(statements.totals),
    rowsOf<RollupZone>(statements.zones),
    rowsOf<RollupMaterial>(statements.materials),
    rowsOf<RollupPoint>(statements.series),
  ])
  if (!totals[0]) throw createError({ statusCode: 404, statusMessage: 'No such job' })
  return { jobId, totals: totals[0], zones, materials, series }
}

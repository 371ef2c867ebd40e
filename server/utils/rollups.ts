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
 * The rollup of a job, or 404 when the member may not see it. The access check runs beside the
 * aggregates instead of before them (one round trip fewer); nothing is answered unless it passes.
 */
export async function jobRollupFor(member: Member, jobId: string): Promise<JobRollup> {
  const statements = rollupStatements(jobId)
  const [, totals, zones, materials, series] = await Promise.all([
    requireVisibleJob(member, jobId),
    rowsOf<RollupTotals>(statements.totals),
    rowsOf<RollupZone>(statements.zones),
    rowsOf<RollupMaterial>(statements.materials),
    rowsOf<RollupPoint>(statements.series),
  ])
  if (!totals[0]) throw createError({ statusCode: 404, statusMessage: 'No such job' })
  return { jobId, totals: totals[0], zones, materials, series }
}

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
 * of the totals statement rather than a query before it, and nothing is answered unless the totals
 * come back. The zones, materials and series do not depend on who asks: they are read while the
 * membership is confirmed (`member`, the route's requireMember), so that the membership's round
 * trip is not added to theirs; they are dropped unread when it or the totals refuse.
 */
export async function jobRollupFor(member: Promise<Member>, jobId: string): Promise<JobRollup> {
  const parts = rollupStatements(jobId)
  const details = Promise.all([rowsOf<RollupZone>(parts.zones), rowsOf<RollupMaterial>(parts.materials), rowsOf<RollupPoint>(parts.series)])
  // Awaited only after the membership and the totals; a failure before then must not go unhandled.
  details.catch(() => {})
  const visible = visibleJobs(await member).andWhere('jobs.id', jobId).select('jobs.id').toSQL().toNative()
  const [totals] = await Promise.all([rowsOf<RollupTotals>(rollupStatements(jobId, { sql: visible.sql, bindings: visible.bindings as (string | number)[] }).totals), details])
  if (!totals[0]) throw createError({ statusCode: 404, statusMessage: 'No such job' })
  const [zones, materials, series] = await details
  return { jobId, totals: totals[0], zones, materials, series }
}

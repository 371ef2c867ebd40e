// What the crew built, as the foreman's review, the day report and its print read it.
import type { ReviewDay } from '../../shared/schemas/review'
import type { ZoneKind } from '../../shared/utils/daybook'
import { naturalUnits, productionStages, unitWords, type ProductionStage } from '../../shared/utils/trade-data-production'

/** The office's words for the stages (the phone translates its own). */
export const stageLabels: Record<ProductionStage, string> = {
  excavated: 'Excavated', base_placed: 'Base placed', bedding: 'Bedding / first course', laid: 'Laid / built', joints: 'Joints filled / capped', finished: 'Finished',
}

/** One day's quantities, by zone name and then in stage order. */
export async function dayQuantities(dayId: string): Promise<ReviewDay['quantities']> {
  const rows: ReviewDay['quantities'] = await useDb()('zone_quantities as q').join('zones as z', 'z.id', 'q.zone_id').where('q.day_sheet_id', dayId)
    .orderBy('z.name').select('q.id', 'q.zone_id as zoneId', 'z.name as zoneName', 'z.kind as zoneKind', 'q.stage', 'q.quantity', 'q.cap_lf as capLf')
  const order = (stage: string) => productionStages.indexOf(stage as ProductionStage)
  return rows.sort((a, b) => a.zoneName.localeCompare(b.zoneName) || order(a.stage) - order(b.stage))
}

/** "Front walk: 120 sq ft laid / built" */
export function builtLine(q: { zoneName: string, zoneKind: string, stage: string, quantity: number, capLf: number | null }): string {
  const unit = unitWords[naturalUnits[q.zoneKind as ZoneKind] ?? 'sq_ft']
  const cap = q.capLf ? `, ${q.capLf} lin ft of cap` : ''
  return `${q.zoneName}: ${q.quantity} ${unit} ${(stageLabels[q.stage as ProductionStage] ?? q.stage).toLowerCase()}${cap}`
}

/**
 * What was built in each zone of these jobs on days older than the phone's snapshot holds, per stage,
 * so that the day sheet's "so far" counts the whole job.
 */
export async function builtBeforeWindow(jobIds: string[], recentDays: number): Promise<{ zoneId: string, stage: ProductionStage, quantity: number }[]> {
  if (!jobIds.length) return []
  const rows: { zoneId: string, stage: ProductionStage, quantity: number | string }[] = await useDb()('zone_quantities as q').join('day_sheets as s', 's.id', 'q.day_sheet_id')
    .whereIn('q.job_id', jobIds).andWhereRaw('s.work_date < CURDATE() - INTERVAL ? DAY', [recentDays])
    .groupBy('q.zone_id', 'q.stage').select('q.zone_id as zoneId', 'q.stage', useDb().raw('SUM(q.quantity) AS quantity'))
  return rows.map(r => ({ ...r, quantity: Number(r.quantity) }))
}

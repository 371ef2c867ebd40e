// Days of work on bench jobs, written in bulk: crew hours, lifts over the first days, drops every tenth.
import { randomUUID } from 'node:crypto'
import type { Knex } from 'knex'
import type { DayStatus } from '../../shared/utils/daybook'

const chunk = 2000
// The last days of each job wait for the foreman; the earlier ones are approved.
const waitingDays = 5

type Row = Record<string, unknown>

/** A day's status by its place in the job: mostly full days, some half days, rain-outs and idle days. */
function statusOf(day: number): DayStatus {
  if (day % 15 === 7) return 'rain_out'
  if (day % 20 === 13) return 'half_day'
  if (day % 30 === 29) return 'no_work'
  return 'full_day'
}
const hoursOf: Record<DayStatus, number | null> = { full_day: 8, half_day: 4, rain_out: 0, no_work: null }

export function dateAfter(start: string, days: number): string {
  return new Date(Date.parse(`${start}T00:00:00Z`) + days * 86_400_000).toISOString().slice(0, 10)
}

export class BulkWriter {
  private pending = new Map<string, Row[]>()
  constructor(private db: Knex) {}
  async add(table: string, row: Row): Promise<void> {
    const rows = this.pending.get(table) ?? []
    rows.push(row)
    this.pending.set(table, rows)
    if (rows.length >= chunk) await this.flush(table)
  }

  async flush(table?: string): Promise<void> {
    // Parents first: sheets before the entries, lifts and drops that refer to them.
    for (const name of table ? [table] : ['day_sheets', 'time_entries', 'lifts', 'material_drops', 'material_estimates']) {
      const rows = this.pending.get(name)
      if (!rows?.length) continue
      this.pending.set(name, [])
      if (name !== 'day_sheets') await this.flush('day_sheets')
      await this.db(name).insert(rows)
    }
  }
}

export async function seedDays(job: { id: string, zoneId: string }, crew: string[], start: string, days: number, out: BulkWriter) {
  for (let day = 0; day < days; day++) {
    const id = randomUUID()
    const status = statusOf(day)
    await out.add('day_sheets', {
      id, job_id: job.id, work_date: dateAfter(start, day), status, hours_lost: status === 'rain_out' ? 3 : 0,
      review_state: day >= days - waitingDays ? 'waiting' : 'approved',
    })
    const hours = hoursOf[status]
    if (hours !== null) for (const person of crew) await out.add('time_entries', { id: randomUUID(), day_sheet_id: id, crew_member_id: person, hours })
    // Base goes in over the first days of the job: two lifts a day.
    if (day < 6 && status === 'full_day') {
      for (let n = 0; n < 2; n++) {
        await out.add('lifts', { id: randomUUID(), day_sheet_id: id, job_id: job.id, zone_id: job.zoneId, sequence: day * 2 + n + 1, material: '3/4 in crushed stone', loose_in: 4, compacted_in: 3, passes: 4, compactor_class: 'plate-medium' })
      }
    }
    if (day % 10 === 0) await out.add('material_drops', { id: randomUUID(), day_sheet_id: id, job_id: job.id, material: '3/4 in crushed stone', quantity: 12, unit: 'ton' })
  }
  await out.add('material_estimates', { id: randomUUID(), job_id: job.id, material: '3/4 in crushed stone', quantity: 60, unit: 'ton' })
}


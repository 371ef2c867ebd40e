import { describe, expect, it } from 'vitest'
import { fromRow } from '../../server/utils/sync/kinds'

describe('records as the phone reads them back', () => {
  it('shows a day\'s start and finish as HH:MM', () => {
    const sheet = fromRow('day_sheet', { id: 'd1', started_at: '07:00:00', finished_at: '15:30:00' })
    expect([sheet.startedAt, sheet.finishedAt]).toEqual(['07:00', '15:30'])
  })

  it('keeps text that only looks like a clock time as it was typed', () => {
    expect(fromRow('zone', { id: 'z1', name: '10:00:00', notes: '12:30:45' })).toMatchObject({ name: '10:00:00', notes: '12:30:45' })
    expect(fromRow('material_drop', { id: 'm1', staged_at: '07:30:00' }).stagedAt).toBe('07:30:00')
  })
})

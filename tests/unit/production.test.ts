// Every expected figure below was computed by hand (pencil and paper, shown in the comments) from the
// rules in shared/utils/production.ts; those rules (stage shares, 8-hour day, equal split of a day
// between its lines) are common practice, not a published standard.
import { describe, expect, it } from 'vitest'
import { effectiveCrewDays, estimateCrewDays, forecastJob, percentile, productionRates, weatherAllowance, type ProductionDay, type ProductionRate } from '../../shared/utils/production'

const day = (id: string, over: Partial<ProductionDay>): ProductionDay => ({
  daySheetId: id, jobId: 'j1', workDate: '2026-05-04', crewLeadId: null, status: 'full_day', hoursLost: 0, personHours: 32, built: [], ...over,
})

describe('productionRates', () => {
  const days = [
    day('d1', { built: [{ zoneKind: 'patio', stage: 'laid', quantity: 300 }] }), // 300 / 1 = 300; 300 / 32 = 9.375 per person-hour
    day('d2', { hoursLost: 4, personHours: 16, built: [{ zoneKind: 'patio', stage: 'laid', quantity: 120 }] }), // 120 / 0.5 = 240; 120 / 16 = 7.5
    day('d3', { status: 'half_day', personHours: 13, built: [{ zoneKind: 'patio', stage: 'laid', quantity: 130 }] }), // 130 / 0.5 = 260; 130 / 13 = 10
    // Two lines share the day: 0.5 crew-day and 16 person-hours each. 200 / 0.5 = 400, 200 / 16 = 12.5; 60 / 0.5 = 120.
    day('d4', { built: [{ zoneKind: 'patio', stage: 'laid', quantity: 200 }, { zoneKind: 'wall', stage: 'laid', quantity: 60 }] }),
    day('d5', { status: 'rain_out', built: [{ zoneKind: 'patio', stage: 'laid', quantity: 10 }] }),
  ]

  it('the patio laying rate is the median of 240, 260, 300 and 400 sq ft a crew-day: 280, 252 on 80% of days', () => {
    const patio = productionRates(days).find(r => r.zoneKind === 'patio')
    // Sorted 240 260 300 400: median (260 + 300) / 2 = 280; 20th percentile at rank 3 × 0.2 = 0.6: 240 + 0.6 × 20 = 252.
    expect(patio).toMatchObject({ stage: 'laid', unit: 'sq_ft', days: 4, median: 280, p80: 252, min: 240, max: 400 })
    // Per person-hour sorted 7.5 9.375 10 12.5: median (9.375 + 10) / 2 = 9.6875.
    expect(patio?.perPersonHourMedian).toBeCloseTo(9.6875, 9)
    expect(patio?.daySheetIds.sort()).toEqual(['d1', 'd2', 'd3', 'd4'])
  })

  it('a rain-out does not lower a rate and a day with hours lost counts only the hours worked', () => {
    const wall = productionRates(days).find(r => r.zoneKind === 'wall') as ProductionRate
    expect(wall).toMatchObject({ unit: 'face_sq_ft', days: 1, median: 120 })
    expect(productionRates(days).find(r => r.zoneKind === 'patio')?.daySheetIds).not.toContain('d5')
    expect(effectiveCrewDays('full_day', 2)).toBe(0.75)
    expect(effectiveCrewDays('half_day', 2)).toBe(0.25)
    expect(effectiveCrewDays('rain_out', 0)).toBe(0)
    expect(effectiveCrewDays('full_day', 12)).toBe(0)
  })

  it('percentile interpolates like SQL PERCENTILE_CONT: 1, 2, 3, 4 at 0.5 is 2.5 and at 0.2 is 1.6', () => {
    expect(percentile([4, 1, 3, 2], 0.5)).toBe(2.5)
    expect(percentile([4, 1, 3, 2], 0.2)).toBeCloseTo(1.6, 12)
    expect(percentile([7], 0.2)).toBe(7)
  })
})

describe('estimateCrewDays', () => {
  const rate = (stage: ProductionRate['stage'], median: number, p80: number): ProductionRate =>
    ({ zoneKind: 'patio', stage, unit: 'sq_ft', days: 5, median, p80, min: p80, max: median, perPersonHourMedian: null, daySheetIds: [] })
  const rates = [rate('excavated', 400, 300), rate('base_placed', 250, 200), rate('laid', 200, 160)]

  it('600 sq ft of patio dug, based and laid takes 6.9 crew-days at the median (bid 7) and 8.75 at the 80th percentile (bid 9)', () => {
    const stages = ['excavated', 'base_placed', 'laid'] as const
    // 600/400 + 600/250 + 600/200 = 1.5 + 2.4 + 3 = 6.9
    const median = estimateCrewDays([{ zoneKind: 'patio', quantity: 600, stages: [...stages] }], rates, { percentile: 50 })
    expect(median.crewDays).toBeCloseTo(6.9, 9)
    expect(median.bidCrewDays).toBe(7)
    // 600/300 + 600/200 + 600/160 = 2 + 3 + 3.75 = 8.75
    const safe = estimateCrewDays([{ zoneKind: 'patio', quantity: 600, stages: [...stages] }], rates, { percentile: 80 })
    expect(safe.crewDays).toBeCloseTo(8.75, 9)
    expect(safe.bidCrewDays).toBe(9)
    expect(safe.missing).toEqual([])
  })

  it('stages the company has no rate for are named as missing, not counted as free', () => {
    const all = estimateCrewDays([{ zoneKind: 'patio', quantity: 600 }], rates, { percentile: 50 })
    expect(all.missing.map(m => m.stage)).toEqual(['bedding', 'joints', 'finished'])
    expect(all.crewDays).toBeCloseTo(6.9, 9)
  })
})

describe('forecastJob', () => {
  // Patio 400 sq ft bid at 6 crew-days: dug 400, based 400, bedded 200 → 0.15 + 0.25 + 0.10 × 0.5 = 0.45.
  // Wall 200 face sq ft bid at 4: dug 200 → 0.15. Job (6 × 0.45 + 4 × 0.15) / 10 = 3.3 / 10 = 0.33.
  const progress = [
    { zoneId: 'patio', planned: 400, crewDaysBid: 6, installed: { excavated: 400, base_placed: 400, bedding: 200 } },
    { zoneId: 'wall', planned: 200, crewDaysBid: 4, installed: { excavated: 200 } },
  ]

  it('a job 33% built on 3.3 of 10 crew-days is on track for 10', () => {
    const f = forecastJob(progress, 3.3, 10)
    expect(f.percentComplete).toBeCloseTo(0.33, 9)
    expect(f.forecastCrewDays).toBeCloseTo(10, 9)
    expect(f).toMatchObject({ overBy: 0, state: 'on_track' })
  })

  it('the same job on 4 crew-days is forecast over by 2.1 crew-days long before the bid runs out', () => {
    // 4 / 0.33 = 12.1212…; 12.12 − 10 = 2.1 to the tenth.
    const f = forecastJob(progress, 4, 10)
    expect(f.forecastCrewDays).toBeCloseTo(12.1212, 3)
    expect(f).toMatchObject({ overBy: 2.1, state: 'over', shareOfBidUsed: 0.4 })
  })

  it('zones without their own bid share what is left of the job\'s bid: 6, then 2 and 2 of 10', () => {
    // A (bid 6) finished = 1; B and C weigh (10 − 6) / 2 = 2 each, B dug only (0.15), C nothing.
    // (6 × 1 + 2 × 0.15 + 2 × 0) / 10 = 0.63.
    const f = forecastJob([
      { zoneId: 'a', planned: 10, crewDaysBid: 6, installed: { excavated: 10, base_placed: 10, bedding: 10, laid: 10, joints: 10, finished: 10 } },
      { zoneId: 'b', planned: 10, crewDaysBid: null, installed: { excavated: 10 } },
      { zoneId: 'c', planned: 10, crewDaysBid: null, installed: {} },
    ], 6.3, 10)
    expect(f.percentComplete).toBeCloseTo(0.63, 9)
    expect(f.forecastCrewDays).toBeCloseTo(10, 9)
  })

  it('nothing built yet gives no forecast, and a job past its bid is over whatever was built', () => {
    expect(forecastJob([{ zoneId: 'a', planned: 100, crewDaysBid: null, installed: {} }], 2, 10).state).toBe('not_started')
    expect(forecastJob([{ zoneId: 'a', planned: 100, crewDaysBid: null, installed: {} }], 11, 10).state).toBe('over')
    expect(forecastJob([{ zoneId: 'a', planned: null, crewDaysBid: null, installed: {} }], 1, 10).state).toBe('no_plan')
  })
})

describe('weatherAllowance', () => {
  // April: 10 scheduled days, 2 rain-outs and one full day with 4 of 8 hours lost: (2 + 0.5) / 10 = 0.25 lost.
  const april = [
    ...Array.from({ length: 7 }, (_, i) => ({ workDate: `2026-04-${String(i + 1).padStart(2, '0')}`, status: 'full_day' as const, hoursLost: 0 })),
    { workDate: '2026-04-08', status: 'full_day' as const, hoursLost: 4 },
    { workDate: '2026-04-09', status: 'rain_out' as const, hoursLost: 8 },
    { workDate: '2026-04-10', status: 'rain_out' as const, hoursLost: 8 },
    { workDate: '2026-04-11', status: 'no_work' as const, hoursLost: 0 },
  ]

  it('6 crew-days starting Monday 5 April 2027 need 8 working days (6 / 0.75): an allowance of 2', () => {
    const w = weatherAllowance(april, '2027-04-05', 6)
    expect(w.months[3]).toEqual({ month: 4, scheduled: 10, lost: 2.5, share: 0.25 })
    // 5–9 April and 12–14 April (checked with `date -d 2027-04-05 +%A`: Monday).
    expect(w).toMatchObject({ scheduledDays: 8, allowanceDays: 2, finish: '2027-04-14' })
  })

  it('8.5 crew-days in a month with no weather lost need 9 working days and no allowance (the half day is not weather)', () => {
    // Nothing lost in June: 9 days of 1 each reach 8.5 on the ninth; 9 − ceil(8.5) = 0.
    const june = [{ workDate: '2026-06-01', status: 'full_day' as const, hoursLost: 0 }]
    expect(weatherAllowance(june, '2027-06-07', 8.5)).toMatchObject({ scheduledDays: 9, allowanceDays: 0 })
  })

  it('a job starting Thursday 29 April runs into a dry May: 3 crew-days need 4 working days', () => {
    // 29 Apr 0.75 + 30 Apr 0.75 + 3 May 1 = 2.5 < 3; + 4 May 1 = 3.5: four days, allowance 1.
    expect(weatherAllowance(april, '2027-04-29', 3)).toMatchObject({ scheduledDays: 4, allowanceDays: 1, finish: '2027-05-04' })
  })
})

// The office's rates page and bid helper: their filters and the bid helper's zones.
import { z } from 'zod'
import { zoneKinds } from '../utils/daybook'
import { productionStages } from '../utils/trade-data-production'
import { boundedDate } from './dates'

export const seasons = ['winter', 'spring', 'summer', 'fall'] as const
export type Season = (typeof seasons)[number]
/** Meteorological seasons of the northern hemisphere (common practice): winter is December to February. */
export const seasonMonths: Record<Season, number[]> = { winter: [12, 1, 2], spring: [3, 4, 5], summer: [6, 7, 8], fall: [9, 10, 11] }

export const ratesQuery = z.object({
  crewLeadId: z.uuid('Not a valid id').optional(),
  season: z.enum(seasons, { error: 'Use winter, spring, summer or fall' }).optional(),
})
export type RatesQuery = z.infer<typeof ratesQuery>

export const bidHelperBody = z.strictObject({
  startDate: boundedDate,
  zones: z.array(z.strictObject({
    name: z.string().trim().max(120, 'At most 120 characters').default(''),
    zoneKind: z.enum(zoneKinds, { error: 'Choose the kind of zone' }),
    quantity: z.number({ error: 'Enter a number' }).gt(0, 'More than 0').max(1_000_000, 'At most 1000000'),
    stages: z.array(z.enum(productionStages)).min(1, 'At least one stage').optional(),
  })).min(1, 'Add a zone').max(50, 'At most 50 zones'),
  crewLeadId: z.uuid('Not a valid id').optional(),
})
export type BidHelperBody = z.infer<typeof bidHelperBody>

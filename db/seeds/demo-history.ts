// The demo company's past year: finished jobs with what was built each day, rain-outs in the wet
// months and lost hours, so that the rates page, the bid helper and the forecasts have a history to
// rest on. Everything is invented; a fixed seed makes the same history on every run. One crew (Teddy
// Okafor's) builds about a quarter faster than the other.
import type { ZoneKind } from '../../shared/utils/daybook'
import { productionStages, type ProductionStage } from '../../shared/utils/trade-data-production'
import type { DemoDay, DemoJob, DemoZone } from './demo-scenario'

/** Invented demo rates per crew-day, by zone kind and stage (not trade figures: the demo's own). */
const demoRates: Record<'paved' | 'wall' | 'steps' | 'drainage', Record<ProductionStage, number>> = {
  paved: { excavated: 400, base_placed: 350, bedding: 600, laid: 180, joints: 900, finished: 1200 },
  wall: { excavated: 150, base_placed: 160, bedding: 120, laid: 70, joints: 150, finished: 300 },
  steps: { excavated: 10, base_placed: 8, bedding: 6, laid: 3, joints: 8, finished: 12 },
  drainage: { excavated: 120, base_placed: 150, bedding: 200, laid: 140, joints: 160, finished: 300 },
}
const rateGroup = (kind: ZoneKind) => (kind === 'wall' ? 'wall' : kind === 'steps' ? 'steps' : kind === 'drainage' ? 'drainage' : 'paved')

const crews = {
  lead: { members: ['marisol', 'jonah', 'keiko', 'abel'], speed: 1 },
  lead2: { members: ['teddy', 'luis', 'benny', 'rory'], speed: 1.25 },
} as const

/** Months that bring most of Quarry Hollow's rain-outs (invented): spring and late fall. */
const wetMonths = new Set([3, 4, 5, 10, 11])

function random(seed: number) {
  let x = seed
  return () => (x = (x * 1_103_515_245 + 12_345) % 2_147_483_648) / 2_147_483_648
}

interface PastJob { key: string, name: string, customer: string, street: string, lead: keyof typeof crews, startedWorkingDaysAgo: number, zones: (Omit<DemoZone, 'depthIn' | 'extensionIn'> & { quantity: number })[] }

const pastJobs: PastJob[] = [
  { key: 'h1', name: 'Birchfield walk and stoop', customer: 'Nadia Kerr', street: '5 Birchfield Row', lead: 'lead', startedWorkingDaysAgo: 245, zones: [{ key: 'walk', name: 'Front walk', kind: 'walkway', areaSqFt: 220, quantity: 220 }, { key: 'steps', name: 'Stoop steps', kind: 'steps', risers: 4, quantity: 4 }] },
  { key: 'h2', name: 'Copper Mill patio', customer: 'Owen Tallis', street: '88 Copper Mill Road', lead: 'lead2', startedWorkingDaysAgo: 228, zones: [{ key: 'patio', name: 'Patio', kind: 'patio', areaSqFt: 520, quantity: 520 }] },
  { key: 'h3', name: 'Fennimore garden wall', customer: 'Ruth Amsel', street: '14 Fennimore Close', lead: 'lead', startedWorkingDaysAgo: 205, zones: [{ key: 'wall', name: 'Garden wall', kind: 'wall', lengthFt: 60, areaSqFt: 180, quantity: 180 }, { key: 'drain', name: 'Wall drain', kind: 'drainage', lengthFt: 60, quantity: 60 }] },
  { key: 'h4', name: 'Larkspur driveway', customer: 'Hal and June Brisco', street: '230 Larkspur Lane', lead: 'lead2', startedWorkingDaysAgo: 180, zones: [{ key: 'drive', name: 'Driveway', kind: 'driveway', areaSqFt: 780, quantity: 780 }] },
  { key: 'h5', name: 'Orchard Hill patio and steps', customer: 'Imani Rowe', street: '3 Orchard Hill', lead: 'lead', startedWorkingDaysAgo: 150, zones: [{ key: 'patio', name: 'Patio', kind: 'patio', areaSqFt: 380, quantity: 380 }, { key: 'steps', name: 'Patio steps', kind: 'steps', risers: 5, quantity: 5 }] },
  { key: 'h6', name: 'Kestrel Way drainage', customer: 'Piet van Damme', street: '61 Kestrel Way', lead: 'lead2', startedWorkingDaysAgo: 125, zones: [{ key: 'drain', name: 'Yard drain', kind: 'drainage', lengthFt: 140, quantity: 140 }, { key: 'path', name: 'Side path', kind: 'walkway', areaSqFt: 120, quantity: 120 }] },
  { key: 'h7', name: 'Tamsin Court retaining wall', customer: 'Gloria Mbeki', street: '9 Tamsin Court', lead: 'lead', startedWorkingDaysAgo: 95, zones: [{ key: 'wall', name: 'Retaining wall', kind: 'wall', lengthFt: 72, areaSqFt: 216, quantity: 216 }] },
  { key: 'h8', name: 'Wexley back patio', customer: 'Colm Ferris', street: '402 Wexley Street', lead: 'lead2', startedWorkingDaysAgo: 70, zones: [{ key: 'patio', name: 'Back patio', kind: 'patio', areaSqFt: 460, quantity: 460 }, { key: 'wall', name: 'Seat wall', kind: 'wall', lengthFt: 20, areaSqFt: 40, quantity: 40 }] },
  { key: 'h9', name: 'Sorrel Green front walk', customer: 'Ana Beltrán', street: '27 Sorrel Green', lead: 'lead', startedWorkingDaysAgo: 48, zones: [{ key: 'walk', name: 'Front walk', kind: 'walkway', areaSqFt: 260, quantity: 260 }] },
]

const stageWords: Record<ProductionStage, string> = { excavated: 'excavated', base_placed: 'base placed', bedding: 'bedding screeded', laid: 'laid', joints: 'joints filled', finished: 'finished' }

/** The crew-days each zone should take at the demo rates, with a little slack, to the half day. */
const bidOf = (zones: PastJob['zones']) => zones.map(z => productionStages.reduce((sum, s) => sum + z.quantity / demoRates[rateGroup(z.kind)][s], 0))

/**
 * Works each job day by day: the crew moves through the zones stage by stage at its rate (with day to
 * day spread); a rain-out builds nothing; hours lost take their share of the day.
 */
export function historyJobs(monthOf: (startedWorkingDaysAgo: number, offset: number) => number): DemoJob[] {
  const next = random(20_261_203)
  return pastJobs.map((job) => {
    const crew = crews[job.lead]
    const zoneBids = bidOf(job.zones)
    const queue = job.zones.flatMap(z => productionStages.map(stage => ({ zone: z, stage, left: z.quantity })))
    const days: DemoDay[] = []
    for (let offset = 0; queue.length && offset < 80; offset++) {
      const month = monthOf(job.startedWorkingDaysAgo, offset)
      const base = { offset, crew: [...crew.members], review: 'approved' as const, tempF: month >= 5 && month <= 9 ? 78 : 52 }
      if (next() < (wetMonths.has(month) ? 0.3 : 0.04)) {
        days.push({ ...base, status: 'rain_out', hoursLost: 8, lostReason: 'Rain', weather: 'Rain', rainIn: 0.8, workDone: 'Rained out; site covered.' })
        continue
      }
      const hoursLost = next() < 0.12 ? 2 + Math.floor(next() * 3) : 0
      let capacity = (1 - hoursLost / 8) * crew.speed * (0.8 + next() * 0.4)
      const built: NonNullable<DemoDay['built']> = []
      while (capacity > 0.05 && queue.length) {
        const step = queue[0] as (typeof queue)[number]
        const rate = demoRates[rateGroup(step.zone.kind)][step.stage]
        const quantity = Math.min(step.left, Math.round(rate * capacity))
        if (quantity <= 0) break
        built.push({ zone: step.zone.key, stage: step.stage, quantity })
        capacity -= quantity / rate
        step.left -= quantity
        if (step.left <= 0) queue.shift()
      }
      days.push({
        ...base, status: 'full_day', hoursLost, lostReason: hoursLost ? 'Waited on a delivery' : undefined, weather: 'Clear',
        workDone: built.map(b => `${job.zones.find(z => z.key === b.zone)?.name}: ${b.quantity} ${stageWords[b.stage]}`).join('; '), built,
      })
    }
    return {
      key: job.key, name: job.name, customer: job.customer, phone: '555-0100', email: `${job.key}.home@demo.test`, address: `${job.street}, Quarry Hollow`,
      status: 'finished', crewDaysBid: Math.ceil(zoneBids.reduce((a, b) => a + b, 0) * 1.1 * 2) / 2, crewSize: 4, personHoursBid: 0,
      startedWorkingDaysAgo: job.startedWorkingDaysAgo, lead: job.lead, homeownerUpdates: false, notes: '',
      zones: job.zones.map(({ quantity: _q, ...z }, i) => ({ ...z, depthIn: z.kind === 'drainage' ? 4 : 6, extensionIn: z.kind === 'drainage' ? 0 : 6, crewDaysBid: Math.round((zoneBids[i] ?? 0) * 1.1 * 10) / 10 })),
      estimate: [], days,
    }
  })
}

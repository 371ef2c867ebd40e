// The demo's invented company, people and jobs. Nothing here describes a real firm, person or place.
import type { DayStatus, JobStatus, Role, ZoneKind } from '../../shared/utils/daybook'
import type { ProductionStage } from '../../shared/utils/trade-data-production'

export const demoPassword = 'tamp-demo-2026'

export const company = { name: 'Ridgeback Stone & Garden', timeZone: 'America/Chicago' }

export const users: { key: string, email: string, name: string, role: Role, locale: 'en' | 'es' }[] = [
  { key: 'office', email: 'office@demo.test', name: 'Dana Whitcombe', role: 'office', locale: 'en' },
  { key: 'foreman', email: 'foreman@demo.test', name: 'Rafael Quintero', role: 'foreman', locale: 'en' },
  { key: 'lead', email: 'lead@demo.test', name: 'Marisol Vega', role: 'crew_lead', locale: 'es' },
  { key: 'lead2', email: 'lead2@demo.test', name: 'Teddy Okafor', role: 'crew_lead', locale: 'en' },
]

export const crew: { key: string, name: string, tradeRole: string, userKey?: string }[] = [
  { key: 'marisol', name: 'Marisol Vega', tradeRole: 'Crew lead', userKey: 'lead' },
  { key: 'teddy', name: 'Teddy Okafor', tradeRole: 'Crew lead', userKey: 'lead2' },
  { key: 'jonah', name: 'Jonah Pike', tradeRole: 'Equipment operator' },
  { key: 'luis', name: 'Luis Arredondo', tradeRole: 'Paver setter' },
  { key: 'benny', name: 'Benny Szabo', tradeRole: 'Laborer' },
  { key: 'keiko', name: 'Keiko Marsh', tradeRole: 'Wall builder' },
  { key: 'abel', name: 'Abel Fontaine', tradeRole: 'Laborer' },
  { key: 'rory', name: 'Rory Calder', tradeRole: 'Laborer' },
]

export interface DemoZone { key: string, name: string, kind: ZoneKind, depthIn: number, extensionIn: number, areaSqFt?: number, lengthFt?: number, risers?: number, crewDaysBid?: number }
export interface DemoLift { zone: string, material: string, looseIn: number, compactedIn: number, passes: number, compactor: string, photo?: string }
export interface DemoDrop { material: string, quantity: number, unit: string, stagedAt: string, ticket: string, photo?: string }
export interface DemoDay {
  /** Working days after the job's start (0 is the start date). */
  offset: number
  status: DayStatus
  crew: string[]
  hoursLost?: number
  lostReason?: string
  weather: string
  rainIn?: number
  tempF: number
  workDone: string
  review: 'waiting' | 'approved' | 'flagged'
  lifts?: DemoLift[]
  drops?: DemoDrop[]
  flag?: { lift: number, reason: string, body: string }
  /** What got built that day, in each zone's natural unit. */
  built?: { zone: string, stage: ProductionStage, quantity: number, capLf?: number }[]
}
export interface DemoJob {
  key: string
  name: string
  customer: string
  phone: string
  email: string
  address: string
  status: JobStatus
  crewDaysBid: number
  crewSize: number
  personHoursBid: number
  /** Working days before today that the job started (negative: starts in the future). */
  startedWorkingDaysAgo: number
  lead: string
  homeownerUpdates: boolean
  notes: string
  zones: DemoZone[]
  estimate: { material: string, quantity: number, unit: string }[]
  days: DemoDay[]
}

const wallLift = (zone: string, photo?: string): DemoLift =>
  ({ zone, material: '3/4 in crushed stone base', looseIn: 4, compactedIn: 3, passes: 4, compactor: 'plate-medium', photo })

export const jobs: DemoJob[] = [
  {
    key: 'linden', name: 'Linden Court patio and seat wall', customer: 'Priya and Sam Oduya', phone: '555-0142',
    email: 'oduya.home@demo.test', address: '42 Linden Court, Quarry Hollow', status: 'active',
    crewDaysBid: 9, crewSize: 4, personHoursBid: 288, startedWorkingDaysAgo: 1, lead: 'lead', homeownerUpdates: true,
    notes: 'Association requires the gate kept shut (dog next door). Locate ticket posted on the garage door.',
    zones: [
      { key: 'patio', name: 'Back patio', kind: 'patio', depthIn: 6, extensionIn: 6, areaSqFt: 420, crewDaysBid: 6 },
      // A wall's area is its face: 24 ft long, 1.5 ft exposed.
      { key: 'seatwall', name: 'Seat wall', kind: 'wall', depthIn: 6, extensionIn: 6, lengthFt: 24, areaSqFt: 36, crewDaysBid: 3 },
    ],
    estimate: [
      { material: '3/4 in crushed stone base', quantity: 14, unit: 'ton' },
      { material: 'Bedding chip 1/4 in', quantity: 2, unit: 'ton' },
      { material: 'Concrete pavers 6x9', quantity: 460, unit: 'sq ft' },
    ],
    days: [
      { offset: 0, status: 'full_day', crew: ['marisol', 'jonah', 'luis', 'benny'], weather: 'Clear', tempF: 58, review: 'waiting',
        workDone: 'Laid out patio and seat wall, excavated 9 in below finished grade, hauled spoil.',
        built: [{ zone: 'patio', stage: 'excavated', quantity: 420 }, { zone: 'seatwall', stage: 'excavated', quantity: 36 }],
        drops: [{ material: '3/4 in crushed stone base', quantity: 14, unit: 'ton', stagedAt: 'Driveway apron, on plywood', ticket: 'QH-30418', photo: 'ticket' }] },
    ],
  },
  {
    key: 'ashcombe', name: 'Ashcombe terrace wall and steps', customer: 'Gwen Ashcombe', phone: '555-0187',
    email: 'g.ashcombe@demo.test', address: '7 Heron Rise, Quarry Hollow', status: 'active',
    crewDaysBid: 18, crewSize: 5, personHoursBid: 720, startedWorkingDaysAgo: 11, lead: 'lead', homeownerUpdates: false,
    notes: 'Property line pins found at both back corners; wall stays 2 ft inside. Gas locate marked along the east side.',
    zones: [
      // 48 ft long, 3 ft exposed: 144 face sq ft.
      { key: 'wall', name: 'Terrace wall', kind: 'wall', depthIn: 6, extensionIn: 6, lengthFt: 48, areaSqFt: 144, crewDaysBid: 11 },
      { key: 'steps', name: 'Garden steps', kind: 'steps', depthIn: 6, extensionIn: 6, areaSqFt: 60, risers: 8, crewDaysBid: 5 },
      { key: 'drain', name: 'Wall drain', kind: 'drainage', depthIn: 4, extensionIn: 0, lengthFt: 50, crewDaysBid: 2 },
    ],
    estimate: [
      { material: '3/4 in crushed stone base', quantity: 22, unit: 'ton' },
      { material: 'Drainage stone 3/4 in clean', quantity: 12, unit: 'ton' },
      { material: 'Wall block', quantity: 310, unit: 'each' },
      { material: 'Perforated drain pipe 4 in', quantity: 50, unit: 'ft' },
    ],
    days: [
      { offset: 0, status: 'full_day', crew: ['marisol', 'jonah', 'keiko', 'abel', 'rory'], weather: 'Overcast', tempF: 61, review: 'approved',
        workDone: 'Excavated wall trench and step footprint.',
        built: [{ zone: 'wall', stage: 'excavated', quantity: 144 }, { zone: 'drain', stage: 'excavated', quantity: 50 }],
        drops: [{ material: '3/4 in crushed stone base', quantity: 22, unit: 'ton', stagedAt: 'Side yard, north of the shed', ticket: 'QH-30277' }] },
      { offset: 1, status: 'rain_out', crew: ['marisol', 'jonah', 'keiko', 'abel', 'rory'], hoursLost: 8, lostReason: 'Heavy rain; trench flooded', weather: 'Heavy rain', rainIn: 1.4, tempF: 54, review: 'approved',
        workDone: 'Covered the trench and spoil with tarps.' },
      { offset: 2, status: 'half_day', crew: ['marisol', 'jonah', 'keiko', 'abel', 'rory'], hoursLost: 4, lostReason: 'Pumped water from the trench first', weather: 'Drizzle', rainIn: 0.2, tempF: 55, review: 'approved',
        workDone: 'Pumped the trench, placed fabric, first lift of the leveling pad.',
        built: [{ zone: 'wall', stage: 'base_placed', quantity: 72 }],
        lifts: [wallLift('wall', 'lift')] },
      { offset: 3, status: 'full_day', crew: ['marisol', 'jonah', 'keiko', 'abel', 'rory'], weather: 'Clear', tempF: 60, review: 'approved',
        workDone: 'Second lift of the pad, base course of block set and leveled.',
        built: [{ zone: 'wall', stage: 'base_placed', quantity: 72 }, { zone: 'wall', stage: 'bedding', quantity: 144 }],
        lifts: [wallLift('wall', 'lift')],
        drops: [{ material: 'Wall block', quantity: 310, unit: 'each', stagedAt: 'Front lawn on pallets', ticket: 'BLK-5521' }] },
      { offset: 4, status: 'full_day', crew: ['marisol', 'jonah', 'keiko', 'abel', 'rory'], weather: 'Clear', tempF: 63, review: 'approved',
        workDone: 'Courses 2 to 4, drain pipe laid behind the wall.',
        built: [{ zone: 'wall', stage: 'laid', quantity: 72 }, { zone: 'drain', stage: 'laid', quantity: 50 }],
        drops: [{ material: 'Drainage stone 3/4 in clean', quantity: 12, unit: 'ton', stagedAt: 'Side yard', ticket: 'QH-30390' }] },
      { offset: 5, status: 'rain_out', crew: ['marisol', 'jonah', 'keiko', 'abel', 'rory'], hoursLost: 8, lostReason: 'Thunderstorms all day', weather: 'Thunderstorms', rainIn: 0.9, tempF: 58, review: 'approved',
        workDone: 'No work on site.' },
      { offset: 6, status: 'full_day', crew: ['marisol', 'jonah', 'keiko', 'abel'], weather: 'Partly cloudy', tempF: 59, review: 'approved',
        workDone: 'Courses 5 and 6, drainage stone backfill compacted in lifts.',
        built: [{ zone: 'wall', stage: 'laid', quantity: 72 }, { zone: 'drain', stage: 'joints', quantity: 50 }] },
      { offset: 7, status: 'half_day', crew: ['marisol', 'keiko', 'abel'], hoursLost: 4, lostReason: 'Block delivery short; waited for the second truck', weather: 'Clear', tempF: 57, review: 'approved',
        workDone: 'Step base excavated.', built: [{ zone: 'steps', stage: 'excavated', quantity: 8 }] },
      { offset: 8, status: 'full_day', crew: ['marisol', 'jonah', 'keiko', 'abel', 'rory'], weather: 'Clear', tempF: 62, review: 'flagged',
        workDone: 'Step base: two lifts compacted.',
        built: [{ zone: 'steps', stage: 'base_placed', quantity: 8 }],
        lifts: [
          { zone: 'steps', material: '3/4 in crushed stone base', looseIn: 4, compactedIn: 3, passes: 4, compactor: 'plate-medium', photo: 'lift' },
          { zone: 'steps', material: '3/4 in crushed stone base', looseIn: 5, compactedIn: 3.5, passes: 3, compactor: 'plate-light' },
        ],
        flag: { lift: 1, reason: 'photo_missing', body: 'No photo of the second step lift before it was covered, and 5 in loose is thick for the light plate. Probe it and send a photo.' } },
      { offset: 9, status: 'no_work', crew: [], weather: 'Clear', tempF: 64, review: 'waiting',
        workDone: 'Crew sent to a warranty repair; no work here.' },
      { offset: 10, status: 'full_day', crew: ['marisol', 'jonah', 'keiko', 'abel', 'rory'], weather: 'Windy', tempF: 52, review: 'waiting',
        workDone: 'Set the first three step units; cap course on the wall.',
        built: [{ zone: 'steps', stage: 'laid', quantity: 3 }, { zone: 'wall', stage: 'joints', quantity: 144, capLf: 48 }] },
    ],
  },
  {
    key: 'harrow', name: 'Harrow Lane front walk', customer: 'Desmond Farrow', phone: '555-0119',
    email: 'd.farrow@demo.test', address: '310 Harrow Lane, Quarry Hollow', status: 'finished',
    crewDaysBid: 5, crewSize: 3, personHoursBid: 120, startedWorkingDaysAgo: 30, lead: 'lead2', homeownerUpdates: true,
    notes: 'Walk meets the city sidewalk: keep 1/4 in below the sidewalk edge.',
    zones: [{ key: 'walk', name: 'Front walk', kind: 'walkway', depthIn: 4, extensionIn: 4, areaSqFt: 180 }],
    estimate: [
      { material: '3/4 in crushed stone base', quantity: 5, unit: 'ton' },
      { material: 'Bedding chip 1/4 in', quantity: 1, unit: 'ton' },
      { material: 'Clay pavers', quantity: 190, unit: 'sq ft' },
    ],
    days: [
      { offset: 0, status: 'full_day', crew: ['teddy', 'luis', 'benny'], weather: 'Clear', tempF: 70, review: 'approved', workDone: 'Removed the old walk, excavated.', built: [{ zone: 'walk', stage: 'excavated', quantity: 180 }],
        drops: [{ material: '3/4 in crushed stone base', quantity: 6, unit: 'ton', stagedAt: 'Street parking strip', ticket: 'QH-29811' }] },
      { offset: 1, status: 'full_day', crew: ['teddy', 'luis', 'benny'], weather: 'Clear', tempF: 72, review: 'approved', workDone: 'Base in two lifts, edge restraint.', built: [{ zone: 'walk', stage: 'base_placed', quantity: 180 }],
        lifts: [
          { zone: 'walk', material: '3/4 in crushed stone base', looseIn: 2.75, compactedIn: 2, passes: 3, compactor: 'plate-light', photo: 'lift' },
          { zone: 'walk', material: '3/4 in crushed stone base', looseIn: 2.75, compactedIn: 2, passes: 3, compactor: 'plate-light', photo: 'lift' },
        ] },
      { offset: 2, status: 'full_day', crew: ['teddy', 'luis', 'benny'], weather: 'Clear', tempF: 71, review: 'approved', workDone: 'Bedding screeded, pavers laid.', built: [{ zone: 'walk', stage: 'bedding', quantity: 180 }, { zone: 'walk', stage: 'laid', quantity: 110 }] },
      { offset: 3, status: 'full_day', crew: ['teddy', 'luis', 'benny'], weather: 'Hot', tempF: 88, review: 'approved', workDone: 'Cuts along the border (wet saw), soldier course.', built: [{ zone: 'walk', stage: 'laid', quantity: 70 }] },
      { offset: 4, status: 'full_day', crew: ['teddy', 'luis', 'benny'], weather: 'Clear', tempF: 80, review: 'approved', workDone: 'Settled the pavers; found a low spot and relaid it.' },
      { offset: 5, status: 'full_day', crew: ['teddy', 'luis', 'benny'], weather: 'Clear', tempF: 76, review: 'approved', workDone: 'Joint sand, final compaction, cleanup.', built: [{ zone: 'walk', stage: 'joints', quantity: 180 }] },
      { offset: 6, status: 'half_day', crew: ['teddy', 'luis'], hoursLost: 0, weather: 'Clear', tempF: 74, review: 'approved', workDone: 'Punch list: re-set two border units, sealed.', built: [{ zone: 'walk', stage: 'finished', quantity: 180 }] },
    ],
  },
  {
    // Bid tight for its size: the crew-days used still look fine, the rate already says over.
    key: 'marlow', name: 'Marlow Road driveway', customer: 'Everett Quaye', phone: '555-0175',
    email: 'e.quaye@demo.test', address: '56 Marlow Road, Quarry Hollow', status: 'active',
    crewDaysBid: 8, crewSize: 4, personHoursBid: 256, startedWorkingDaysAgo: 6, lead: 'lead2', homeownerUpdates: false,
    notes: 'Keep one lane of the drive open for the homeowner\'s car each evening.',
    zones: [{ key: 'drive', name: 'Driveway', kind: 'driveway', depthIn: 8, extensionIn: 8, areaSqFt: 900, crewDaysBid: 8 }],
    estimate: [{ material: '3/4 in crushed stone base', quantity: 40, unit: 'ton' }],
    days: [
      { offset: 0, status: 'full_day', crew: ['teddy', 'luis', 'benny', 'rory'], weather: 'Clear', tempF: 55, review: 'approved', workDone: 'Broke out the old asphalt, began the dig.', built: [{ zone: 'drive', stage: 'excavated', quantity: 300 }] },
      { offset: 1, status: 'full_day', crew: ['teddy', 'luis', 'benny', 'rory'], weather: 'Clear', tempF: 57, review: 'approved', workDone: 'Excavation; hit old footing rubble, hauled two loads.', built: [{ zone: 'drive', stage: 'excavated', quantity: 300 }] },
      { offset: 2, status: 'rain_out', crew: ['teddy', 'luis', 'benny', 'rory'], hoursLost: 8, lostReason: 'Steady rain', weather: 'Rain', rainIn: 1.1, tempF: 49, review: 'approved', workDone: 'Rained out.' },
      { offset: 3, status: 'full_day', crew: ['teddy', 'luis', 'benny', 'rory'], weather: 'Overcast', tempF: 51, review: 'approved', workDone: 'Finished the dig, proof-rolled the subgrade.', built: [{ zone: 'drive', stage: 'excavated', quantity: 300 }] },
      { offset: 4, status: 'half_day', crew: ['teddy', 'luis', 'benny', 'rory'], hoursLost: 4, lostReason: 'Rain from noon', weather: 'Showers', rainIn: 0.4, tempF: 50, review: 'approved', workDone: 'First base lift on the upper half.', built: [{ zone: 'drive', stage: 'base_placed', quantity: 200 }] },
      { offset: 5, status: 'full_day', crew: ['teddy', 'luis', 'benny', 'rory'], weather: 'Clear', tempF: 54, review: 'waiting', workDone: 'Base lifts on the lower half.', built: [{ zone: 'drive', stage: 'base_placed', quantity: 300 }] },
    ],
  },
  {
    key: 'pell', name: 'Pell Street drainage and side path', customer: 'Marguerite Pell', phone: '555-0163',
    email: 'm.pell@demo.test', address: '19 Pell Street, Quarry Hollow', status: 'planned',
    crewDaysBid: 6, crewSize: 3, personHoursBid: 144, startedWorkingDaysAgo: -5, lead: 'lead2', homeownerUpdates: false,
    notes: 'Call for locates before digging: the ticket must be active on the start date.',
    zones: [
      { key: 'drain', name: 'Side yard drain', kind: 'drainage', depthIn: 4, extensionIn: 0, lengthFt: 65 },
      { key: 'path', name: 'Side path', kind: 'walkway', depthIn: 4, extensionIn: 4, areaSqFt: 140 },
    ],
    estimate: [
      { material: 'Drainage stone 3/4 in clean', quantity: 6, unit: 'ton' },
      { material: 'Perforated drain pipe 4 in', quantity: 70, unit: 'ft' },
      { material: 'Nonwoven geotextile', quantity: 400, unit: 'sq ft' },
    ],
    days: [],
  },
]

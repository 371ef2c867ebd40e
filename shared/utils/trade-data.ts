// Trade figures the calculators check against, each with where it comes from. `basis` says how
// far to trust it: 'published' means a code, regulation or public-agency document says it and the
// figure was read there (the source names which); 'common practice' means crews, industry
// associations and makers' installation guides do it, with no single authority (makers' and trade
// associations' literature is common practice at best); 'from memory' means the figure was
// recalled, not read in the document, while this file was written: confirm it before relying on it.
// Local codes, the project's specifications and a licensed engineer override every value here.

export type TradeBasis = 'published' | 'common practice' | 'from memory'

export interface TradeSourced {
  source: string
  basis: TradeBasis
}

export interface TradeInches extends TradeSourced {
  valueIn: number
}

/** International Residential Code stair geometry, a reference: local codes differ. */
export const IRC_STAIR_LIMITS = {
  maxRiserIn: 7.75,
  minTreadIn: 10,
  maxRiserSpreadIn: 0.375,
  source: 'International Residential Code R311.7.5.1 (riser at most 7¾ in; largest riser at most 3/8 in above the smallest) and R311.7.5.2 (tread at least 10 in)',
  basis: 'published',
} as const satisfies TradeSourced & Record<string, unknown>

/** The smallest riser the model codes allow where they set one; a lower step is a trip hazard. */
export const MIN_RISER: TradeInches = {
  valueIn: 4,
  source: 'International Building Code 1011.5.2 (risers 4 in minimum); the IRC sets no minimum',
  basis: 'published',
}

/** Outdoor step proportion: twice the riser plus the tread. */
export const OUTDOOR_STEP_PROPORTION: TradeInches = {
  valueIn: 26,
  source: 'Harris & Dines, Time-Saver Standards for Landscape Architecture: exterior steps 2R + T = 26 in (e.g. 6 in riser / 14 in tread, 5 in / 16 in); recalled from memory',
  basis: 'from memory',
}

/**
 * The stride band the step plan checks 2R + T against, and the only one it cites: Blondel's step
 * formula, two risers and a tread make one comfortable stride. Both edges are comfortable.
 */
export const STRIDE_BAND = {
  minIn: 24,
  maxIn: 26,
  source: 'Blondel’s step formula (F. Blondel, Cours d’architecture, 1675) as restated in stair-design references: 2R + T from 24 to 26 in (about 61–66 cm); the handbook’s outdoor 26 in sits at the top edge; recalled from memory',
  basis: 'from memory',
} as const satisfies TradeSourced & Record<string, unknown>

/** IRC stair rules beyond riser and tread size: rails, guards, landings, tread uniformity. */
export const IRC_STAIR_RULES = {
  handrailMinRisers: 4,
  guardAboveGradeIn: 30,
  maxFlightRiseIn: 151,
  maxTreadSpreadIn: 0.375,
  source: 'International Residential Code (2018/2021 editions): R311.7.8 handrail on at least one side of a flight with 4 or more risers; R312.1.1 guards where the walking surface is more than 30 in above the floor or grade below within 36 in horizontally; R311.7.3 a flight rises at most 151 in between floor levels or landings; R311.7.5.2 the deepest tread at most 3/8 in deeper than the shallowest; recalled from memory, not read in the code book',
  basis: 'from memory',
} as const satisfies TradeSourced & Record<string, unknown>

export type CompactorClassId =
  | 'plate-light'
  | 'plate-medium'
  | 'plate-heavy'
  | 'plate-reversible'
  | 'rammer'
  | 'roller-small'

export interface CompactorClass extends TradeSourced {
  id: CompactorClassId
  label: string
  /** Rough operating weight, to tell the classes apart on a rental ticket. */
  weightLb: string
  /** Thickest loose lift this class compacts through in one layer. */
  maxLooseLiftIn: number
  bestFor: string
}

const COMPACTOR_SOURCE =
  'Typical figures from compactor makers\u2019 spec sheets and rental-yard charts, recalled from memory; the machine\u2019s own rating and the project specification govern'

/** Compactor classes, lightest first, with the thickest loose lift each handles. */
export const COMPACTOR_CLASSES: readonly CompactorClass[] = [
  { id: 'plate-light', label: 'Light plate compactor', weightLb: 'about 100–150 lb', maxLooseLiftIn: 4, bestFor: 'granular base and bedding in small areas', source: COMPACTOR_SOURCE, basis: 'from memory' },
  { id: 'plate-medium', label: 'Medium plate compactor', weightLb: 'about 150–250 lb', maxLooseLiftIn: 6, bestFor: 'granular base under walks and patios', source: COMPACTOR_SOURCE, basis: 'from memory' },
  { id: 'plate-heavy', label: 'Heavy plate compactor', weightLb: 'about 250–400 lb', maxLooseLiftIn: 8, bestFor: 'granular base under driveways, wall leveling pads', source: COMPACTOR_SOURCE, basis: 'from memory' },
  { id: 'plate-reversible', label: 'Reversible plate compactor', weightLb: 'about 400–900 lb', maxLooseLiftIn: 12, bestFor: 'thick granular base, wall backfill away from the face', source: COMPACTOR_SOURCE, basis: 'from memory' },
  { id: 'rammer', label: 'Rammer (jumping jack)', weightLb: 'about 130–170 lb', maxLooseLiftIn: 6, bestFor: 'cohesive soil and trench backfill in tight spots', source: COMPACTOR_SOURCE, basis: 'from memory' },
  { id: 'roller-small', label: 'Small vibratory roller (walk-behind, double drum)', weightLb: 'about 1,500–3,000 lb', maxLooseLiftIn: 8, bestFor: 'larger base areas, driveways', source: COMPACTOR_SOURCE, basis: 'from memory' },
]

export type BaseUse = 'walkway' | 'patio' | 'driveway' | 'wallLevelingPad'

// ICPI is the paver makers' industry institute, not a code body: its guides are common practice.
const ICPI_TOLERANCES =
  'ICPI (industry institute), Construction Tolerances and Recommendations for Interlocking Concrete Pavements: minimum base thickness'

/** Compacted base depth by use, on well-drained soil in a mild climate. */
export const BASE_DEPTH_BY_USE: Readonly<Record<BaseUse, TradeInches>> = {
  walkway: { valueIn: 4, source: `${ICPI_TOLERANCES}, sidewalks, patios and pedestrian areas 4 in (100 mm)`, basis: 'common practice' },
  patio: { valueIn: 4, source: `${ICPI_TOLERANCES}, sidewalks, patios and pedestrian areas 4 in (100 mm)`, basis: 'common practice' },
  driveway: { valueIn: 6, source: `${ICPI_TOLERANCES}, residential driveways 6 in (150 mm)`, basis: 'common practice' },
  wallLevelingPad: { valueIn: 6, source: 'Segmental retaining wall installation guides (NCMA practice, block makers): compacted granular leveling pad at least 6 in thick', basis: 'common practice' },
}

/** Deeper base where the ground freezes or drains slowly (clay). */
export const BASE_DEPTH_FROST_OR_CLAY: Readonly<Record<'walkway' | 'patio' | 'driveway', TradeInches>> = {
  walkway: { valueIn: 6, source: 'Paver contractors in freeze-thaw regions: about 6 in under walks and patios', basis: 'common practice' },
  patio: { valueIn: 6, source: 'Paver contractors in freeze-thaw regions: about 6 in under walks and patios', basis: 'common practice' },
  driveway: { valueIn: 10, source: 'Paver contractors in freeze-thaw regions: about 10 in under driveways', basis: 'common practice' },
}

/** Sand bedding under pavers, after the pavers are compacted into it. */
export const BEDDING_SAND: TradeInches = {
  valueIn: 1,
  source: 'ICPI (industry institute), Construction Tolerances and Recommendations for Interlocking Concrete Pavements: bedding layer 1 in (25 mm) nominal',
  basis: 'common practice',
}

/** Chip-stone bedding, the common alternative to sand. */
export const BEDDING_CHIP_STONE: TradeInches & { material: string } = {
  valueIn: 1,
  material: '1/4 in chip stone (about ASTM No. 8 or No. 89 size)',
  source: 'Paver installers: about 1 in of 1/4 in chip stone screeded over the base',
  basis: 'common practice',
}

/** Base over a drain line that runs under pavers. */
export const DRAIN_COVER_UNDER_PAVERS: TradeInches = {
  valueIn: 4,
  source: 'Paver installers: at least about 4 in of compacted base between a drain pipe and the bedding, so the pipe does not print through or get crushed; no code sets it',
  basis: 'common practice',
}

/** Least fall for a perforated or solid drain line. */
export const DRAIN_MIN_SLOPE = {
  valuePercent: 1,
  source: 'Landscape drainage practice: at least 1% (about 1/8 in per foot) so the line drains and does not silt up',
  basis: 'common practice',
} as const satisfies TradeSourced & Record<string, unknown>

/** How far the compacted base should reach past the edge it carries. */
export const BASE_EXTENSION_RULES = {
  wall: {
    valueIn: 6,
    source: 'Segmental retaining wall installation guides (NCMA practice, block makers): leveling pad about 6 in in front of the block face and 6 in behind the block',
    basis: 'common practice',
  },
  pavement: {
    valueIn: 6,
    source: 'ICPI (industry institute), Construction Tolerances and Recommendations: over-excavation the greater of 6 in (150 mm) or the base thickness; ICPI Tech Spec 3: base extends past the edge restraint at least its own thickness',
    basis: 'common practice',
  },
  steps: {
    valueIn: 6,
    source: 'Block-step installers: base pad about 6 in past the step units on each exposed side, as for a wall leveling pad',
    basis: 'common practice',
  },
} as const satisfies Record<string, TradeInches>

export interface GeotextileOverlap extends TradeSourced {
  subgrade: string
  minOverlapIn: number | null
  maxOverlapIn: number | null
  sewn: 'no' | 'or sewn' | 'sewn'
}

// FHWA is a public agency, but the figures were taken from makers' reproductions of its table,
// not read in the manual: from memory until someone checks the page.
const FHWA_OVERLAP =
  'FHWA NHI-07-092, Geosynthetic Design & Construction Guidelines (Holtz, Christopher, Berg, 2008), overlap for separation and stabilization; values as reproduced in manufacturer literature, the manual page itself not checked, so recalled from memory'

/** Geotextile overlap between strips by subgrade strength (CBR). */
export const GEOTEXTILE_OVERLAPS: readonly GeotextileOverlap[] = [
  { subgrade: 'CBR above 3 (firm)', minOverlapIn: 12, maxOverlapIn: 18, sewn: 'no', source: FHWA_OVERLAP, basis: 'from memory' },
  { subgrade: 'CBR 1 to 3', minOverlapIn: 24, maxOverlapIn: 39, sewn: 'no', source: FHWA_OVERLAP, basis: 'from memory' },
  { subgrade: 'CBR 0.5 to 1', minOverlapIn: 39, maxOverlapIn: null, sewn: 'or sewn', source: FHWA_OVERLAP, basis: 'from memory' },
  { subgrade: 'CBR below 0.5 (very soft)', minOverlapIn: null, maxOverlapIn: null, sewn: 'sewn', source: FHWA_OVERLAP, basis: 'from memory' },
]

/** Starting figures for a takeoff when the supplier's ticket is not at hand. */
export const AGGREGATE_TYPICALS = {
  compactionFactor: {
    value: 1.25,
    source: 'Hardscape estimating: order about 20–30% more loose base than the compacted volume',
    basis: 'common practice',
  },
  denseGradedBaseTonsPerCuYd: {
    value: 1.4,
    source: 'Quarry and supplier tickets for 3/4 in minus crushed base, loose: about 1.3–1.5 tons per cubic yard; recalled from memory, use your supplier\u2019s figure',
    basis: 'from memory',
  },
} as const satisfies Record<string, TradeSourced & { value: number }>

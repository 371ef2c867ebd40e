// The figures the Plan screen starts a takeoff from, and how it rounds and grades, each with its
// basis and source as in trade-data.ts. None is a code value: the supplier's ticket, the maker's
// sheet and the project specification replace every one of them.
import type { TradeSourced } from './trade-data'

type Figure = TradeSourced & { value: number }

/** Fractions shown beside decimals: the finest mark on a crew's tape. */
export const TAPE_FRACTION = {
  denominator: 16,
  source: 'Common practice: US tape measures are marked in sixteenths of an inch; Tamp rounds fractions to the nearest 1/16 in',
  basis: 'common practice',
} as const satisfies TradeSourced & Record<string, unknown>

/** Where a base-extension shortfall turns from "short" (warn) to "far short" (fail). */
export const EXTENSION_FAIL_FRACTION: Figure = {
  value: 0.5,
  source: 'Tamp\u2019s own threshold, no standard sets it: short of the rule warns; under half of it fails, because the block toe or the edge restraint\u2019s spikes then sit at the edge of the base',
  basis: 'common practice',
}

/** How the Plan screen rounds a result up before it goes on the estimate. */
export const ESTIMATE_ROUNDING = {
  tons: { value: 0.5, source: 'Common practice: quarries and yards sell bulk aggregate by the half ton; Tamp rounds tons up to the next 0.5', basis: 'common practice' },
  cubicYards: { value: 0.25, source: 'Common practice: yards load bulk material by the quarter yard; Tamp rounds cubic yards up to the next 0.25', basis: 'common practice' },
  wholeUnits: { value: 1, source: 'Common practice: fabric (sq ft), pipe (ft), block, caps, pavers, bags and spikes are ordered in whole units; Tamp rounds up', basis: 'common practice' },
} as const satisfies Record<string, Figure>

/** The riser and tread the step calculator starts from, before the crew types its own. */
export const DEFAULT_STEP = {
  riserIn: 6,
  treadIn: 14,
  source: 'Harris & Dines, Time-Saver Standards for Landscape Architecture: 6 in riser and 14 in tread as a comfortable exterior step (2R + T = 26 in); recalled from memory',
  basis: 'from memory',
} as const satisfies TradeSourced & Record<string, unknown>

/** Cut-and-breakage allowance hints for pavers, by layout. */
export const PAVER_WASTE = {
  square: { value: 5, source: 'Paver installers and estimating guides: about 5% for a rectangular area in a simple pattern; recalled from memory', basis: 'from memory' },
  curved: { value: 12.5, source: 'Paver installers and estimating guides: about 10\u201315% with curves, angles or a herringbone; recalled from memory (12.5% is the middle)', basis: 'from memory' },
} as const satisfies Record<string, Figure>

/** Spike spacing along a plastic or metal edge restraint. */
export const EDGE_SPIKE_SPACING_IN: Figure = {
  value: 12,
  source: 'Edge-restraint makers\u2019 installation sheets: a spike about every 12 in, closer on curves; makers\u2019 literature recalled from memory',
  basis: 'from memory',
}

/** Dry joint sand, to turn the joint volume into bags. */
export const JOINT_SAND_LB_PER_CU_FT: Figure = {
  value: 100,
  source: 'Dry sand weighs roughly 90\u2013110 lb per cubic foot; recalled from memory, use the weight printed on the bag',
  basis: 'from memory',
}

/** Joint width between pavers with spacer bars. */
export const PAVER_JOINT_IN: Figure = {
  value: 0.125,
  source: 'Concrete paver makers: spacer nibs give joints of about 1/16 to 3/16 in; 1/8 in is typical; makers\u2019 literature recalled from memory',
  basis: 'from memory',
}

/** How much a bank cubic yard of soil grows once dug and loaded. */
export const SOIL_SWELL_FACTOR: Figure = {
  value: 1.25,
  source: 'Earthmoving practice: common earth swells about 20\u201330% when dug (sand less, clay more); the equipment makers\u2019 handbook tables give the ranges; recalled from memory',
  basis: 'from memory',
}

/** A single-axle dump truck's usual load, the default truck size. */
export const DUMP_TRUCK_CU_YD: Figure = {
  value: 10,
  source: 'Common practice: a tandem dump hauls about 10\u201314 cu yd of soil, a single axle about 5\u20138; Tamp starts at 10 and the user sets the truck; recalled from memory',
  basis: 'from memory',
}

/** Drainage aggregate behind a segmental retaining wall, measured from the back of the block. */
export const WALL_DRAIN_AGGREGATE_WIDTH_IN: Figure = {
  value: 12,
  source: 'Segmental retaining wall installation guides (NCMA and block makers): at least 12 in of clean drainage aggregate behind the block; industry literature recalled from memory',
  basis: 'from memory',
}

/** How deep the first course of a segmental wall is buried. */
export const WALL_EMBEDMENT = {
  minIn: 6,
  perHeight: 1 / 8,
  source: 'Segmental retaining wall installation guides (block makers): bury at least 6 in, or about 1 in for every 8 in of wall height, whichever is more; NCMA design practice ties it to the slope below the toe; makers\u2019 literature recalled from memory',
  basis: 'from memory',
} as const satisfies TradeSourced & Record<string, unknown>

/** Where tiered walls start acting as one wall. */
export const TIER_SETBACK_PER_HEIGHT: Figure = {
  value: 2,
  source: 'Segmental retaining wall practice (NCMA): an upper tier set back less than about twice the lower wall\u2019s height loads the lower wall and the pair must be designed together; recalled from memory',
  basis: 'from memory',
}

/** Keep heavy compaction equipment back from the face of a new wall. */
export const HEAVY_COMPACTOR_CLEARANCE_IN: Figure = {
  value: 36,
  source: 'Segmental retaining wall installation guides (NCMA and block makers): within about 3 ft of the back of the block use only a walk-behind plate compactor; recalled from memory',
  basis: 'from memory',
}

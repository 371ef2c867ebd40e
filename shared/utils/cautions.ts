// Safety cautions the screens show beside a calculation, in English and Spanish. They point to
// the rule and defer to it: Tamp does not design walls or trench protection, and local codes and
// licensed professionals decide.
import { DEFER_EN, DEFER_ES, LIFTING_CAUTIONS, TRENCH_CAUTIONS, WALL_CAUTIONS } from './cautions-site'
import { requireNonNegativeNumber } from './planning-guards'
import { IRC_STAIR_LIMITS, type TradeBasis } from './trade-data'
import { LIFTING_INDEX_LIMIT, NIOSH_LIFTING } from './trade-data-lifting'

export type CautionId =
  | 'wall-engineered-design'
  | 'wall-tiered'
  | 'wall-slope-below'
  | 'wall-water'
  | 'wall-compactor-near-face'
  | 'trench-protective-system'
  | 'trench-engineer-20ft'
  | 'trench-egress'
  | 'trench-air-test'
  | 'trench-engine-exhaust'
  | 'trench-spoil-back'
  | 'trench-daily-inspection'
  | 'call-before-digging'
  | 'silica-cut-wet'
  | 'stairs-local-code'
  | 'heavy-unit-lift'
  | 'lifting-index-over'

export interface Caution {
  id: CautionId
  en: string
  es: string
  source: string
  basis: TradeBasis
}

/** A wall taller than this, bottom of the leveling pad to top of the cap, needs an engineer (IRC R105.2, NCMA). */
export const WALL_ENGINEERING_HEIGHT_IN = 48
/** A trench this deep or deeper needs a protective system (OSHA 1926.652(a)(1)). */
export const TRENCH_PROTECTION_DEPTH_IN = 60
/** A trench this deep or deeper needs a way out within 25 ft (OSHA 1926.651(c)(2)). */
export const TRENCH_EGRESS_DEPTH_IN = 48
/** A trench deeper than this needs its air tested where it may be bad (OSHA 1926.651(g)(1)(i)). */
export const TRENCH_AIR_TEST_DEPTH_IN = 48
/** A trench deeper than this needs a protective system designed by a registered engineer (OSHA 1926.652(b), (c)). */
export const TRENCH_ENGINEER_DEPTH_IN = 240
/** A unit heavier than this is over the NIOSH load constant: no one should lift it alone. */
export const HEAVY_UNIT_LB = NIOSH_LIFTING.loadConstantLb

const CAUTION_LIST: readonly Caution[] = [
  {
    id: 'wall-engineered-design',
    en: 'A wall over about 4 ft tall, measured from the bottom of the leveling pad (buried course included) to the top of the cap, or any wall with a load above it (a slope, a driveway, parking, a building), needs a design by a qualified engineer and often a building permit.' + DEFER_EN,
    es: 'Un muro de más de unos 4 pies (1.2 m) de alto, medido desde el fondo de la base de nivelación (incluida la hilada enterrada) hasta lo alto de la tapa, o cualquier muro con una carga encima (un talud, una entrada de autos, estacionamiento, un edificio), necesita un diseño de un ingeniero calificado y muchas veces un permiso de construcción.' + DEFER_ES,
    source: 'NCMA, Design Manual for Segmental Retaining Walls: engineered design above about 4 ft or with a surcharge; IRC R105.2 and IBC 105.2 exempt from permit only retaining walls not over 4 ft from the bottom of the footing to the top of the wall and not supporting a surcharge',
    basis: 'published',
  },
  ...WALL_CAUTIONS,
  {
    id: 'trench-protective-system',
    en: 'A trench 5 ft deep or more needs a protective system (sloping, benching, shoring or a trench shield) before anyone steps in, unless it is entirely in stable rock. A shallower trench needs one too when a competent person sees signs of a cave-in.' + DEFER_EN,
    es: 'Una zanja de 5 pies (1.5 m) de profundidad o más necesita un sistema de protección (talud, escalonado, apuntalamiento o caja de zanja) antes de que alguien entre, salvo que sea toda en roca estable. Una zanja menos profunda también lo necesita cuando una persona competente ve señales de derrumbe.' + DEFER_ES,
    source: 'OSHA 29 CFR 1926.652(a)(1)',
    basis: 'published',
  },
  ...TRENCH_CAUTIONS,
  {
    id: 'call-before-digging',
    en: 'Call the utility-locate service before digging (811 in the US) and wait until the lines are marked. Dig by hand near the marks.' + DEFER_EN,
    es: 'Llame al servicio de localización de líneas de servicios antes de excavar (811 en EE. UU.) y espere a que marquen las líneas. Excave a mano cerca de las marcas.' + DEFER_ES,
    source: '811 Call Before You Dig (Common Ground Alliance); state one-call laws set the notice period and the hand-dig zone',
    basis: 'published',
  },
  {
    id: 'silica-cut-wet',
    en: 'Cutting block or pavers raises respirable crystalline silica dust. Cut wet, with a saw that feeds water to the blade, and wear the respirator the rule calls for.' + DEFER_EN,
    es: 'Cortar bloques o adoquines levanta polvo de sílice cristalina respirable. Corte en húmedo, con una sierra que alimente agua al disco, y use el respirador que pide la norma.' + DEFER_ES,
    source: 'OSHA 29 CFR 1926.1153, Table 1 (handheld power saws: integrated water delivery to the blade)',
    basis: 'published',
  },
  {
    id: 'stairs-local-code',
    en: 'Step and stair rules differ by local code. The IRC R311.7 (riser at most 7¾ in, tread at least 10 in, risers within 3/8 in of each other) is a reference, not your local rule: check it before you build.' + DEFER_EN,
    es: 'Las reglas para escalones y escaleras cambian según el código local. El IRC R311.7 (contrahuella de 7¾ pulgadas como máximo, huella de 10 pulgadas como mínimo, contrahuellas con no más de 3/8 de pulgada de diferencia) es una referencia, no su regla local: verifíquela antes de construir.' + DEFER_ES,
    source: IRC_STAIR_LIMITS.source,
    basis: IRC_STAIR_LIMITS.basis,
  },
  {
    id: 'heavy-unit-lift',
    en: 'Units this heavy need lifting help: lift with two people, a block clamp or a lifting device, keep the load close and do not twist.' + DEFER_EN,
    es: 'Piezas tan pesadas necesitan ayuda para levantarlas: levántelas entre dos personas, con una pinza para bloques o con un equipo de levante, mantenga la carga cerca del cuerpo y no gire la espalda.' + DEFER_ES,
    source: 'NIOSH Revised Lifting Equation (Waters et al., 1994; NIOSH publication 94-110): 51 lb (23 kg) load constant, the most one person should lift even in ideal conditions; Tamp cautions above 51 lb',
    basis: 'published',
  },
  ...LIFTING_CAUTIONS,
]

/** Every caution, by id. */
export const CAUTIONS: Readonly<Record<CautionId, Caution>> = Object.fromEntries(
  CAUTION_LIST.map(caution => [caution.id, caution]),
) as Record<CautionId, Caution>

/** Every caution id, in the order the screens show them. */
export const CAUTION_IDS: readonly CautionId[] = CAUTION_LIST.map(caution => caution.id)

export interface CautionFacts {
  /** Total wall height, bottom of the leveling pad to top of the cap, in inches. */
  wallHeightIn?: number
  /** True when the wall carries a load above it: a slope, driveway, parking, a structure. */
  wallSurcharge?: boolean
  /** True when a wall is being built (backfill is compacted behind it). */
  wall?: boolean
  wallTiered?: boolean
  wallSlopeBelow?: boolean
  wallWaterBehind?: boolean
  trenchDepthIn?: number
  /** True when a gasoline plate or rammer runs in the trench. */
  gasEngineInTrench?: boolean
  digging?: boolean
  cutting?: boolean
  steps?: boolean
  unitWeightLb?: number
  /** The NIOSH lifting index of the lift as set up (Infinity when beyond the equation's range). */
  liftingIndex?: number
}

/** The ids of the cautions that apply to a job, in display order. */
export function cautionsFor(facts: CautionFacts): CautionId[] {
  const wallHeightIn = facts.wallHeightIn === undefined ? 0 : requireNonNegativeNumber('wallHeightIn', facts.wallHeightIn)
  const trenchDepthIn = facts.trenchDepthIn === undefined ? 0 : requireNonNegativeNumber('trenchDepthIn', facts.trenchDepthIn)
  const unitWeightLb = facts.unitWeightLb === undefined ? 0 : requireNonNegativeNumber('unitWeightLb', facts.unitWeightLb)
  const index = facts.liftingIndex
  // Infinity is a real answer here (a factor beyond the equation's range); NaN and negatives are not.
  if (index !== undefined && (typeof index !== 'number' || Number.isNaN(index) || index < 0)) {
    throw new RangeError(`liftingIndex must be 0 or more, got ${String(index)}`)
  }
  const trench = trenchDepthIn > 0

  const applies: Record<CautionId, boolean> = {
    'wall-engineered-design': wallHeightIn > WALL_ENGINEERING_HEIGHT_IN || facts.wallSurcharge === true,
    'wall-tiered': facts.wallTiered === true,
    'wall-slope-below': facts.wallSlopeBelow === true,
    'wall-water': facts.wallWaterBehind === true,
    'wall-compactor-near-face': facts.wall === true,
    'trench-protective-system': trenchDepthIn >= TRENCH_PROTECTION_DEPTH_IN,
    'trench-engineer-20ft': trenchDepthIn > TRENCH_ENGINEER_DEPTH_IN,
    'trench-egress': trenchDepthIn >= TRENCH_EGRESS_DEPTH_IN,
    'trench-air-test': trenchDepthIn > TRENCH_AIR_TEST_DEPTH_IN,
    'trench-engine-exhaust': trench && facts.gasEngineInTrench === true,
    'trench-spoil-back': trench,
    'trench-daily-inspection': trench,
    'call-before-digging': facts.digging === true || trench,
    'silica-cut-wet': facts.cutting === true,
    'stairs-local-code': facts.steps === true,
    'heavy-unit-lift': unitWeightLb > HEAVY_UNIT_LB,
    'lifting-index-over': index !== undefined && index > LIFTING_INDEX_LIMIT.value,
  }
  return CAUTION_IDS.filter(id => applies[id])
}

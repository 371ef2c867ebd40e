// Safety cautions the screens show beside a calculation, in English and Spanish. They point to
// the rule and defer to it: Tamp does not design walls or trench protection, and local codes and
// licensed professionals decide.
import { requireNonNegativeNumber } from './planning-guards'
import { IRC_STAIR_LIMITS, type TradeBasis } from './trade-data'

export type CautionId =
  | 'wall-engineered-design'
  | 'trench-protective-system'
  | 'call-before-digging'
  | 'silica-cut-wet'
  | 'stairs-local-code'
  | 'heavy-unit-lift'

export interface Caution {
  id: CautionId
  en: string
  es: string
  source: string
  basis: TradeBasis
}

/** A wall taller than this, bottom of the leveling pad to top of wall, needs an engineer. */
export const WALL_ENGINEERING_HEIGHT_IN = 48
/** A trench this deep or deeper needs a protective system. */
export const TRENCH_PROTECTION_DEPTH_IN = 60
/** A unit heavier than this needs lifting help. */
export const HEAVY_UNIT_LB = 50

const DEFER_EN = ' Local codes and licensed professionals have the final word.'
const DEFER_ES = ' El código local y los profesionales con licencia tienen la última palabra.'

const CAUTION_LIST: readonly Caution[] = [
  {
    id: 'wall-engineered-design',
    en: 'A wall over about 4 ft tall, measured from the bottom of the leveling pad (buried course included) to the top, or any wall with a load above it (a slope, a driveway, parking, a building), needs a design by a qualified engineer and often a building permit.' + DEFER_EN,
    es: 'Un muro de más de unos 4 pies (1.2 m) de alto, medido desde el fondo de la base de nivelación (incluida la hilada enterrada) hasta arriba, o cualquier muro con una carga encima (un talud, una entrada de autos, estacionamiento, un edificio), necesita un diseño de un ingeniero calificado y muchas veces un permiso de construcción.' + DEFER_ES,
    source: 'NCMA, Design Manual for Segmental Retaining Walls: engineered design above about 4 ft or with a surcharge; IRC R105.2 and IBC 105.2 exempt from permit only retaining walls not over 4 ft from the bottom of the footing to the top of the wall and not supporting a surcharge',
    basis: 'published',
  },
  {
    id: 'trench-protective-system',
    en: 'A trench 5 ft deep or more needs a protective system (sloping, benching, shoring or a trench shield) before anyone steps in, unless it is entirely in stable rock. A shallower trench needs one too when a competent person sees signs of a cave-in.' + DEFER_EN,
    es: 'Una zanja de 5 pies (1.5 m) de profundidad o más necesita un sistema de protección (talud, escalonado, apuntalamiento o caja de zanja) antes de que alguien entre, salvo que sea toda en roca estable. Una zanja menos profunda también lo necesita cuando una persona competente ve señales de derrumbe.' + DEFER_ES,
    source: 'OSHA 29 CFR 1926.652(a)(1)',
    basis: 'published',
  },
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
    source: 'NIOSH Revised Lifting Equation (Waters et al., 1994): 51 lb (23 kg) load constant, the most one person should lift even in ideal conditions; Tamp cautions above 50 lb',
    basis: 'published',
  },
]

/** Every caution, by id. */
export const CAUTIONS: Readonly<Record<CautionId, Caution>> = Object.fromEntries(
  CAUTION_LIST.map(caution => [caution.id, caution]),
) as Record<CautionId, Caution>

/** Every caution id, in the order the screens show them. */
export const CAUTION_IDS: readonly CautionId[] = CAUTION_LIST.map(caution => caution.id)

export interface CautionFacts {
  /** Total wall height, bottom of the leveling pad to top of wall, in inches. */
  wallHeightIn?: number
  /** True when the wall carries a load above it: a slope, driveway, parking, a structure. */
  wallSurcharge?: boolean
  trenchDepthIn?: number
  digging?: boolean
  cutting?: boolean
  steps?: boolean
  unitWeightLb?: number
}

/** The ids of the cautions that apply to a job, in display order. */
export function cautionsFor(facts: CautionFacts): CautionId[] {
  const wallHeightIn = facts.wallHeightIn === undefined ? 0 : requireNonNegativeNumber('wallHeightIn', facts.wallHeightIn)
  const trenchDepthIn = facts.trenchDepthIn === undefined ? 0 : requireNonNegativeNumber('trenchDepthIn', facts.trenchDepthIn)
  const unitWeightLb = facts.unitWeightLb === undefined ? 0 : requireNonNegativeNumber('unitWeightLb', facts.unitWeightLb)

  const applies: Record<CautionId, boolean> = {
    'wall-engineered-design': wallHeightIn > WALL_ENGINEERING_HEIGHT_IN || facts.wallSurcharge === true,
    'trench-protective-system': trenchDepthIn >= TRENCH_PROTECTION_DEPTH_IN,
    'call-before-digging': facts.digging === true || trenchDepthIn > 0,
    'silica-cut-wet': facts.cutting === true,
    'stairs-local-code': facts.steps === true,
    'heavy-unit-lift': unitWeightLb > HEAVY_UNIT_LB,
  }
  return CAUTION_IDS.filter(id => applies[id])
}

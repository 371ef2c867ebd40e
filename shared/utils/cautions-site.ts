// The cautions for trenches, wall building and lifting, in English and Spanish, beside those of
// cautions.ts. Like them, each points to its rule and defers to it and to licensed practice; the
// sources are named, and marked from memory where the rule was recalled rather than read.
import type { Caution } from './cautions'
import { HEAVY_COMPACTOR_CLEARANCE_IN, TIER_SETBACK_PER_HEIGHT, WALL_DRAIN_AGGREGATE_WIDTH_IN } from './trade-data-takeoff'
import { LIFTING_INDEX_LIMIT } from './trade-data-lifting'

export const DEFER_EN = ' Local codes and licensed professionals have the final word.'
export const DEFER_ES = ' El código local y los profesionales con licencia tienen la última palabra.'

const SUBPART_P = 'OSHA 29 CFR 1926 Subpart P (Excavations)'

export const TRENCH_CAUTIONS: readonly Caution[] = [
  {
    id: 'trench-spoil-back',
    en: 'Keep the spoil pile, block, pipe and machines at least 2 ft back from the edge of the trench, or hold them back with a barrier.' + DEFER_EN,
    es: 'Mantenga la tierra sacada, los bloques, los tubos y las máquinas por lo menos a 2 pies (0.6 m) del borde de la zanja, o deténgalos con una barrera.' + DEFER_ES,
    source: `${SUBPART_P}, 1926.651(j)(2): materials and equipment at least 2 ft from the edge of an excavation, or retained; recalled from memory`,
    basis: 'from memory',
  },
  {
    id: 'trench-daily-inspection',
    en: 'A competent person inspects the trench, the ground around it and any protective system every day before work, after every rain and whenever conditions change, and gets everyone out at any sign of a cave-in.' + DEFER_EN,
    es: 'Una persona competente revisa la zanja, el terreno alrededor y cualquier sistema de protección cada día antes del trabajo, después de cada lluvia y cada vez que cambian las condiciones, y saca a todos ante cualquier señal de derrumbe.' + DEFER_ES,
    source: `${SUBPART_P}, 1926.651(k)(1) and (k)(2): daily inspections by a competent person, after rainstorms and other hazard-increasing events; recalled from memory`,
    basis: 'from memory',
  },
  {
    id: 'trench-egress',
    en: 'A trench 4 ft deep or more needs a ladder, steps or a ramp so that nobody in it is more than 25 ft of travel from a way out.' + DEFER_EN,
    es: 'Una zanja de 4 pies (1.2 m) de profundidad o más necesita una escalera, escalones o una rampa, de modo que nadie adentro quede a más de 25 pies (7.6 m) de una salida.' + DEFER_ES,
    source: `${SUBPART_P}, 1926.651(c)(2): a stairway, ladder, ramp or other safe means of egress in trench excavations 4 ft or more deep, no more than 25 ft of lateral travel; recalled from memory`,
    basis: 'from memory',
  },
  {
    id: 'trench-air-test',
    en: 'Before anyone enters a trench deeper than 4 ft where the air may be low in oxygen or hazardous (near fill, a landfill, fuel tanks, sewers, or engines running), test the air.' + DEFER_EN,
    es: 'Antes de que alguien entre a una zanja de más de 4 pies (1.2 m) donde el aire pueda tener poco oxígeno o ser peligroso (cerca de rellenos, un basurero, tanques de combustible, drenajes, o con motores encendidos), mida el aire.' + DEFER_ES,
    source: `${SUBPART_P}, 1926.651(g)(1)(i): test the atmosphere before employees enter excavations greater than 4 ft deep where oxygen deficiency or a hazardous atmosphere exists or could reasonably be expected; recalled from memory`,
    basis: 'from memory',
  },
  {
    id: 'trench-engineer-20ft',
    en: 'A trench deeper than 20 ft needs its protective system designed by a registered professional engineer.' + DEFER_EN,
    es: 'Una zanja de más de 20 pies (6 m) de profundidad necesita que un ingeniero profesional registrado diseñe su sistema de protección.' + DEFER_ES,
    source: `${SUBPART_P}, 1926.652(b) and (c): sloping, benching and support systems for excavations over 20 ft deep are designed by a registered professional engineer; recalled from memory`,
    basis: 'from memory',
  },
  {
    id: 'trench-engine-exhaust',
    en: 'A gasoline plate compactor or rammer in a trench can fill it with carbon monoxide in minutes, with no smell. Use an electric or battery machine, or keep the engine out of the trench, ventilate and test the air; leave at any headache or dizziness.' + DEFER_EN,
    es: 'Una compactadora de placa o un apisonador a gasolina dentro de una zanja puede llenarla de monóxido de carbono en minutos, sin olor. Use una máquina eléctrica o de batería, o deje el motor fuera de la zanja, ventile y mida el aire; salga ante cualquier dolor de cabeza o mareo.' + DEFER_ES,
    source: 'NIOSH Alert, Preventing Carbon Monoxide Poisoning from Small Gasoline-Powered Engines and Tools (publication 96-118); OSHA 29 CFR 1926.651(g)(1) hazardous atmospheres; recalled from memory',
    basis: 'from memory',
  },
]

export const WALL_CAUTIONS: readonly Caution[] = [
  {
    id: 'wall-tiered',
    en: `Tiered walls: an upper wall set back less than about ${TIER_SETBACK_PER_HEIGHT.value} times the lower wall's height loads the lower wall, and the two must be designed together by a qualified engineer.` + DEFER_EN,
    es: `Muros escalonados: un muro de arriba retirado menos de unas ${TIER_SETBACK_PER_HEIGHT.value} veces la altura del muro de abajo le carga peso, y los dos deben diseñarse juntos por un ingeniero calificado.` + DEFER_ES,
    source: TIER_SETBACK_PER_HEIGHT.source,
    basis: TIER_SETBACK_PER_HEIGHT.basis,
  },
  {
    id: 'wall-slope-below',
    en: 'A slope below the toe of the wall takes away the ground that holds the wall in: the wall needs deeper burial and a design by a qualified engineer.' + DEFER_EN,
    es: 'Un talud debajo del pie del muro le quita el terreno que lo sostiene: el muro necesita ir más enterrado y un diseño de un ingeniero calificado.' + DEFER_ES,
    source: 'Segmental retaining wall design practice (NCMA Design Manual for Segmental Retaining Walls): embedment grows and global stability must be checked with a slope below the toe; industry literature recalled from memory',
    basis: 'from memory',
  },
  {
    id: 'wall-water',
    en: `Water behind a wall (a downspout, a spring, a slope draining toward it, an irrigated bed) pushes on it and washes out the backfill: keep at least ${WALL_DRAIN_AGGREGATE_WIDTH_IN.value} in of drainage stone behind the block with a drain pipe out to daylight, and have a qualified engineer look at it.` + DEFER_EN,
    es: `El agua detrás de un muro (una bajante, un manantial, un talud que escurre hacia él, un jardín regado) lo empuja y lava el relleno: deje por lo menos ${WALL_DRAIN_AGGREGATE_WIDTH_IN.value} pulgadas de piedra de drenaje detrás del bloque con un tubo de drenaje que salga a la superficie, y que lo revise un ingeniero calificado.` + DEFER_ES,
    source: `${WALL_DRAIN_AGGREGATE_WIDTH_IN.source}; water pressure behind a wall is a design case for the engineer`,
    basis: WALL_DRAIN_AGGREGATE_WIDTH_IN.basis,
  },
  {
    id: 'wall-compactor-near-face',
    en: `Within about ${HEAVY_COMPACTOR_CLEARANCE_IN.value / 12} ft of the back of the block, compact with a walk-behind plate only: a heavy plate or a roller there can push the block out of line or crack it.` + DEFER_EN,
    es: `A menos de unos ${HEAVY_COMPACTOR_CLEARANCE_IN.value / 12} pies (0.9 m) de la parte de atrás del bloque, compacte solo con una placa manual: una placa pesada o un rodillo ahí puede sacar el bloque de línea o rajarlo.` + DEFER_ES,
    source: HEAVY_COMPACTOR_CLEARANCE_IN.source,
    basis: HEAVY_COMPACTOR_CLEARANCE_IN.basis,
  },
]

export const LIFTING_CAUTIONS: readonly Caution[] = [
  {
    id: 'lifting-index-over',
    en: `This lift is over the recommended weight limit (lifting index above ${LIFTING_INDEX_LIMIT.value}): lift with two people, a block clamp or a machine, bring the load closer, raise the pallet, or cut the pace.` + DEFER_EN,
    es: `Este levantamiento pasa el límite de peso recomendado (índice de levantamiento mayor que ${LIFTING_INDEX_LIMIT.value}): levántelo entre dos personas, con una pinza para bloques o con una máquina, acerque la carga, suba la tarima o baje el ritmo.` + DEFER_ES,
    source: LIFTING_INDEX_LIMIT.source,
    basis: LIFTING_INDEX_LIMIT.basis,
  },
]

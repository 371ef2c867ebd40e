import type { ZoneKind } from '~~/shared/utils/daybook'
import { naturalUnits, type ProductionStage } from '~~/shared/utils/trade-data-production'

/** "Front walk: 120 sq ft, laid / built" in the user's language, for a quantity built. */
export function useBuiltWords() {
  const { t } = useI18n()
  return (q: { zoneName: string, zoneKind: string, stage: string, quantity: number, capLf?: number | null }) => {
    const unit = t(`built.unit.${naturalUnits[q.zoneKind as ZoneKind] ?? 'sq_ft'}`)
    const cap = q.capLf ? t('built.capShort', { feet: q.capLf }) : ''
    return `${q.zoneName}: ${q.quantity} ${unit}, ${t(`built.stage.${q.stage as ProductionStage}`)}${cap}`
  }
}

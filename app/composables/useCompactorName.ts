import { compactorClassOf } from '~~/shared/utils/lift-checks'

/** A compactor class in the user's language, older ids ('plate_medium') included; an id Tamp does not know is shown as sent. */
export function useCompactorName() {
  const { t, te } = useI18n()
  return (id: string): string => {
    const known = compactorClassOf(id)
    if (!known) return id
    return te(`compactor.${known.id}`) ? t(`compactor.${known.id}`) : known.label
  }
}

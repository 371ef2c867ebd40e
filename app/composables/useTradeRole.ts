/**
 * A crew member's trade role in the user's language. The office types roles as free text; the usual
 * ones (in either spelling: "Laborer", "labourer") have a translation, others show as typed.
 */
export function useTradeRole() {
  const { t, te } = useI18n()
  const spellings: Record<string, string> = { labourer: 'laborer', 'crew leader': 'crew_lead', operator: 'equipment_operator' }
  return (role: string | null | undefined): string => {
    if (!role) return ''
    const folded = role.trim().toLowerCase()
    const key = spellings[folded] ?? folded.replace(/[\s-]+/g, '_')
    return te(`tradeRole.${key}`) ? t(`tradeRole.${key}`) : role
  }
}

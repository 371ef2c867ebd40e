// The day sheet's map: the sections the crew lead can fold, each one tap away from the top with what
// is in it and what the foreman flagged there; a section holding a mistake to fix never stays folded.
import type { DayJump, DaySection } from '~/composables/useDayFolds'

interface DayMapInput {
  sheetId: Ref<string>
  form: { startedAt: string, finishedAt: string, weatherConditions: string, workDone: string }
  crew: Ref<Record<string, string>>
  errors: Ref<Record<string, string>>
  crewErrors: Ref<Record<string, string>>
}

export function useDayMap({ sheetId, form, crew, errors, crewErrors }: DayMapInput) {
  const store = useDaybookStore()
  const { t } = useI18n()
  const sectionFields: Partial<Record<DaySection, string[]>> = {
    clock: ['startedAt', 'finishedAt', 'breakMinutes', 'hoursLost', 'hoursLostReason'],
    weather: ['weatherConditions', 'rainIn', 'temperatureF'],
    notes: ['workDone', 'siteNotes', 'locateTicket'],
  }
  // A record of the section that the office refused waits for the crew lead to fix it: a mistake too.
  const refused = {
    drops: () => store.dropsOf(sheetId.value).some(r => store.stateOf('material_drop', r.id) === 'attention'),
    lifts: () => store.liftsOf(sheetId.value).some(r => store.stateOf('lift', r.id) === 'attention'),
    built: () => store.quantitiesOf(sheetId.value).some(r => store.stateOf('zone_quantity', r.id) === 'attention'),
  } as Partial<Record<DaySection, () => boolean>>
  const hasError = (section: DaySection) => section === 'crew'
    ? Object.keys(crewErrors.value).length > 0
    : (sectionFields[section] ?? []).some(field => errors.value[field]) || (refused[section]?.() ?? false)
  const flagSection: Partial<Record<string, DaySection>> = { lift: 'lifts', material_drop: 'drops', zone_quantity: 'built' }
  const foldedFlags = computed(() => store.flagsOfDay(sheetId.value).filter(f => flagSection[f.subjectType]))
  const flaggedIn = (section: DaySection) => foldedFlags.value.filter(f => flagSection[f.subjectType] === section).length
  const counts = computed<Partial<Record<DaySection, number>>>(() => ({
    crew: Object.keys(crew.value).length,
    drops: store.dropsOf(sheetId.value).length,
    lifts: store.liftsOf(sheetId.value).length,
    built: store.quantitiesOf(sheetId.value).length,
    photos: store.photosOf('day_sheet', sheetId.value).length,
  }))
  const sections: DaySection[] = ['clock', 'crew', 'weather', 'notes', 'drops', 'lifts', 'built', 'photos']
  const jumps = computed<DayJump[]>(() => sections.map(section => ({ section, title: t(`day.jump.${section}`), count: counts.value[section], flagged: flaggedIn(section) })))
  /** What a folded section's line says about it. */
  const summaries = computed<Record<DaySection, string>>(() => ({
    clock: form.startedAt && form.finishedAt ? `${form.startedAt}–${form.finishedAt}` : '',
    crew: t('today.crewCount', counts.value.crew ?? 0),
    weather: form.weatherConditions,
    notes: form.workDone.length > 40 ? `${form.workDone.slice(0, 40)}…` : form.workDone,
    drops: String(counts.value.drops),
    lifts: String(counts.value.lifts),
    built: String(counts.value.built),
    photos: String(counts.value.photos),
  }))
  const flagWords = (f: { subjectType: string, reason: string | null }) => `${f.subjectType === 'zone_quantity' ? t('built.flagSubject') : t(`flag.subject.${f.subjectType}`)} · ${t(`flag.reason.${f.reason ?? 'other'}`)}`

  return { jumps, summaries, foldedFlags, flaggedIn, hasError, flagSection, flagWords }
}

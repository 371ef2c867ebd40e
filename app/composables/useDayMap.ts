// The day sheet's map: the sections the crew lead can fold, each one tap away from the top with what
// is in it and what the foreman flagged there; a section holding a mistake to fix never stays folded.
import type { SyncKind } from '~~/shared/schemas/daybook'
import type { SnapshotFlag } from '~~/shared/types/snapshot'
import type { DayJump, DaySection } from '~/composables/useDayFolds'

interface DayMapInput {
  sheetId: Ref<string>
  form: { startedAt: string, finishedAt: string, weatherConditions: string, workDone: string }
  crew: Ref<Record<string, string>>
  errors: Ref<Record<string, string>>
  crewErrors: Ref<Record<string, string>>
}

/** A flag on a record in a section of its own, with that section and the flag in words. */
export interface SectionFlag { flag: SnapshotFlag, section: DaySection, words: string }

const sections: DaySection[] = ['clock', 'crew', 'weather', 'notes', 'drops', 'lifts', 'built', 'photos']
const sectionFields: Partial<Record<DaySection, string[]>> = {
  clock: ['startedAt', 'finishedAt', 'breakMinutes', 'hoursLost', 'hoursLostReason'],
  weather: ['weatherConditions', 'rainIn', 'temperatureF'],
  notes: ['workDone', 'siteNotes', 'locateTicket'],
}

export function useDayMap({ sheetId, form, crew, errors, crewErrors }: DayMapInput) {
  const store = useDaybookStore()
  const { t } = useI18n()
  const flagWords = useFlagWords()
  // The sections that list records: their kind (for the outbox's state and the foreman's flags) and records.
  const lists: Partial<Record<DaySection, { kind: SyncKind, records: () => { id: string }[] }>> = {
    drops: { kind: 'material_drop', records: () => store.dropsOf(sheetId.value) },
    lifts: { kind: 'lift', records: () => store.liftsOf(sheetId.value) },
    built: { kind: 'zone_quantity', records: () => store.quantitiesOf(sheetId.value) },
  }
  const sectionOf = (kind: string) => sections.find(section => lists[section]?.kind === kind)

  // A field with a mistake, or a record the office refused and the crew lead has to fix.
  function hasError(section: DaySection): boolean {
    if (section === 'crew') return Object.keys(crewErrors.value).length > 0
    const list = lists[section]
    return (sectionFields[section] ?? []).some(field => errors.value[field])
      || (list?.records().some(r => store.stateOf(list.kind, r.id) === 'attention') ?? false)
  }
  const sectionFlags = computed<SectionFlag[]>(() => store.flagsOfDay(sheetId.value).flatMap((flag) => {
    const section = sectionOf(flag.subjectType)
    return section ? [{ flag, section, words: `${flagWords.subject(flag)} · ${flagWords.reason(flag)}` }] : []
  }))
  const flaggedIn = (section: DaySection) => sectionFlags.value.filter(f => f.section === section).length
  const counts = computed<Partial<Record<DaySection, number>>>(() => ({
    crew: Object.keys(crew.value).length,
    photos: store.photosOf('day_sheet', sheetId.value).length,
    ...Object.fromEntries(sections.flatMap(section => (lists[section] ? [[section, lists[section].records().length]] : []))),
  }))
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

  return { jumps, summaries, sectionFlags, flaggedIn, hasError }
}

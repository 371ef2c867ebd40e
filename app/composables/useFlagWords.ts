// A foreman's flag in the crew lead's words: what it is on ("This lift", "Crew 1's 8 h", a photo's
// caption) and why. The flag's card and the day sheet's links to it say the same.
import type { SnapshotFlag } from '~~/shared/types/snapshot'

export function useFlagWords() {
  const { t, te } = useI18n()
  // Whose hours or which photo, from the snapshot the phone keeps: it reads the same with no signal.
  function subject(f: SnapshotFlag): string {
    if (f.subjectType === 'time_entry' && f.crewMemberName) return t('flag.hoursOf', { name: f.crewMemberName, hours: f.hours ?? 0 })
    if (f.subjectType === 'photo' && f.photoCaption) return t('flag.photoCaption', { caption: f.photoCaption })
    if (f.subjectType === 'photo' && f.photoOf) return t(`flag.photoOf.${f.photoOf}`)
    if (f.subjectType === 'zone_quantity') return t('built.flagSubject')
    return t(`flag.subject.${f.subjectType}`)
  }
  const reason = (f: SnapshotFlag) => (f.reason && te(`flag.reason.${f.reason}`) ? t(`flag.reason.${f.reason}`) : t('flag.reason.other'))
  return { subject, reason }
}

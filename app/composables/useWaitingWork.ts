import type { OutboxEntry } from '~/utils/outbox-types'
import type { RecordState } from '~/stores/daybook'

export type OutboxTone = 'done' | 'waiting' | 'problem'

/**
 * What waits on this phone and why, worked out in one place from the outbox and the connection, so that
 * no two parts of a screen can disagree: a day is "at the office" only when it and everything on it
 * are; "goes out when there is signal" only when there is none; a refusal says what is wrong.
 */
export function useWaitingWork() {
  const outbox = useOutboxStore()
  const store = useDaybookStore()
  const { t } = useI18n()

  /** The day sheet an outbox entry belongs to, if any (plan changes belong to none). */
  function daySheetOf(entry: OutboxEntry): string | undefined {
    const record = entry.record
    if (entry.kind === 'day_sheet') return entry.id
    if (entry.kind === 'photo') return entry.photo?.daySheetId
    if (entry.kind === 'flag_answer') return store.flagById(String(record?.flagId))?.daySheetId
    return typeof record?.daySheetId === 'string' ? record.daySheetId : undefined
  }

  /** A day as a whole: the worst state of the sheet and everything logged on it. */
  function dayState(sheetId: string): RecordState {
    const states = outbox.entries.filter(entry => daySheetOf(entry) === sheetId).map(entry => entry.state)
    if (states.some(state => state === 'attention' || state === 'conflict')) return 'attention'
    if (states.includes('sending')) return 'sending'
    return states.length ? 'on_phone' : 'saved'
  }

  const days = computed(() => new Set(outbox.entries.map(daySheetOf).filter(Boolean)).size)
  /** "1 day, 5 entries": what waits, counted as a person counts their work. */
  const waitingText = computed(() => {
    const entries = t('outbox.count.entries', outbox.waitingCount)
    return days.value ? `${t('outbox.count.days', days.value)}, ${entries}` : entries
  })
  const needsLook = computed(() => outbox.entries.filter(e => e.state === 'attention' || e.state === 'conflict').length)

  /** The sender's state in words, with its tone. */
  const status = computed<{ text: string, tone: OutboxTone }>(() => {
    const waiting = outbox.waitingCount
    if (outbox.status === 'signed_out') return { text: t('outbox.signedOut'), tone: 'problem' }
    if (outbox.status === 'access_ended') return { text: t('outbox.accessEnded'), tone: 'problem' }
    if (!waiting) return { text: t('outbox.allSent'), tone: 'done' }
    if (!outbox.online) return { text: t('outbox.offline'), tone: 'waiting' }
    if (outbox.status === 'sending') return { text: t('outbox.sending', { done: outbox.progress.records.done, total: outbox.progress.records.total }), tone: 'waiting' }
    if (needsLook.value === waiting) return { text: t('outbox.stuck', needsLook.value), tone: 'problem' }
    if (outbox.status === 'waiting_retry') return { text: t('outbox.retrying'), tone: 'problem' }
    return { text: t('outbox.notSent'), tone: 'waiting' }
  })

  return { daySheetOf, dayState, waitingText, needsLook, status }
}

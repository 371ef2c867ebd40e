import { idb } from '~/utils/idb'

interface DraftOptions<T> {
  /** One draft per form and record: `day:<job>:<date>`, `drop:new:<sheet>`, `lift:<id>`. */
  key: string
  /** The form's values as they are now (plain data). */
  read: () => T
  /** Puts a kept draft back into the form. */
  write: (value: T) => void
  /** Whether the form holds something not yet saved to the outbox. */
  dirty: () => boolean
}

/**
 * Keeps what a form holds in IndexedDB as it is typed, so that a reload, "← Today" or the phone
 * dropping the tab for the camera loses nothing; puts it back when the form opens again; asks before
 * leaving a form with unsaved changes. `clear()` once the form is saved to the outbox.
 */
export function useDraft<T>(options: DraftOptions<T>) {
  const { t } = useI18n()
  const restored = ref(false)
  // Nothing is written before the kept draft has been read back: an empty form must not overwrite it.
  let ready = false
  let timer: ReturnType<typeof setTimeout> | undefined

  async function save(): Promise<void> {
    clearTimeout(timer)
    if (!ready) return
    if (options.dirty()) await idb.put('drafts', options.key, { value: options.read(), savedAt: Date.now() })
    else await idb.remove('drafts', options.key)
  }
  const flush = () => void save()
  const onHidden = () => {
    if (document.visibilityState === 'hidden') flush()
  }
  function warn(event: BeforeUnloadEvent) {
    if (!options.dirty()) return
    event.preventDefault()
    // Older browsers show the prompt only when returnValue is set.
    event.returnValue = ''
  }

  watch(options.read, () => {
    clearTimeout(timer)
    timer = setTimeout(flush, 200)
  }, { deep: true })

  onMounted(async () => {
    const draft = await idb.get<{ value: T }>('drafts', options.key).catch(() => undefined)
    if (draft) {
      options.write(draft.value)
      restored.value = true
    }
    ready = true
    document.addEventListener('visibilitychange', onHidden)
    window.addEventListener('pagehide', flush)
    window.addEventListener('beforeunload', warn)
  })
  onBeforeUnmount(() => {
    document.removeEventListener('visibilitychange', onHidden)
    window.removeEventListener('pagehide', flush)
    window.removeEventListener('beforeunload', warn)
    flush()
  })
  // Leaving inside the app: the draft stays either way, but the crew lead is told it is not saved.
  onBeforeRouteLeave(() => !options.dirty() || window.confirm(t('draft.leave')))

  async function clear(): Promise<void> {
    clearTimeout(timer)
    restored.value = false
    await idb.remove('drafts', options.key)
  }

  return { restored, clear }
}

import type { z } from 'zod'

/**
 * What a lift's, a drop's and a built quantity's form share: the record checked with its schema (field errors in the
 * user's language), the day sheet saved first when it is new, the record and its photos queued on the
 * phone, then the form started again.
 */
export function useEntryForm<T extends { id: string }>(kind: 'lift' | 'material_drop' | 'zone_quantity', root: Ref<HTMLElement | undefined>, ensureSheet: () => Promise<boolean>) {
  const store = useDaybookStore()
  const { t } = useI18n()
  const { errors, formError, show } = useRecordErrors(kind, root)
  const files = ref<File[]>([])
  const busy = ref(false)

  async function submit(schema: z.ZodType<T>, candidate: unknown, save: (record: T) => Promise<void>, options: { caption?: string, done: () => void }): Promise<void> {
    formError.value = ''
    const result = schema.safeParse(candidate)
    if (!result.success) {
      show(result.error)
      return
    }
    errors.value = {}
    busy.value = true
    try {
      if (!(await ensureSheet())) {
        formError.value = t('day.fixSheetFirst')
        return
      }
      await save(result.data)
      // What got built carries no photo of its own (the day's photos show it).
      if (files.value.length && kind !== 'zone_quantity') await store.addPhotos(files.value, { type: kind, id: result.data.id }, options.caption)
      files.value = []
      options.done()
    }
    catch (e) {
      formError.value = e instanceof Error ? e.message : t('common.failed')
    }
    finally {
      busy.value = false
    }
  }

  return { errors, formError, files, busy, submit }
}

// Which sections of the day sheet the crew lead folded away, kept on this phone (localStorage) for
// every day they open: a lead who never logs weather folds it once. Read after the page has hydrated,
// so the server's rendering (everything open) and the first client render agree.
const STORAGE_KEY = 'tamp-day-folds'

export type DaySection = 'clock' | 'crew' | 'weather' | 'notes' | 'drops' | 'lifts' | 'built' | 'photos'

/** One line of the day's jump list: a section, how many records it holds, and its open flags. */
export interface DayJump { section: DaySection, title: string, count?: number, flagged?: number }

export function useDayFolds() {
  const folded = useState<DaySection[]>('day-folds', () => [])
  // Every section, the jump list and the sheet use this: the phone's copy is read once, by the first.
  const read = useState('day-folds-read', () => false)

  onMounted(() => {
    if (read.value) return
    read.value = true
    try {
      const kept = JSON.parse(localStorage.getItem(STORAGE_KEY) ?? '[]') as unknown
      if (Array.isArray(kept)) folded.value = kept.filter((s): s is DaySection => typeof s === 'string')
    }
    catch {
      // Unreadable: every section open, as on a new phone.
    }
  })

  function set(section: DaySection, fold: boolean): void {
    folded.value = fold ? [...new Set([...folded.value, section])] : folded.value.filter(s => s !== section)
    try {
      localStorage.setItem(STORAGE_KEY, JSON.stringify(folded.value))
    }
    catch {
      // A full or blocked storage only loses the remembered folds.
    }
  }

  /** Opens the section and brings it (or an element inside it, by id) into view below the header. */
  async function jumpTo(section: DaySection, targetId = `day-${section}`): Promise<void> {
    set(section, false)
    await nextTick()
    const target = document.getElementById(targetId) ?? document.getElementById(`day-${section}`)
    target?.scrollIntoView({ block: 'start' })
    target?.focus({ preventScroll: true })
  }

  return {
    isFolded: (section: DaySection) => folded.value.includes(section),
    fold: (section: DaySection) => set(section, true),
    unfold: (section: DaySection) => set(section, false),
    jumpTo,
  }
}

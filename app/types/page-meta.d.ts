// `roles` in definePageMeta, read by app/middleware/role.ts; `wide`, read by the default layout.
import type { Role } from '~~/shared/utils/daybook'

declare module '#app' {
  interface PageMeta {
    roles?: Role[]
    /** A page of tables (the office's): it takes a laptop's width instead of a phone column. */
    wide?: boolean
  }
}

export {}

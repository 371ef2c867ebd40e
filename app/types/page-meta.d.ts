// `roles` in definePageMeta, read by app/middleware/role.ts.
import type { Role } from '~~/shared/utils/daybook'

declare module '#app' {
  interface PageMeta {
    roles?: Role[]
  }
}

export {}

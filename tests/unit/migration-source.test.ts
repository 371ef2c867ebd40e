import { readdirSync } from 'node:fs'
import { resolve } from 'node:path'
import { describe, expect, it } from 'vitest'
import { migrations } from '../../db/migration-source'

describe('migration list', () => {
  it('names every file in db/migrations, so a new table is never left out of an upgrade', () => {
    const files = readdirSync(resolve(import.meta.dirname, '../../db/migrations')).filter(f => f.endsWith('.ts')).sort()
    expect(Object.keys(migrations).sort()).toEqual(files)
    for (const migration of Object.values(migrations)) {
      expect(typeof migration.up).toBe('function')
      expect(typeof migration.down).toBe('function')
    }
  })
})

// The crew's screens in English and Spanish: every text has both, with the same figures in it.
import { describe, expect, it } from 'vitest'
import en from '../../i18n/locales/en.json'
import es from '../../i18n/locales/es.json'

type Messages = { [key: string]: string | Messages }
const flatten = (messages: Messages, prefix = ''): [string, string][] =>
  Object.entries(messages).flatMap(([key, value]) => typeof value === 'string' ? [[`${prefix}${key}`, value] as [string, string]] : flatten(value, `${prefix}${key}.`))
const placeholders = (text: string) => [...text.matchAll(/\{(\w+)\}/g)].map(m => m[1]).sort()

describe('English and Spanish texts', () => {
  const english = new Map(flatten(en as Messages))
  const spanish = new Map(flatten(es as Messages))

  it('say everything in both languages, so a Spanish-speaking crew lead never meets a bare key or an English line', () => {
    expect([...english.keys()].filter(key => !spanish.has(key)), 'missing in Spanish').toEqual([])
    expect([...spanish.keys()].filter(key => !english.has(key)), 'missing in English').toEqual([])
  })

  it('carry the same figures in both languages ({hours}, {max}...), so no number drops out of a translated line', () => {
    const differing = [...english].filter(([key, text]) => spanish.has(key) && placeholders(text).join() !== placeholders(spanish.get(key)!).join())
    expect(differing.map(([key]) => key)).toEqual([])
  })
})

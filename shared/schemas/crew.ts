// The company's crew roster: everyone whose hours a crew lead logs, with or without a Tamp sign-in
// (most labourers never have one). The office keeps it; the phones get the active ones, and anyone
// taken off it who still has hours on the days a phone holds.
import { z } from 'zod'
import { personName } from './auth'

const tradeRole = z.string().trim().max(60, 'At most 60 characters').transform(value => value || null).nullable()
const phone = z.string().trim().max(40, 'At most 40 characters').regex(/^[\d\s()+.-]*$/, 'Digits, spaces and + ( ) - . only').transform(value => value || null).nullable()

export const crewMemberBody = z.strictObject({
  name: personName,
  /** Free text as the company says it ("Laborer", "Operator"); the usual ones are translated on the phone. */
  tradeRole: tradeRole.optional(),
  phone: phone.optional(),
})
export type CrewMemberBody = z.output<typeof crewMemberBody>

export const crewMemberPatchBody = z.strictObject({
  name: personName.optional(),
  tradeRole: tradeRole.optional(),
  phone: phone.optional(),
  /** Off: no longer offered on the phones; the hours already logged keep the name. */
  active: z.boolean().optional(),
}).refine(body => Object.values(body).some(value => value !== undefined), { message: 'Change the name, trade role, phone or active state' })
export type CrewMemberPatchBody = z.output<typeof crewMemberPatchBody>

export interface CrewMember { id: string, name: string, tradeRole: string | null, phone: string | null, active: boolean, hasSignIn: boolean }

import { randomUUID } from 'node:crypto'
import type { H3Event } from 'h3'
import type { Role } from '../../shared/utils/daybook'
import type { Member } from './members'
import { acceptInvitationBody, type AcceptRequestBody } from '../../shared/schemas/auth'

const invitationDays = 7

export interface InvitationView { id: string, email: string, role: Role, expiresAt: Date, createdAt: Date }

const columns = ['id', 'email', 'role', 'expires_at as expiresAt', 'created_at as createdAt']

export async function pendingInvitations(organisationId: string): Promise<InvitationView[]> {
  return await useDb()('invitations').where({ organisation_id: organisationId })
    .whereNull('accepted_at').whereNull('revoked_at').andWhereRaw('expires_at > NOW(3)')
    .orderBy('created_at', 'desc').select(columns)
}

async function mailInvitation(base: string, invitation: { email: string, role: Role }, token: string, inviter: Member): Promise<boolean> {
  const organisation = await useDb()('organisations').where({ id: inviter.organisationId }).first('name')
  const url = `${base}/invite?token=${token}`
  const roleName = { office: 'office', foreman: 'foreman', crew_lead: 'crew lead' }[invitation.role]
  const { text, html } = renderMail({
    heading: `${inviter.name} added you to ${organisation?.name ?? 'a company'} on Tamp`,
    paragraphs: [`You are invited as ${roleName}. Choose your name and a password to start using the daybook.`],
    action: { label: 'Accept the invitation', url },
    footnote: `This link works once and expires in ${invitationDays} days. If you did not expect it, ignore this message.`,
  })
  return await sendMail({ to: invitation.email, subject: `Your invitation to ${organisation?.name ?? 'Tamp'}`, text, html })
}

function expiry(): Date {
  return new Date(Date.now() + invitationDays * 24 * 3600_000)
}

export async function createInvitation(event: H3Event, inviter: Member, email: string, role: Role): Promise<{ invitation: InvitationView, mailSent: boolean }> {
  const base = linkBase(event)
  const existing = await useDb()('users as u').join('memberships as m', 'm.user_id', 'u.id')
    .where({ 'u.email': email, 'm.organisation_id': inviter.organisationId }).first('m.id')
  if (existing) throw createError({ statusCode: 409, statusMessage: 'That address already belongs to a member', data: { fieldErrors: { email: 'Already a member' } } })
  const { token, hash } = newToken()
  const id = randomUUID()
  await useDb().transaction(async (trx) => {
    // A new invitation replaces any earlier one for the same address.
    await trx('invitations').where({ organisation_id: inviter.organisationId, email }).whereNull('accepted_at').whereNull('revoked_at').update({ revoked_at: new Date() })
    await trx('invitations').insert({ id, organisation_id: inviter.organisationId, email, role, token_hash: hash, invited_by: inviter.userId, expires_at: expiry() })
    await audit(trx, inviter, 'invitation.created', 'invitation', id, { email, role })
  })
  const mailSent = await mailInvitation(base, { email, role }, token, inviter)
  const invitation = await useDb()('invitations').where({ id }).first(columns)
  return { invitation, mailSent }
}

export async function resendInvitation(event: H3Event, inviter: Member, id: string): Promise<{ invitation: InvitationView, mailSent: boolean }> {
  const base = linkBase(event)
  const row = await useDb()('invitations').where({ id, organisation_id: inviter.organisationId }).whereNull('accepted_at').whereNull('revoked_at').first()
  if (!row) throw createError({ statusCode: 404, statusMessage: 'No such open invitation' })
  const { token, hash } = newToken()
  await useDb()('invitations').where({ id }).update({ token_hash: hash, expires_at: expiry(), updated_at: new Date() })
  // The new token replaces the old one: the link mailed before stops working.
  const mailSent = await mailInvitation(base, row, token, inviter)
  return { invitation: await useDb()('invitations').where({ id }).first(columns), mailSent }
}

export async function revokeInvitation(inviter: Member, id: string): Promise<void> {
  const changed = await useDb()('invitations').where({ id, organisation_id: inviter.organisationId }).whereNull('accepted_at').whereNull('revoked_at').update({ revoked_at: new Date() })
  if (!changed) throw createError({ statusCode: 404, statusMessage: 'No such open invitation' })
  await audit(useDb(), inviter, 'invitation.revoked', 'invitation', id, {})
}

/** The open invitation behind a link, or 404 (used, revoked, expired or unknown all look the same). */
export async function invitationByToken(token: string) {
  const row = await useDb()('invitations as i').join('organisations as o', 'o.id', 'i.organisation_id')
    .leftJoin('users as u', 'u.email', 'i.email')
    .where('i.token_hash', hashToken(token)).whereNull('i.accepted_at').whereNull('i.revoked_at').andWhereRaw('i.expires_at > NOW(3)')
    .first('i.id', 'i.email', 'i.role', 'i.organisation_id as organisationId', 'o.name as organisationName', 'u.id as userId', 'u.password_hash as passwordHash')
  if (!row) throw createError({ statusCode: 404, statusMessage: 'This invitation link is not valid any more; ask the office for a new one' })
  return row as { id: string, email: string, role: Role, organisationId: string, organisationName: string, userId: string | null, passwordHash: string | null }
}

/** What the invitation page shows: whether the address already has an account decides what it asks for. */
export async function invitationPreview(token: string) {
  const { email, role, organisationName, userId } = await invitationByToken(token)
  return { email, role, organisationName, accountExists: userId !== null }
}

/**
 * Accepts an invitation; the user then signs in for the inviting company. A new person
 * chooses a name and a password; an address that already has an account joins with that account's
 * own password, which is never set or replaced here, and nothing of its other companies changes.
 */
export async function acceptInvitation(event: H3Event, body: AcceptRequestBody): Promise<{ userId: string, organisationId: string }> {
  // A name says the form was for a new person: its password rules apply before the link is looked up.
  const asNew = body.name === undefined ? undefined : acceptInvitationBody.safeParse(body)
  if (asNew && !asNew.success) throw invalidInput(asNew.error)
  const invitation = await invitationByToken(body.token)
  const newPerson = invitation.userId ? undefined : asNew ?? acceptInvitationBody.safeParse(body)
  if (newPerson && !newPerson.success) throw invalidInput(newPerson.error)
  if (invitation.userId && !await passwordGuess(event, invitation.email, invitation.passwordHash, body.password)) {
    throw createError({ statusCode: 422, statusMessage: 'Some fields need a look', data: { fieldErrors: { password: 'This is not the password of your Tamp account' } } })
  }
  const passwordHash = newPerson?.success ? await hashPassword(newPerson.data.password) : undefined
  return await useDb().transaction(async (trx) => {
    // The row lock makes a double-tapped accept create one account, not two.
    const locked = await trx('invitations').where({ id: invitation.id }).whereNull('accepted_at').forUpdate().first('id')
    if (!locked) throw createError({ statusCode: 404, statusMessage: 'This invitation was already used' })
    let userId = invitation.userId
    if (!userId) {
      userId = randomUUID()
      await trx('users').insert({ id: userId, email: invitation.email, name: newPerson?.data?.name, password_hash: passwordHash })
    }
    const member = await trx('memberships').where({ organisation_id: invitation.organisationId, user_id: userId }).first('id')
    if (member) throw createError({ statusCode: 409, statusMessage: 'You are already a member of this company; sign in instead' })
    await trx('memberships').insert({ id: randomUUID(), organisation_id: invitation.organisationId, user_id: userId, role: invitation.role })
    await trx('invitations').where({ id: invitation.id }).update({ accepted_at: new Date() })
    await audit(trx, { organisationId: invitation.organisationId, userId }, 'invitation.accepted', 'invitation', invitation.id, { role: invitation.role, existingAccount: Boolean(invitation.userId) })
    return { userId, organisationId: invitation.organisationId }
  })
}

import type { H3Event } from 'h3'
import type { Member } from './members'

export async function profileOf(member: Member) {
  const row = await useDb()('users as u')
    .join('memberships as m', 'm.user_id', 'u.id')
    .join('organisations as o', 'o.id', 'm.organisation_id')
    .where({ 'u.id': member.userId, 'm.organisation_id': member.organisationId })
    .first('u.id', 'u.name', 'u.email', 'u.locale', 'o.name as organisationName')
  return { ...row, role: member.role }
}

export async function updateProfile(event: H3Event, member: Member, change: { name?: string, locale?: 'en' | 'es' }) {
  if (change.name || change.locale) await useDb()('users').where({ id: member.userId }).update({ ...change, updated_at: new Date() })
  const profile = await profileOf(member)
  // The session carries the display name and language, so refresh it.
  const session = await getUserSession(event)
  if (session.user) await setUserSession(event, { user: { ...session.user, name: profile.name, locale: profile.locale }, signedInAt: session.signedInAt })
  return profile
}

export async function changePassword(member: Member, currentPassword: string, newPassword: string): Promise<void> {
  const user = await useDb()('users').where({ id: member.userId }).first('password_hash')
  if (!user?.password_hash || !await verifyPassword(user.password_hash, currentPassword)) {
    throw createError({ statusCode: 422, statusMessage: 'Some fields need a look', data: { fieldErrors: { currentPassword: 'This is not your current password' } } })
  }
  const passwordHash = await hashPassword(newPassword)
  await useDb().transaction(async (trx) => {
    await trx('users').where({ id: member.userId }).update({ password_hash: passwordHash, updated_at: new Date() })
    // Whoever knew the old password is signed out everywhere; this phone stays signed in.
    await endSessionsOf(trx, member.userId, 'password_changed', { keep: member.sessionId })
  })
}

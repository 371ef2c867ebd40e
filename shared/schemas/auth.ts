// Request bodies of the sign-in, invitation, reset, member and profile routes. The forms use the same
// schemas to show field errors before anything is sent.
import { z } from 'zod'
import { roles } from '../utils/daybook'

export const email = z.string().trim().toLowerCase().max(254, 'At most 254 characters').pipe(z.email('Enter an e-mail address like name@example.com'))
export const newPassword = z.string().min(10, 'Use at least 10 characters').max(200, 'At most 200 characters')
export const personName = z.string().trim().min(1, 'Enter a name').max(120, 'At most 120 characters')
export const locale = z.enum(['en', 'es'])
export const role = z.enum(roles)
export const token = z.string().regex(/^[\w-]{20,100}$/, 'This link is not valid')

const currentPassword = z.string().min(1, 'Enter your password').max(200, 'At most 200 characters')

export const signInBody = z.strictObject({
  email,
  password: currentPassword,
  /** For a person in more than one company: which one this sign-in is for. */
  organisationId: z.uuid('Not a valid id').optional(),
})

export const forgotPasswordBody = z.strictObject({ email })

export const resetPasswordBody = z.strictObject({ token, password: newPassword })

export const inviteBody = z.strictObject({ email, role })

/** Accepting an invitation as a new person: a name and a new password. */
export const acceptInvitationBody = z.strictObject({ token, name: personName, password: newPassword })
/** Accepting it with the account the address already has: that account's own password, nothing else. */
export const joinWithAccountBody = z.strictObject({ token, password: currentPassword })
/** What the accept route reads; which of the two it must be, the server knows from the invitation. */
export const acceptRequestBody = z.strictObject({ token, name: personName.optional(), password: currentPassword })

export const memberPatchBody = z.strictObject({
  role: role.optional(),
  active: z.boolean().optional(),
}).refine(body => body.role !== undefined || body.active !== undefined, { message: 'Change the role or the active state' })

export const profilePatchBody = z.strictObject({
  name: personName.optional(),
  locale: locale.optional(),
}).refine(body => body.name !== undefined || body.locale !== undefined, { message: 'Change the name or the language' })

export const passwordChangeBody = z.strictObject({
  currentPassword: z.string().min(1, 'Enter your current password').max(200, 'At most 200 characters'),
  newPassword,
})

export const uuidParam = z.strictObject({ id: z.uuid('Not a valid id') })
export const tokenParam = z.strictObject({ token })

export type SignInBody = z.infer<typeof signInBody>
export type InviteBody = z.infer<typeof inviteBody>
export type AcceptRequestBody = z.infer<typeof acceptRequestBody>
export type MemberPatchBody = z.infer<typeof memberPatchBody>

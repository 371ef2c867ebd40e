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

export const signInBody = z.strictObject({
  email,
  password: z.string().min(1, 'Enter your password').max(200, 'At most 200 characters'),
})

export const forgotPasswordBody = z.strictObject({ email })

export const resetPasswordBody = z.strictObject({ token, password: newPassword })

export const inviteBody = z.strictObject({ email, role })

export const acceptInvitationBody = z.strictObject({ token, name: personName, password: newPassword })

export const memberPatchBody = z.strictObject({
  role: role.optional(),
  active: z.boolean().optional(),
}).refine(body => body.role !== undefined || body.active !== undefined, { message: 'Change the role or the active state' })

export const profilePatchBody = z.strictObject({
  name: personName.optional(),
  locale: locale.optional(),
})

export const passwordChangeBody = z.strictObject({
  currentPassword: z.string().min(1, 'Enter your current password').max(200),
  newPassword,
})

export const uuidParam = z.strictObject({ id: z.uuid('Not a valid id') })
export const tokenParam = z.strictObject({ token })

export type SignInBody = z.infer<typeof signInBody>
export type InviteBody = z.infer<typeof inviteBody>
export type MemberPatchBody = z.infer<typeof memberPatchBody>

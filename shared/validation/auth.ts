import { z } from 'zod'
import { studioRoles } from '#shared/types/studio'
import { NAME_MAX } from '#shared/text/nameWithSuffix'

export const emailSchema = z.string().trim().toLowerCase().max(254).pipe(z.email('must be an e-mail address'))
export const passwordSchema = z.string()
  .min(10, 'must be at least 10 characters')
  .max(200, 'must be at most 200 characters')
export const nameSchema = z.string().trim().min(1, 'is required').max(NAME_MAX, `must be at most ${NAME_MAX} characters`)
const tokenSchema = z.string().regex(/^[A-Za-z0-9_-]{32,128}$/, 'is not a valid token')

export const registerBody = z.object({ email: emailSchema, password: passwordSchema, name: nameSchema })
export const loginBody = z.object({ email: emailSchema, password: z.string().min(1, 'is required').max(200) })
export const resetRequestBody = z.object({ email: emailSchema })
export const resetConfirmBody = z.object({ token: tokenSchema, password: passwordSchema })
export const tokenParams = z.object({ token: tokenSchema })
export const confirmAddressBody = z.object({ token: tokenSchema })
export const passwordChangeBody = z.object({ current: z.string().min(1, 'is required').max(200), password: passwordSchema })
export const sessionParams = z.object({ id: z.preprocess(
  v => (typeof v === 'string' && /^\d{1,10}$/.test(v) ? Number(v) : v),
  z.number('must be a whole number').int('must be a whole number').positive('must be a positive id').max(2 ** 31),
) })
export const invitationAcceptBody = z.object({
  // Needed only when the invited address has no account yet.
  name: nameSchema.optional(),
  password: passwordSchema.optional(),
})

// Text ids (paths, queries, form fields) must be plain digits: Number() would also read
// "0x10", "1e1" or " 16" as an existing row's id.
export const idParam = z.preprocess(
  v => (typeof v === 'string' && /^\d{1,10}$/.test(v) ? Number(v) : v),
  z.number('must be a whole number').int('must be a whole number').positive('must be a positive id').max(2 ** 31),
)
export const studioParams = z.object({ studioId: idParam })
export const memberParams = z.object({ studioId: idParam, userId: idParam })
export const roleSchema = z.enum(studioRoles)
export const inviteBody = z.object({ email: emailSchema, role: roleSchema })
export const roleChangeBody = z.object({ role: roleSchema })
export const studioCreateBody = z.object({ name: nameSchema })

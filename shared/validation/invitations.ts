import { z } from 'zod'
import { nameSchema, passwordSchema, tokenSchema } from './common'

export const tokenParams = z.object({ token: tokenSchema })
export const invitationAcceptBody = z.object({
  // Needed only when the invited address has no account yet.
  name: nameSchema.optional(),
  password: passwordSchema.optional(),
})

import { z } from 'zod'
import { emailSchema, nameSchema, passwordSchema, tokenSchema } from './common'

export const registerBody = z.object({ email: emailSchema, password: passwordSchema, name: nameSchema })
export const loginBody = z.object({ email: emailSchema, password: z.string().min(1, 'is required').max(200) })
export const resetConfirmBody = z.object({ token: tokenSchema, password: passwordSchema })
export const confirmAddressBody = z.object({ token: tokenSchema })

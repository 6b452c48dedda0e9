import { z } from 'zod'
import { passwordSchema } from './common'

export const passwordChangeBody = z.object({ current: z.string().min(1, 'is required').max(200), password: passwordSchema })

import { z } from 'zod'
import { studioRoles } from '#shared/types/studio'
import { emailSchema, idParam, studioRef } from './common'

// Routes under /api/studios/[studioId]: their path is read with studioRef.

export const memberParams = studioRef.extend({ userId: idParam })
const roleSchema = z.enum(studioRoles)
export const inviteBody = z.object({ email: emailSchema, role: roleSchema })
export const roleChangeBody = z.object({ role: roleSchema })

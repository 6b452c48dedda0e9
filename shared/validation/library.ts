import { z } from 'zod'
import { idParam } from './auth'

/** Lists of a studio's things are asked for by studio. */
export const studioQuery = z.object({ studioId: idParam })

import { z } from 'zod'
import { NAME_MAX } from '#shared/text/nameWithSuffix'

// What the schemas of several route folders read the same way: ids, the studio a request is
// about, counts and measures, names, addresses, passwords and link tokens. Each folder of
// server/api/ has its own file beside this one for the rest.

/** An id in a JSON body. */
export const id = z.number('must be a number').int('must be a whole number').positive('must be a positive id').max(2 ** 31)

// Text ids (paths, queries, form fields) must be plain digits: Number() would also read
// "0x10", "1e1" or " 16" as an existing row's id.
export const idParam = z.preprocess(
  v => (typeof v === 'string' && /^\d{1,10}$/.test(v) ? Number(v) : v),
  z.number('must be a whole number').int('must be a whole number').positive('must be a positive id').max(2 ** 31),
)
/** The `[id]` of a route's path. */
export const idParams = z.object({ id: idParam })

/**
 * The studio a request is about, from the path (`[studioId]`), a query, a form's fields or a
 * JSON body. A body's is read on its own first, so the role check comes before the rest of the
 * request is judged and a stranger learns nothing from the errors.
 */
export const studioRef = z.object({ studioId: idParam })

export const count = (min: number, max: number) => z.number('must be a number').int('must be a whole number')
  .min(min, `must be at least ${min}`).max(max, `must be at most ${max}`)
/**
 * A measure kept in a DECIMAL column with `decimals` places: anything smaller than one step
 * would be stored as 0 and later divided by (a swatch 0 cm high has no gauge).
 */
export const stored = (max: number, decimals: 1 | 2) => {
  const step = decimals === 1 ? 0.1 : 0.01
  return z.number('must be a number').min(step, `must be at least ${step} (it is kept to ${decimals} decimal place${decimals === 1 ? '' : 's'})`)
    .max(max, `must be at most ${max}`)
}
export const notes = z.string('must be text').max(5000, 'must be at most 5000 characters')
export const technique = z.enum(['together', 'colour-by-colour'], 'must be "together" or "colour-by-colour"')
export const lengthUnit = z.enum(['cm', 'in'], 'must be "cm" or "in"')

export const nameSchema = z.string().trim().min(1, 'is required').max(NAME_MAX, `must be at most ${NAME_MAX} characters`)
export const emailSchema = z.string().trim().toLowerCase().max(254).pipe(z.email('must be an e-mail address'))
/** Just an address: a password-reset request, a plan shared with someone. */
export const emailBody = z.object({ email: emailSchema })
export const passwordSchema = z.string()
  .min(10, 'must be at least 10 characters')
  .max(200, 'must be at most 200 characters')
/** The token of a mailed link (password reset, address confirmation, invitation). */
export const tokenSchema = z.string().regex(/^[A-Za-z0-9_-]{32,128}$/, 'is not a valid token')

/**
 * The `version` of a motif or plan that an edit was made from (MotifDetail.version,
 * PlanDetail.version). Optional in every PATCH body: without it the change is applied
 * whatever happened meanwhile, as before versions existed. Kept to the column's range
 * (INT UNSIGNED).
 */
export const editVersion = z.number('must be a number').int('must be a whole number')
  .min(0, 'must be at least 0').max(4_294_967_295, 'must be at most 4294967295')

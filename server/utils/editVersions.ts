import type { H3Event } from 'h3'
import { literal, type Attributes, type Model, type ModelStatic, type Transaction } from 'sequelize'
import type { MotifDetail } from '#shared/types/motif'
import type { PlanDetail } from '#shared/types/plan'
import { editVersion } from '#shared/validation/common'

// Edits that cannot overwrite each other (DEVELOPERS.md): a motif or plan carries a `version`
// that every change bumps, in the same UPDATE that checks the version the change was made from.
// A client that sends none gets the old rule, last write wins.

/** `If-Match: "3"` (an entity tag, as the ETag header sends it) or a bare `3`; `*` is any version. */
const ifMatchVersion = /^"(\d{1,10})"$|^(\d{1,10})$/

/**
 * The version an edit was made from: the body's `version` when it has one, else the
 * `If-Match` header, else undefined (no check). A header that is no single version is a 400
 * naming it; weak tags (W/"3") never match in If-Match, so they are refused too.
 */
export function expectedVersion(event: H3Event, bodyVersion: number | undefined): number | undefined {
  if (bodyVersion !== undefined) return bodyVersion
  const header = getRequestHeader(event, 'if-match')?.trim()
  if (!header || header === '*') return undefined
  const match = ifMatchVersion.exec(header)
  const parsed = match ? editVersion.safeParse(Number(match[1] ?? match[2])) : undefined
  if (!parsed?.success) throw fieldError('If-Match', 'must be one version in quotes, like "3" (the version or ETag the edit was made from)')
  return parsed.data
}

/** The answer's ETag: the version, so a client can send it back as If-Match. */
export function setVersionTag(event: H3Event, version: number) {
  setResponseHeader(event, 'etag', `"${version}"`)
}

/**
 * One UPDATE that applies `changes`, bumps `version` and, when `expected` is given, only
 * happens if the row is still at that version. True when the row was changed. The row stays
 * locked until `transaction` ends, so a read inside it sees exactly this change.
 */
export async function updateAtVersion<M extends Model>(
  model: ModelStatic<M>, id: number, expected: number | undefined, changes: Partial<Attributes<M>>, transaction: Transaction,
): Promise<boolean> {
  const where = expected === undefined ? { id } : { id, version: expected }
  const [changed] = await model.update({ ...changes, version: literal('version + 1') } as never, { where: where as never, transaction })
  return changed === 1
}

/** The 409 for an edit made from an old copy: nothing was saved, `data.current` is the copy now. */
export function changedElsewhere(what: 'motif' | 'plan', current: MotifDetail | PlanDetail) {
  const who = current.updatedBy?.name ?? 'Someone'
  return createError({
    statusCode: 409,
    statusMessage: 'Conflict',
    message: `Changed elsewhere: ${who} saved this ${what} after you opened it (it is now version ${current.version}), so your change was not saved. `
      + `Send it again with version ${current.version} to keep yours, or take the current copy.`,
    data: { current },
  })
}

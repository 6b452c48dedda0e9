import { idParams } from '#shared/validation/common'
import { planPatch, shapeSizeIssues } from '#shared/validation/plans'

// Any field, including `published`; `pieces` replaces every piece. Made from an old version
// (body `version`, else `If-Match`) it is a 409 with the current plan, and nothing is saved.
export default defineEventHandler(async (event) => {
  const user = await requireUser(event)
  const { id } = paramsValid(event, idParams)
  const { plan } = await requirePlan(event, id, 'designer')
  const { version, ...body } = await readValid(event, planPatch)
  // Sizes alone must still fit the stored shapes, and shapes alone the stored sizes.
  const [issue] = shapeSizeIssues(body.pieces ?? plan.pieces ?? [], body.sizes ?? plan.sizes)
  if (issue) throw fieldError(issue.path.join('.'), issue.message)
  await checkPlanRefs(plan.studioId, body)
  const saved = await updatePlan(plan.id, body, user.id, expectedVersion(event, version))
  setVersionTag(event, saved.version)
  return saved
})

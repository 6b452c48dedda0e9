import { emailBody, idParams } from '#shared/validation/common'

// A designer shares a published plan with someone outside the studio: they are invited as a
// knitter (so they see the studio's published plans, and only those) and land on this plan.
export default defineEventHandler(async (event) => {
  await requireUser(event)
  const { id } = paramsValid(event, idParams)
  const { user, plan } = await requirePlan(event, id, 'designer')
  const { email } = await readValid(event, emailBody)
  if (!plan.published) throw createError({ statusCode: 409, message: 'Publish the plan before sharing it' })
  const invitation = await inviteToStudio(event, {
    studioId: plan.studioId, email, role: 'knitter', invitedBy: user,
    why: `They share the plan “${plan.name}” with you.`, then: `/plans/${plan.id}`,
  })
  setResponseStatus(event, 201)
  return { id: invitation.id, email: invitation.email, role: invitation.role, expiresAt: invitation.expiresAt }
})

import { emailBody } from '#shared/validation/common'

// Always 202, in the same time: the request is queued as it is and the queue looks the
// address up after the answer (server/utils/mailQueue.ts), so neither the answer nor its
// timing says whether the address has an account.
export default defineEventHandler(async (event) => {
  const { email } = await readValid(event, emailBody)
  await queueMail(event, { kind: 'password-reset', to: email, subject: 'Set a new Floatwise password' })
  setResponseStatus(event, 202)
  return { message: 'If the address has an account, a link to set a new password is on its way.' }
})

import nodemailer, { type Transporter } from 'nodemailer'

let transport: Transporter | undefined

function useTransport() {
  if (!transport) {
    const { smtpUrl } = useRuntimeConfig()
    if (!smtpUrl) throw new Error('No mail server configured: set SMTP_URL, or start through `npm start` for the local mail fake')
    // Pooled: the queue sends several mails at once over kept connections (nodemailer reads
    // options from the URL's query).
    transport = nodemailer.createTransport(/[?&]pool=/.test(smtpUrl) ? smtpUrl : `${smtpUrl}${smtpUrl.includes('?') ? '&' : '?'}pool=true`)
  }
  return transport
}

/** Every mail goes through here: the local fake in development and tests, SMTP_URL elsewhere. */
export async function sendMail(message: { to: string; subject: string; text: string }) {
  const { mailFrom } = useRuntimeConfig()
  await useTransport().sendMail({ from: mailFrom, ...message })
}

/** An absolute link into the app for a mail. */
export function appLink(path: string) {
  return new URL(path, useRuntimeConfig().appUrl).toString()
}

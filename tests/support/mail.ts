import { readdirSync, readFileSync } from 'node:fs'
import { join } from 'node:path'
import { inject } from 'vitest'

export interface CapturedMail { to: string; from: string; subject: string; text: string; at: string }

export function mailTo(address: string, dir = inject('mailDir')): CapturedMail[] {
  return readdirSync(dir).filter(f => f.endsWith('.json')).sort()
    .map(f => JSON.parse(readFileSync(join(dir, f), 'utf8')) as CapturedMail)
    .filter(m => m.to.split(', ').includes(address))
}

/**
 * Waits for the n-th mail to an address. Mail is sent from a queue after the route answers,
 * and every test file shares one server's queue (the fuzz fills it), hence the generous wait.
 */
export async function waitForMail(address: string, count = 1, timeoutMs = 20_000): Promise<CapturedMail> {
  const until = Date.now() + timeoutMs
  for (;;) {
    const mails = mailTo(address)
    if (mails.length >= count) return mails[count - 1]!
    if (Date.now() > until) throw new Error(`no mail #${count} to ${address} within ${timeoutMs} ms`)
    await new Promise(r => setTimeout(r, 50))
  }
}

export function linkIn(mail: CapturedMail, pathStart: string): URL {
  const match = mail.text.match(/https?:\/\/\S+/g)?.map(u => new URL(u)).find(u => u.pathname.startsWith(pathStart))
  if (!match) throw new Error(`no ${pathStart} link in mail "${mail.subject}":\n${mail.text}`)
  return match
}

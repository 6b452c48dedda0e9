import { mkdirSync, writeFileSync } from 'node:fs'
import { randomUUID } from 'node:crypto'
import { SMTPServer } from 'smtp-server'
import { simpleParser } from 'mailparser'

/**
 * The local stand-in for a mail provider: an SMTP server on loopback that keeps each
 * message as JSON in `dir` (read by /dev/mail and by the tests). Port 0 picks a free one.
 */
export async function startMailFake(dir, port = 0) {
  mkdirSync(dir, { recursive: true })
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS'],
    logger: false,
    onData(stream, session, callback) {
      simpleParser(stream).then((mail) => {
        const record = {
          to: session.envelope.rcptTo.map(r => r.address).join(', '),
          from: session.envelope.mailFrom ? session.envelope.mailFrom.address : '',
          subject: mail.subject ?? '',
          text: mail.text ?? '',
          at: new Date().toISOString(),
        }
        writeFileSync(`${dir}/${Date.now()}-${randomUUID()}.json`, JSON.stringify(record, null, 2))
        callback()
      }, callback)
    },
  })
  await new Promise((resolve, reject) => {
    server.once('error', reject)
    server.listen(port, '127.0.0.1', resolve)
  })
  const address = server.server.address()
  return {
    url: `smtp://127.0.0.1:${address.port}`,
    port: address.port,
    close: () => new Promise(resolve => server.close(resolve)),
  }
}

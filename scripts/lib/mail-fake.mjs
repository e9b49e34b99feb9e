// The local stand-in for an SMTP provider: accepts every message on loopback and keeps
// it as a JSON file, so the dev mail page and the tests can read what Lamina sent.
import { mkdirSync, writeFileSync, readdirSync, readFileSync, rmSync } from 'node:fs'
import { join } from 'node:path'
import { SMTPServer } from 'smtp-server'
import { simpleParser } from 'mailparser'

/** Starts the catcher on 127.0.0.1:`port` (0 picks a free one); resolves with { port, dir, messages(), close() }. */
export async function startMailFake({ dir, port = 0, clear = false }) {
  if (clear) rmSync(dir, { recursive: true, force: true })
  mkdirSync(dir, { recursive: true })
  let sequence = 0
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS', 'AUTH'],
    banner: 'Lamina local mail catcher',
    size: 5 * 1024 * 1024,
    onData(stream, session, callback) {
      simpleParser(stream).then((parsed) => {
        const id = `${Date.now()}-${String(++sequence).padStart(4, '0')}`
        writeFileSync(join(dir, `${id}.json`), JSON.stringify({
          id,
          receivedAt: new Date().toISOString(),
          from: parsed.from?.text ?? '',
          to: session.envelope.rcptTo.map(r => r.address),
          subject: parsed.subject ?? '',
          text: parsed.text ?? '',
          html: typeof parsed.html === 'string' ? parsed.html : '',
        }, null, 2))
        callback()
      }, callback)
    },
  })
  server.on('error', error => console.error('[mail catcher]', error.message))
  await new Promise((resolve, reject) => {
    server.once('error', reject)
    server.listen(port, '127.0.0.1', resolve)
  })
  return {
    port: server.server.address().port,
    dir,
    messages: () => readdirSync(dir).filter(f => f.endsWith('.json')).sort()
      .map(f => JSON.parse(readFileSync(join(dir, f), 'utf8'))),
    close: () => new Promise(resolve => server.close(resolve)),
  }
}

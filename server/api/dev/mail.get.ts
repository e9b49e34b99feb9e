import { readdir, readFile } from 'node:fs/promises'
import { join } from 'node:path'

// Local development only: the messages the local mail catcher kept, newest first.
// Anywhere else (no LAMINA_LOCAL=1) this route does not exist.
export default defineEventHandler(async () => {
  const dir = process.env.LAMINA_MAIL_DIR
  if (process.env.LAMINA_LOCAL !== '1' || !dir) throw createError({ status: 404, message: 'Page not found.' })
  const files = (await readdir(dir).catch(() => [] as string[])).filter(f => f.endsWith('.json')).sort().reverse().slice(0, 100)
  const messages = []
  for (const file of files) {
    try {
      const message = JSON.parse(await readFile(join(dir, file), 'utf8'))
      messages.push({
        id: String(message.id), receivedAt: String(message.receivedAt), from: String(message.from),
        to: (Array.isArray(message.to) ? message.to.map(String) : []) as string[], subject: String(message.subject), text: String(message.text),
      })
    }
    catch { /* a file still being written is skipped; the next refresh shows it */ }
  }
  return { messages }
})

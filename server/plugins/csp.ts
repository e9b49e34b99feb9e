import { createHash } from 'node:crypto'
import { BASE_CSP } from '../middleware/security'

// Nuxt writes a small inline script into each page (the runtime config for the client).
// Rather than allowing every inline script, allow exactly those: hash each one in the
// finished HTML and name the hashes in script-src. JSON payload blocks are not executed
// and need no hash.
const INLINE_SCRIPT = /<script(\s[^>]*)?>([\s\S]*?)<\/script>/gi

/** The CSP for one rendered page: the base policy plus a hash per executable inline script. */
export function pageCsp(html: string): string {
  const hashes = new Set<string>()
  for (const [, attributes = '', body = ''] of html.matchAll(INLINE_SCRIPT)) {
    if (/\ssrc\s*=/i.test(attributes) || !body.trim()) continue
    const type = /\stype\s*=\s*["']?([^"'\s>]+)/i.exec(attributes)?.[1]?.toLowerCase()
    if (type && type !== 'module' && type !== 'text/javascript') continue
    hashes.add(`'sha256-${createHash('sha256').update(body).digest('base64')}'`)
  }
  if (!hashes.size) return BASE_CSP
  return BASE_CSP.replace('script-src \'self\'', `script-src 'self' ${[...hashes].join(' ')}`)
}

export default defineNitroPlugin((nitroApp) => {
  if (import.meta.dev) return
  nitroApp.hooks.hook('render:response', (response, { event }) => {
    if (typeof response.body !== 'string') return
    const csp = pageCsp(response.body)
    response.headers = { ...response.headers, 'content-security-policy': csp }
    setResponseHeader(event, 'Content-Security-Policy', csp)
  })
})

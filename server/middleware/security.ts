// Protection every request passes through: security headers, a same-origin check for requests
// that change something, and a size limit on request bodies.

/** Largest request body Lamina accepts. Protocol documents are a few KB; uploads will get their own route. */
export const MAX_BODY_BYTES = 256 * 1024

const MUTATING = new Set(['POST', 'PUT', 'PATCH', 'DELETE'])

// No inline scripts beyond the ones Nuxt writes into the page; those get hashes added by
// server/plugins/csp.ts. Inline styles stay allowed because Vue style bindings write them.
export const BASE_CSP = [
  'default-src \'self\'',
  'script-src \'self\'',
  'style-src \'self\' \'unsafe-inline\'',
  'img-src \'self\' data:',
  'font-src \'self\' data:',
  'connect-src \'self\'',
  'object-src \'none\'',
  'base-uri \'self\'',
  'form-action \'self\'',
  'frame-ancestors \'none\'',
].join('; ')

function sameOrigin(event: Parameters<typeof getRequestURL>[0]): boolean {
  // Browsers send at least one of these on every cross-origin request; a request with neither
  // comes from a non-browser client, which cannot carry a victim's cookies (the same rule as
  // Go's net/http CrossOriginProtection).
  const site = getRequestHeader(event, 'sec-fetch-site')
  if (site) return site === 'same-origin' || site === 'none'
  const origin = getRequestHeader(event, 'origin')
  if (!origin) return true
  const allowed = new Set([getRequestURL(event).origin])
  const base = useRuntimeConfig(event).public.baseUrl
  if (typeof base === 'string' && base) {
    try { allowed.add(new URL(base).origin) }
    catch { /* a malformed base URL allows nothing extra */ }
  }
  return allowed.has(origin)
}

export default defineEventHandler(async (event) => {
  setResponseHeaders(event, {
    'X-Content-Type-Options': 'nosniff',
    'Referrer-Policy': 'strict-origin-when-cross-origin',
    'X-Frame-Options': 'DENY',
    'Cross-Origin-Opener-Policy': 'same-origin',
    'Permissions-Policy': 'camera=(), microphone=(), geolocation=(), payment=()',
  })
  // Vite's dev server injects inline scripts and a websocket; the policy applies to built servers.
  if (!import.meta.dev) setResponseHeader(event, 'Content-Security-Policy', BASE_CSP)
  if (getRequestProtocol(event) === 'https') setResponseHeader(event, 'Strict-Transport-Security', 'max-age=31536000')
  if (event.path.startsWith('/api/')) setResponseHeader(event, 'Cache-Control', 'no-store')

  if (!MUTATING.has(event.method)) return
  if (!sameOrigin(event)) {
    throw createError({ status: 403, message: 'This request came from another site, so Lamina refused it. Use Lamina from its own address.' })
  }
  const tooLarge = () => createError({ status: 413, message: `The request is too large: Lamina accepts at most ${MAX_BODY_BYTES / 1024} KB.` })
  const declared = Number(getRequestHeader(event, 'content-length') ?? '')
  if (Number.isFinite(declared) && declared > MAX_BODY_BYTES) throw tooLarge()
  if (getRequestHeader(event, 'transfer-encoding')) {
    // No length announced: read it now (h3 keeps it for the route) and measure.
    const raw = await readRawBody(event, false)
    if (raw && raw.length > MAX_BODY_BYTES) throw tooLarge()
  }
})

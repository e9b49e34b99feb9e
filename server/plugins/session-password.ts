// Refuses to start a production server whose sessions could be forged: the session password must
// come from the environment, be at least 32 characters and not be the published local default.
// LAMINA_LOCAL=1 (set by `npm start` and the tests) marks a local run, where the default is fine.
const DEV_SESSION_PASSWORD = 'lamina-local-development-only-session-password-0001' // same as scripts/lib/setup.mjs

/** Why `password` is not fit for production, or null when it is. */
export function sessionPasswordProblem(password: string | undefined): string | null {
  if (!password) return 'NUXT_SESSION_PASSWORD is not set.'
  if (password.length < 32) return `NUXT_SESSION_PASSWORD has ${password.length} characters; it needs at least 32.`
  if (password === DEV_SESSION_PASSWORD) return 'NUXT_SESSION_PASSWORD is the local development default.'
  return null
}

export default defineNitroPlugin(() => {
  if (process.env.NODE_ENV !== 'production' || process.env.LAMINA_LOCAL === '1') return
  const problem = sessionPasswordProblem(process.env.NUXT_SESSION_PASSWORD)
  if (problem) {
    throw new Error(`Lamina will not start in production: ${problem} Set a random secret of 32+ characters, e.g. \`openssl rand -base64 32\`.`)
  }
})

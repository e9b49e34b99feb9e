// Test helpers for account flows: a cookie-keeping HTTP client and practices with one member per
// role, written straight into the test run's PostgreSQL (never a mock).
import { readdirSync, readFileSync } from 'node:fs'
import { join } from 'node:path'
import { inject } from 'vitest'
import { nanoid } from 'nanoid'
import { sql } from 'drizzle-orm'
import { openDatabase } from '../../../server/db/client'
import { hashPasswordOffline } from '../../../server/db/hash'
import { memberships, practices, users } from '../../../server/db/schema'
import { ROLES, type Role } from '../../../shared/permissions'

export const TEST_PASSWORD = 'correct-horse-lamina-42'

let handle: ReturnType<typeof openDatabase> | undefined
/** A Drizzle handle on the test database (closed in closeDb). */
export function testDb() {
  handle ??= openDatabase(inject('databaseUrl'), { max: 3 })
  return handle.db
}
export async function closeTestDb() {
  await handle?.close()
  handle = undefined
}

let hashed: Promise<string> | undefined
const passwordHash = () => (hashed ??= hashPasswordOffline(TEST_PASSWORD))

/** A fresh address under example.test, unique per call. */
export const uniqueEmail = (label = 'person') => `${label}.${nanoid(8).toLowerCase().replace(/[^a-z0-9]/g, 'x')}@lamina-tests.example.test`

export interface Person { userId: string, membershipId: string, email: string, name: string, role: Role }
export interface PracticeFixture { id: string, name: string, people: Record<Role, Person> }

/** Adds an account (password TEST_PASSWORD) and, if `practiceId` is given, a membership with `role`. */
export async function addPerson(practiceId: string | null, role: Role, label: string = role): Promise<Person> {
  const db = testDb()
  const email = uniqueEmail(label)
  const name = `Test ${label.replace(/_/g, ' ')} ${nanoid(4)}`
  const [user] = await db.insert(users).values({ email, name, passwordHash: await passwordHash() }).returning()
  let membershipId = ''
  if (practiceId) {
    const [membership] = await db.insert(memberships).values({ practiceId, userId: user!.id, role }).returning()
    membershipId = membership!.id
  }
  return { userId: user!.id, membershipId, email, name, role }
}

/** A practice of its own with one member per role. */
export async function createPractice(label = 'Practice'): Promise<PracticeFixture> {
  const [practice] = await testDb().insert(practices).values({ name: `${label} ${nanoid(5)}`, slug: `test-${nanoid(10).toLowerCase()}` }).returning()
  const people = {} as Record<Role, Person>
  for (const role of ROLES) people[role] = await addPerson(practice!.id, role)
  return { id: practice!.id, name: practice!.name, people }
}

/** Clears every rate-limit counter, so a file does not inherit another file's failures. */
export async function resetRateLimits() {
  await testDb().execute(sql`DELETE FROM rate_limits`)
}

export interface Reply<T = any> { status: number, body: T, headers: Headers }

/** A tiny HTTP client with a cookie jar, like one browser profile. */
export class Client {
  cookies = new Map<string, string>()
  constructor(readonly baseUrl: string = inject('baseUrl'), readonly keepCookies = true) {}

  cookieHeader() {
    return [...this.cookies].map(([k, v]) => `${k}=${v}`).join('; ')
  }

  async request<T = any>(method: string, path: string, body?: unknown, headers: Record<string, string> = {}): Promise<Reply<T>> {
    const init: RequestInit = { method, headers: { accept: 'application/json', ...headers }, redirect: 'manual' }
    if (this.cookies.size) (init.headers as Record<string, string>).cookie = this.cookieHeader()
    if (body !== undefined) {
      init.body = typeof body === 'string' ? body : JSON.stringify(body)
      ;(init.headers as Record<string, string>)['content-type'] ??= 'application/json'
    }
    const response = await fetch(this.baseUrl + path, init)
    if (this.keepCookies) {
      for (const line of response.headers.getSetCookie()) {
        const [pair] = line.split(';')
        const [name, ...rest] = pair!.split('=')
        const value = rest.join('=')
        if (!value || /max-age=0|expires=thu, 01 jan 1970/i.test(line)) this.cookies.delete(name!.trim())
        else this.cookies.set(name!.trim(), value)
      }
    }
    const text = await response.text()
    let parsed: unknown = text
    try { parsed = text ? JSON.parse(text) : null }
    catch { /* not JSON: keep the text */ }
    return { status: response.status, body: parsed as T, headers: response.headers }
  }

  get<T = any>(path: string) { return this.request<T>('GET', path) }
  post<T = any>(path: string, body?: unknown) { return this.request<T>('POST', path, body ?? {}) }

  /** Signs in and keeps the session cookie; throws unless it worked. */
  async signIn(email: string, password = TEST_PASSWORD) {
    const reply = await this.post('/api/auth/sign-in', { email, password })
    if (reply.status !== 200) throw new Error(`sign-in of ${email} answered ${reply.status}: ${JSON.stringify(reply.body)}`)
    return this
  }
}

/** A client signed in as `email` (with TEST_PASSWORD unless another is given, e.g. the demo one). */
export const signedIn = (email: string, password = TEST_PASSWORD) => new Client().signIn(email, password)

export interface CapturedMail { id: string, to: string[], subject: string, text: string, html: string }

/** Waits for the mail catcher to hold a message to `address`; returns the newest one. */
export async function mailTo(address: string, timeoutMs = 10_000): Promise<CapturedMail> {
  const dir = inject('mailDir')
  const until = Date.now() + timeoutMs
  while (Date.now() < until) {
    const found = readdirSync(dir).filter(f => f.endsWith('.json')).sort().reverse()
      .map(f => { try { return JSON.parse(readFileSync(join(dir, f), 'utf8')) as CapturedMail } catch { return null } })
      .find(m => m?.to.some(t => t.toLowerCase() === address.toLowerCase()))
    if (found) return found
    await new Promise(resolve => setTimeout(resolve, 100))
  }
  throw new Error(`No mail to ${address} arrived within ${timeoutMs} ms`)
}

/** The first link into the app found in a message's text. */
export function linkIn(mail: CapturedMail, pathPrefix: string): string {
  const match = mail.text.match(new RegExp(`https?://[^\\s]+${pathPrefix.replace(/\//g, '\\/')}[^\\s]+`))
  if (!match) throw new Error(`No ${pathPrefix} link in: ${mail.text}`)
  return match[0]
}

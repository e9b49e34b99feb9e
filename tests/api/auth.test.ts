// Sign-in, sign-out, sign-up, password reset and the rate limit on sign-in attempts,
// against the built server and the test run's PostgreSQL.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { and, eq, sql } from 'drizzle-orm'
import { auditEvents, memberships, passwordResets, users } from '../../server/db/schema'
import { Client, TEST_PASSWORD, addPerson, closeTestDb, createPractice, linkIn, mailTo, resetRateLimits, signedIn, testDb, uniqueEmail, type PracticeFixture } from './support/accounts'

let practice: PracticeFixture

beforeAll(async () => {
  await resetRateLimits()
  practice = await createPractice('Auth')
})
afterAll(async () => {
  await resetRateLimits()
  await closeTestDb()
})

describe('signing in and out', () => {
  it('signs a coach in with the right password and shows their practice and role', async () => {
    const coach = practice.people.senior_coach
    const client = await signedIn(coach.email)
    const me = await client.get('/api/me')
    expect(me.status).toBe(200)
    expect(me.body.user).toEqual({ id: coach.userId, name: coach.name, email: coach.email })
    expect(me.body.practice.id).toBe(practice.id)
    expect(me.body.role).toBe('senior_coach')
    expect(me.body.permissions).toContain('templates.create')
    expect(me.body.permissions).not.toContain('members.manage')
  })

  it('treats the e-mail address without regard to case or surrounding spaces', async () => {
    const reply = await new Client().post('/api/auth/sign-in', { email: `  ${practice.people.reviewer.email.toUpperCase()} `, password: TEST_PASSWORD })
    expect(reply.status).toBe(200)
  })

  it('sets the session cookie HttpOnly and SameSite=Lax', async () => {
    const reply = await new Client().post('/api/auth/sign-in', { email: practice.people.owner.email, password: TEST_PASSWORD })
    const cookie = reply.headers.getSetCookie().find(c => c.startsWith('nuxt-session='))
    expect(cookie).toBeDefined()
    expect(cookie).toMatch(/HttpOnly/i)
    expect(cookie).toMatch(/SameSite=Lax/i)
    expect(cookie).toMatch(/Secure/i)
  })

  it('refuses a wrong password with one plain message that does not say whether the account exists', async () => {
    const wrong = await new Client().post('/api/auth/sign-in', { email: practice.people.client.email, password: 'not-the-password' })
    const nobody = await new Client().post('/api/auth/sign-in', { email: uniqueEmail('nobody'), password: 'not-the-password' })
    expect(wrong.status).toBe(401)
    expect(nobody.status).toBe(401)
    expect(wrong.body.message).toBe(nobody.body.message)
    expect(wrong.body.message).toMatch(/do not match/)
    await resetRateLimits()
  })

  it('records failed and successful sign-ins in the audit log with the address they came from', async () => {
    const person = await addPerson(practice.id, 'junior_coach')
    await new Client().post('/api/auth/sign-in', { email: person.email, password: 'wrong-password-1' })
    await signedIn(person.email)
    const rows = await testDb().select().from(auditEvents).where(eq(auditEvents.actorId, person.userId))
    const actions = rows.map(r => r.action)
    expect(actions).toContain('sign_in.failed')
    expect(actions).toContain('sign_in.succeeded')
    expect(rows.every(r => r.ip && r.ip.length > 0)).toBe(true)
    expect(rows.find(r => r.action === 'sign_in.succeeded')!.practiceId).toBe(practice.id)
    await resetRateLimits()
  })

  it('signs out: the next request is anonymous and sign-out is audited', async () => {
    const person = await addPerson(practice.id, 'reviewer')
    const client = await signedIn(person.email)
    expect((await client.get('/api/me')).status).toBe(200)
    expect((await client.post('/api/auth/sign-out')).status).toBe(200)
    expect((await client.get('/api/me')).status).toBe(401)
    const [row] = await testDb().select().from(auditEvents).where(and(eq(auditEvents.actorId, person.userId), eq(auditEvents.action, 'sign_out')))
    expect(row).toBeDefined()
  })

  it('answers anonymous callers of a member route with 401, not a validation error', async () => {
    const reply = await new Client().request('PATCH', '/api/members/x', { role: 42 })
    expect(reply.status).toBe(401)
  })
})

describe('rate limit on sign-in', () => {
  it('locks an account after 5 failures in 15 minutes with 429 and Retry-After, even for the right password', async () => {
    await resetRateLimits()
    const person = await addPerson(practice.id, 'client')
    for (let i = 0; i < 5; i++) {
      const reply = await new Client().post('/api/auth/sign-in', { email: person.email, password: `wrong-${i}-password` })
      expect(reply.status).toBe(401)
    }
    const locked = await new Client().post('/api/auth/sign-in', { email: person.email, password: TEST_PASSWORD })
    expect(locked.status).toBe(429)
    expect(locked.body.message).toMatch(/Too many attempts\. Wait \d+ minutes?/)
    const retryAfter = Number(locked.headers.get('retry-after'))
    expect(retryAfter).toBeGreaterThan(800)
    expect(retryAfter).toBeLessThanOrEqual(900)
    // Another account from the same address is not locked by this one.
    expect((await new Client().post('/api/auth/sign-in', { email: practice.people.owner.email, password: TEST_PASSWORD })).status).toBe(200)
    // The counter lives in PostgreSQL (so every app instance sees it).
    const [row] = await testDb().execute<{ count: number }>(sql`SELECT count FROM rate_limits WHERE key = ${`sign-in:account:${person.email}`}`)
    expect(Number(row!.count)).toBe(5)
    await resetRateLimits()
  })

  it('limits one address to 20 failures in 15 minutes across accounts', async () => {
    await resetRateLimits()
    for (let i = 0; i < 20; i++) {
      const reply = await new Client().post('/api/auth/sign-in', { email: uniqueEmail('spray'), password: 'guessing-password' })
      expect(reply.status).toBe(401)
    }
    const blocked = await new Client().post('/api/auth/sign-in', { email: practice.people.owner.email, password: TEST_PASSWORD })
    expect(blocked.status).toBe(429)
    await resetRateLimits()
    expect((await new Client().post('/api/auth/sign-in', { email: practice.people.owner.email, password: TEST_PASSWORD })).status).toBe(200)
  })
})

describe('sign-up', () => {
  it('creates a practice whose first member is its owner, and signs them in', async () => {
    const email = uniqueEmail('founder')
    const client = new Client()
    const reply = await client.post('/api/auth/sign-up', { name: 'Iris Founder', email, password: 'a-long-enough-pass', practiceName: 'Harbour Strength Lab' })
    expect(reply.status).toBe(201)
    expect(reply.body.role).toBe('owner')
    const me = await client.get('/api/me')
    expect(me.body.role).toBe('owner')
    expect(me.body.practice.name).toBe('Harbour Strength Lab')
    const rows = await testDb().select().from(memberships).where(eq(memberships.practiceId, me.body.practice.id))
    expect(rows.map(r => r.role)).toEqual(['owner'])
  })

  it('refuses an address that already has an account, naming the field', async () => {
    const reply = await new Client().post('/api/auth/sign-up', { name: 'X', email: practice.people.owner.email.toUpperCase(), password: 'a-long-enough-pass', practiceName: 'Other' })
    expect(reply.status).toBe(400)
    expect(reply.body.data.issues).toEqual([{ path: 'body.email', message: expect.stringMatching(/already exists/) }])
  })

  it('names every field that is wrong, in plain words', async () => {
    const reply = await new Client().post('/api/auth/sign-up', { name: '', email: 'not-an-email', password: 'short', practiceName: 'A' })
    expect(reply.status).toBe(400)
    const paths = reply.body.data.issues.map((i: { path: string }) => i.path).sort()
    expect(paths).toEqual(['body.email', 'body.name', 'body.password', 'body.practiceName'])
  })
})

describe('password reset by e-mail', () => {
  it('mails a single-use link that sets a new password, ends other sessions and signs this device in', async () => {
    const person = await addPerson(practice.id, 'junior_coach')
    const elsewhere = await signedIn(person.email)
    const asked = await new Client().post('/api/auth/forgot', { email: person.email })
    expect(asked.status).toBe(200)
    const mail = await mailTo(person.email)
    expect(mail.subject).toMatch(/new Lamina password/)
    const link = linkIn(mail, '/reset/')
    const token = link.split('/reset/')[1]!
    // Only the hash is stored.
    const stored = await testDb().select().from(passwordResets).where(eq(passwordResets.userId, person.userId))
    expect(stored).toHaveLength(1)
    expect(stored[0]!.tokenHash).not.toContain(token)
    expect(stored[0]!.expiresAt.getTime() - Date.now()).toBeGreaterThan(59 * 60 * 1000)
    expect(stored[0]!.expiresAt.getTime() - Date.now()).toBeLessThanOrEqual(60 * 60 * 1000)

    const device = new Client()
    const reset = await device.post('/api/auth/reset', { token, password: 'a-brand-new-password' })
    expect(reset.status).toBe(200)
    expect((await device.get('/api/me')).body.user.email).toBe(person.email)
    expect((await elsewhere.get('/api/me')).status).toBe(401)
    expect((await new Client().post('/api/auth/sign-in', { email: person.email, password: 'a-brand-new-password' })).status).toBe(200)

    const again = await new Client().post('/api/auth/reset', { token, password: 'yet-another-password' })
    expect(again.status).toBe(410)
    expect(again.body.message).toMatch(/already been used/)
  })

  it('refuses an expired reset link', async () => {
    const person = await addPerson(practice.id, 'client')
    await new Client().post('/api/auth/forgot', { email: person.email })
    const token = linkIn(await mailTo(person.email), '/reset/').split('/reset/')[1]!
    await testDb().update(passwordResets).set({ expiresAt: new Date(Date.now() - 1000) }).where(eq(passwordResets.userId, person.userId))
    const reply = await new Client().post('/api/auth/reset', { token, password: 'a-brand-new-password' })
    expect(reply.status).toBe(410)
    expect(reply.body.message).toMatch(/expired/)
    const [user] = await testDb().select().from(users).where(eq(users.id, person.userId))
    expect(user!.sessionVersion).toBe(1)
  })

  it('answers the same for an address without an account and sends nothing', async () => {
    const nobody = uniqueEmail('nobody')
    const reply = await new Client().post('/api/auth/forgot', { email: nobody })
    expect(reply.status).toBe(200)
    await expect(mailTo(nobody, 800)).rejects.toThrow(/No mail/)
  })

  it('refuses a made-up reset token with 404', async () => {
    const reply = await new Client().post('/api/auth/reset', { token: 'x'.repeat(43), password: 'a-brand-new-password' })
    expect(reply.status).toBe(404)
  })
})

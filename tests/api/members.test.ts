// Practices and members: invitations by e-mail, role changes, removal, switching practice,
// and tenancy (another practice's rows answer exactly like rows that do not exist).
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { and, eq } from 'drizzle-orm'
import { nanoid } from 'nanoid'
import { auditEvents, invitations, memberships } from '../../server/db/schema'
import { Client, TEST_PASSWORD, addPerson, closeTestDb, createPractice, linkIn, mailTo, resetRateLimits, signedIn, testDb, uniqueEmail, type PracticeFixture } from './support/accounts'

let a: PracticeFixture
let b: PracticeFixture

beforeAll(async () => {
  await resetRateLimits()
  a = await createPractice('Members A')
  b = await createPractice('Members B')
})
afterAll(async () => {
  await resetRateLimits()
  await closeTestDb()
})

async function invite(owner: Client, role: string, email = uniqueEmail('invitee')) {
  const reply = await owner.post('/api/invitations', { email, role })
  expect(reply.status).toBe(201)
  const token = linkIn(await mailTo(email), '/invite/').split('/invite/')[1]!
  return { email, token }
}

describe('invitations by e-mail', () => {
  it('binds the role: a new person joins with the role the owner chose, whatever they send', async () => {
    const owner = await signedIn(a.people.owner.email)
    const { email, token } = await invite(owner, 'reviewer')
    const preview = await new Client().get(`/api/invitations/${token}`)
    expect(preview.body).toMatchObject({ role: 'reviewer', email, hasAccount: false, practice: { name: a.name } })
    const joiner = new Client()
    const tampered = await joiner.post(`/api/invitations/${token}/accept`, { name: 'Nell Joiner', password: 'a-long-enough-pass', role: 'owner' })
    expect(tampered.status).toBe(400)
    expect(tampered.body.data.issues).toEqual([{ path: 'body.role', message: expect.any(String) }])
    const accepted = await joiner.post(`/api/invitations/${token}/accept`, { name: 'Nell Joiner', password: 'a-long-enough-pass' })
    expect(accepted.status).toBe(200)
    const me = await joiner.get('/api/me')
    expect(me.body).toMatchObject({ role: 'reviewer', practice: { id: a.id }, user: { email, name: 'Nell Joiner' } })
    const [event] = await testDb().select().from(auditEvents).where(and(eq(auditEvents.practiceId, a.id), eq(auditEvents.action, 'invitation.accepted'), eq(auditEvents.actorId, me.body.user.id)))
    expect(event?.detail).toMatchObject({ role: 'reviewer', newAccount: true })
  })

  it('refuses a used invitation link the second time', async () => {
    const owner = await signedIn(a.people.owner.email)
    const { token } = await invite(owner, 'client')
    expect((await new Client().post(`/api/invitations/${token}/accept`, { name: 'Once Only', password: 'a-long-enough-pass' })).status).toBe(200)
    const again = await new Client().post(`/api/invitations/${token}/accept`, { name: 'Twice', password: 'a-long-enough-pass' })
    expect(again.status).toBe(410)
    expect(again.body.message).toMatch(/already been used/)
    expect((await new Client().get(`/api/invitations/${token}`)).status).toBe(410)
  })

  it('refuses an expired invitation link and creates no account', async () => {
    const owner = await signedIn(a.people.owner.email)
    const { email, token } = await invite(owner, 'junior_coach')
    await testDb().update(invitations).set({ expiresAt: new Date(Date.now() - 1000) }).where(eq(invitations.email, email))
    const reply = await new Client().post(`/api/invitations/${token}/accept`, { name: 'Too Late', password: 'a-long-enough-pass' })
    expect(reply.status).toBe(410)
    expect(reply.body.message).toMatch(/expired/)
    expect((await new Client().post('/api/auth/sign-in', { email, password: 'a-long-enough-pass' })).status).toBe(401)
    await resetRateLimits()
  })

  it('expires invitations seven days after they are sent and stores only a hash of the token', async () => {
    const owner = await signedIn(a.people.owner.email)
    const { email, token } = await invite(owner, 'client')
    const [row] = await testDb().select().from(invitations).where(eq(invitations.email, email))
    const days = (row!.expiresAt.getTime() - row!.createdAt.getTime()) / 86_400_000
    expect(days).toBeCloseTo(7, 2)
    expect(row!.tokenHash).toMatch(/^[0-9a-f]{64}$/)
    expect(row!.tokenHash).not.toContain(token)
  })

  it('lets an existing account join a second practice with its password, then switch between them', async () => {
    const person = a.people.junior_coach
    const ownerB = await signedIn(b.people.owner.email)
    const { token } = await invite(ownerB, 'senior_coach', person.email)
    expect((await new Client().get(`/api/invitations/${token}`)).body.hasAccount).toBe(true)
    const wrong = await new Client().post(`/api/invitations/${token}/accept`, { password: 'not-my-password' })
    expect(wrong.status).toBe(400)
    expect(wrong.body.data.issues[0].path).toBe('body.password')
    const client = new Client()
    expect((await client.post(`/api/invitations/${token}/accept`, { password: TEST_PASSWORD })).status).toBe(200)
    let me = await client.get('/api/me')
    expect(me.body.practice.id).toBe(b.id)
    expect(me.body.role).toBe('senior_coach')
    expect(me.body.practices.map((p: { id: string }) => p.id).sort()).toEqual([a.id, b.id].sort())
    expect((await client.post('/api/me/practice', { practiceId: a.id })).status).toBe(200)
    me = await client.get('/api/me')
    expect(me.body).toMatchObject({ practice: { id: a.id }, role: 'junior_coach' })
    await resetRateLimits()
  })

  it('lets coaches invite clients but not staff', async () => {
    const coach = await signedIn(a.people.junior_coach.email)
    expect((await coach.post('/api/invitations', { email: uniqueEmail('client'), role: 'client' })).status).toBe(201)
    const refused = await coach.post('/api/invitations', { email: uniqueEmail('staff'), role: 'senior_coach' })
    expect(refused.status).toBe(403)
    expect(refused.body.message).toBe('Your role (Junior coach) may not invite members.')
  })

  it('does not invite someone who is already a member', async () => {
    const owner = await signedIn(a.people.owner.email)
    const reply = await owner.post('/api/invitations', { email: a.people.client.email, role: 'client' })
    expect(reply.status).toBe(400)
    expect(reply.body.data.issues[0]).toEqual({ path: 'body.email', message: 'This person is already a member of this practice.' })
  })

  it('stops a withdrawn invitation from working', async () => {
    const owner = await signedIn(a.people.owner.email)
    const { email, token } = await invite(owner, 'client')
    const [row] = await testDb().select().from(invitations).where(eq(invitations.email, email))
    expect((await owner.request('DELETE', `/api/members/invitations/${row!.id}`)).status).toBe(200)
    expect((await new Client().post(`/api/invitations/${token}/accept`, { name: 'Withdrawn', password: 'a-long-enough-pass' })).status).toBe(410)
  })
})

describe('roles and removal', () => {
  it('changes a role; the member\'s very next request uses it', async () => {
    const person = await addPerson(a.id, 'junior_coach')
    const member = await signedIn(person.email)
    expect((await member.get('/api/members')).status).toBe(403)
    const owner = await signedIn(a.people.owner.email)
    expect((await owner.request('PATCH', `/api/members/${person.membershipId}`, { role: 'owner' })).status).toBe(200)
    expect((await member.get('/api/members')).status).toBe(200)
    const [event] = await testDb().select().from(auditEvents).where(and(eq(auditEvents.subjectId, person.membershipId), eq(auditEvents.action, 'member.role_changed')))
    expect(event).toMatchObject({ actorId: a.people.owner.userId, practiceId: a.id, detail: { from: 'junior_coach', to: 'owner' } })
  })

  it('takes away access on the removed member\'s next request, with the same session cookie', async () => {
    const person = await addPerson(a.id, 'senior_coach')
    const member = await signedIn(person.email)
    expect((await member.get('/api/templates')).status).toBe(200)
    const owner = await signedIn(a.people.owner.email)
    expect((await owner.request('DELETE', `/api/members/${person.membershipId}`)).status).toBe(200)
    const after = await member.get('/api/templates')
    expect(after.status).toBe(403)
    expect(after.body.message).toMatch(/not a member of this practice/)
    const me = await member.get('/api/me')
    expect(me.body).toMatchObject({ role: null, practice: null, permissions: [] })
    const [event] = await testDb().select().from(auditEvents).where(and(eq(auditEvents.subjectId, person.membershipId), eq(auditEvents.action, 'member.removed')))
    expect(event).toBeDefined()
  })

  it('keeps at least one owner', async () => {
    const practice = await createPractice('Lone owner')
    const owner = await signedIn(practice.people.owner.email)
    const demote = await owner.request('PATCH', `/api/members/${practice.people.owner.membershipId}`, { role: 'reviewer' })
    expect(demote.status).toBe(409)
    expect(demote.body.message).toMatch(/at least one owner/)
    expect((await owner.request('DELETE', `/api/members/${practice.people.owner.membershipId}`)).status).toBe(409)
    const [row] = await testDb().select().from(memberships).where(eq(memberships.id, practice.people.owner.membershipId))
    expect(row!.role).toBe('owner')
  })
})

describe('tenancy', () => {
  it('answers another practice\'s member exactly like one that does not exist', async () => {
    const owner = await signedIn(a.people.owner.email)
    const theirs = await owner.request('PATCH', `/api/members/${b.people.client.membershipId}`, { role: 'reviewer' })
    const nobody = await owner.request('PATCH', `/api/members/${nanoid()}`, { role: 'reviewer' })
    expect(theirs.status).toBe(404)
    expect(nobody.status).toBe(404)
    const strip = (body: { url?: string }) => ({ ...body, url: undefined })
    expect(strip(theirs.body)).toEqual({ ...strip(nobody.body) })
    const [row] = await testDb().select().from(memberships).where(eq(memberships.id, b.people.client.membershipId))
    expect(row!.role).toBe('client')
  })

  it('lists only the caller\'s own practice in members and the audit log', async () => {
    const owner = await signedIn(a.people.owner.email)
    const members = await owner.get('/api/members')
    const emails: string[] = members.body.members.map((m: { email: string }) => m.email)
    expect(emails).toContain(a.people.client.email)
    for (const person of Object.values(b.people)) expect(emails).not.toContain(person.email)
    await signedIn(b.people.owner.email)
    const log = await owner.get('/api/audit?limit=200')
    expect(log.status).toBe(200)
    expect(log.body.events.length).toBeGreaterThan(0)
    const rows = await testDb().select({ id: auditEvents.id }).from(auditEvents).where(eq(auditEvents.practiceId, b.id))
    const theirIds = new Set(rows.map(r => r.id))
    expect(log.body.events.some((e: { id: string }) => theirIds.has(e.id))).toBe(false)
  })

  it('will not switch into a practice the person does not belong to', async () => {
    const coach = await signedIn(a.people.senior_coach.email)
    const reply = await coach.post('/api/me/practice', { practiceId: b.id })
    expect(reply.status).toBe(404)
    expect((await coach.get('/api/me')).body.practice.id).toBe(a.id)
  })

  it('cannot be widened by a practice id in the query or body', async () => {
    const owner = await signedIn(a.people.owner.email)
    const reply = await owner.request('PATCH', '/api/practice', { name: 'Renamed', practiceId: b.id })
    expect(reply.status).toBe(400)
    expect(reply.body.data.issues[0].path).toBe('body.practiceId')
  })
})

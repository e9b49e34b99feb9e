// Every API route the server has (read from the route files under server/api) × every role
// × the caller's own practice vs another practice, checked against the shared permission table.
// A new route file without an entry here fails the first test, so none slips through unguarded.
import { readdirSync, statSync } from 'node:fs'
import { join, relative } from 'node:path'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { nanoid } from 'nanoid'
import { ROLES, can, type Action, type Role } from '../../shared/permissions'
import { emptyProtocol } from '../../shared/studio/document'
import { invitations, templateDrafts, templates } from '../../server/db/schema'
import { Client, addPerson, closeTestDb, createPractice, resetRateLimits, testDb, uniqueEmail, type Person, type PracticeFixture } from './support/accounts'

type Who = Role | 'anonymous'
type Where = 'own' | 'other'

interface BuildContext { who: Who, person: Person | null, own: PracticeFixture, other: PracticeFixture, where: Where }

interface Case {
  label?: string
  /**
   * What the route requires: an action from the table, `signed-in` (any account),
   * or `public` (no sign-in; everyone gets `status`).
   */
  rule: Action | 'signed-in' | 'public'
  /** Status when the caller passes the rule (for public routes: for everyone). */
  status: number
  /** The route names a row by id: the other-practice variant must answer 404. */
  rowScoped?: boolean
  build: (c: BuildContext) => Promise<{ path: string, body?: unknown }> | { path: string, body?: unknown }
}

const randomToken = () => nanoid(43)

async function templateIn(practice: PracticeFixture, owner: Person) {
  const [template] = await testDb().insert(templates).values({ practiceId: practice.id, ownerId: owner.userId, name: `Matrix ${nanoid(4)}` }).returning()
  await testDb().insert(templateDrafts).values({ templateId: template!.id, practiceId: practice.id, document: emptyProtocol(template!.name), revision: 1, updatedBy: owner.userId })
  return template!.id
}

async function invitationIn(practice: PracticeFixture) {
  const [row] = await testDb().insert(invitations).values({
    practiceId: practice.id, email: uniqueEmail('pending'), role: 'client', tokenHash: nanoid(64), expiresAt: new Date(Date.now() + 86_400_000),
  }).returning()
  return row!.id
}

const target = (c: BuildContext) => (c.where === 'own' ? c.own : c.other)

/** The expected answer of every route. Keys are "METHOD /api/path" as the route files name them. */
const MATRIX: Record<string, Case[]> = {
  'GET /api/health': [{ rule: 'public', status: 200, build: () => ({ path: '/api/health' }) }],
  'POST /api/auth/sign-in': [{ label: 'empty body', rule: 'public', status: 400, build: () => ({ path: '/api/auth/sign-in', body: {} }) }],
  'POST /api/auth/sign-up': [{ label: 'empty body', rule: 'public', status: 400, build: () => ({ path: '/api/auth/sign-up', body: {} }) }],
  'POST /api/auth/forgot': [{ label: 'empty body', rule: 'public', status: 400, build: () => ({ path: '/api/auth/forgot', body: {} }) }],
  'POST /api/auth/reset': [{ label: 'unknown token', rule: 'public', status: 404, build: () => ({ path: '/api/auth/reset', body: { token: randomToken(), password: 'long-enough-password' } }) }],
  'POST /api/auth/sign-out': [{ rule: 'public', status: 200, build: () => ({ path: '/api/auth/sign-out' }) }],
  'GET /api/invitations/[token]': [{ label: 'unknown token', rule: 'public', status: 404, build: () => ({ path: `/api/invitations/${randomToken()}` }) }],
  'POST /api/invitations/[token]/accept': [{ label: 'unknown token', rule: 'public', status: 404, build: () => ({ path: `/api/invitations/${randomToken()}/accept`, body: {} }) }],
  // Exists only when LAMINA_LOCAL=1, as in this test run; elsewhere it answers 404 (see dev-routes test).
  'GET /api/dev/mail': [{ rule: 'public', status: 200, build: () => ({ path: '/api/dev/mail' }) }],

  'GET /api/me': [{ rule: 'signed-in', status: 200, build: () => ({ path: '/api/me' }) }],
  'PATCH /api/me': [{ rule: 'signed-in', status: 200, build: c => ({ path: '/api/me', body: { name: c.person?.name ?? 'Nobody' } }) }],
  'POST /api/me/password': [{ label: 'too-short new password', rule: 'signed-in', status: 400, build: () => ({ path: '/api/me/password', body: { currentPassword: 'x', newPassword: 'short' } }) }],
  'POST /api/me/practice': [{ rule: 'signed-in', status: 200, rowScoped: true, build: c => ({ path: '/api/me/practice', body: { practiceId: target(c).id } }) }],

  'POST /api/invitations': [
    { label: 'inviting a client', rule: 'clients.invite', status: 201, build: () => ({ path: '/api/invitations', body: { email: uniqueEmail('invitee'), role: 'client' } }) },
    { label: 'inviting a reviewer', rule: 'members.invite', status: 201, build: () => ({ path: '/api/invitations', body: { email: uniqueEmail('invitee'), role: 'reviewer' } }) },
  ],
  'GET /api/members': [{ rule: 'members.view', status: 200, build: () => ({ path: '/api/members' }) }],
  'PATCH /api/members/[id]': [{
    rule: 'members.manage', status: 200, rowScoped: true,
    build: async (c) => {
      const member = await addPerson(target(c).id, 'client')
      return { path: `/api/members/${member.membershipId}`, body: { role: 'reviewer' } }
    },
  }],
  'DELETE /api/members/[id]': [{
    rule: 'members.manage', status: 200, rowScoped: true,
    build: async c => ({ path: `/api/members/${(await addPerson(target(c).id, 'client')).membershipId}` }),
  }],
  'DELETE /api/members/invitations/[id]': [{
    rule: 'members.invite', status: 200, rowScoped: true,
    build: async c => ({ path: `/api/members/invitations/${await invitationIn(target(c))}` }),
  }],
  'PATCH /api/practice': [{ rule: 'practice.settings', status: 200, build: () => ({ path: '/api/practice', body: { guideline: 'acc-aha-2017' } }) }],
  'GET /api/audit': [{ rule: 'audit.view', status: 200, build: () => ({ path: '/api/audit?limit=5' }) }],

  // The shared engine: any member may run it; the block library is for staff.
  'POST /api/analyze': [{ label: 'empty body', rule: 'engine.use', status: 400, build: () => ({ path: '/api/analyze', body: {} }) }],
  'POST /api/bp/assess': [{ label: 'empty body', rule: 'engine.use', status: 400, build: () => ({ path: '/api/bp/assess', body: {} }) }],
  'POST /api/intensity/wall-squat': [{ label: 'empty body', rule: 'engine.use', status: 400, build: () => ({ path: '/api/intensity/wall-squat', body: {} }) }],
  'GET /api/blocks': [{ rule: 'library.view', status: 200, build: () => ({ path: '/api/blocks' }) }],

  'GET /api/starters': [{ rule: 'templates.view', status: 200, build: () => ({ path: '/api/starters' }) }],
  'GET /api/templates': [{ rule: 'templates.view', status: 200, build: () => ({ path: '/api/templates' }) }],
  'POST /api/templates': [{ rule: 'templates.create', status: 201, build: () => ({ path: '/api/templates', body: { name: 'Matrix protocol' } }) }],
  'GET /api/templates/[id]/draft': [{
    rule: 'templates.view', status: 200, rowScoped: true,
    build: async c => ({ path: `/api/templates/${await templateIn(target(c), target(c).people.senior_coach)}/draft` }),
  }],
  'PUT /api/templates/[id]/draft': [{
    label: 'the caller\'s own template', rule: 'templates.edit', status: 200, rowScoped: true,
    build: async (c) => {
      const author = c.where === 'own' && c.person ? c.person : target(c).people.senior_coach
      const id = await templateIn(target(c), author)
      return { path: `/api/templates/${id}/draft`, body: { document: emptyProtocol('Saved by the matrix'), baseRevision: 1 } }
    },
  }],
}

/** "METHOD /api/path" for every route file, as Nitro maps file names to routes. */
function routeFiles(): string[] {
  const root = join(process.cwd(), 'server', 'api')
  const walk = (dir: string): string[] => readdirSync(dir).flatMap((name) => {
    const full = join(dir, name)
    return statSync(full).isDirectory() ? walk(full) : [full]
  })
  return walk(root).filter(f => /\.(ts|js|mjs)$/.test(f)).map((file) => {
    const path = relative(root, file).replace(/\\/g, '/').replace(/\.(ts|js|mjs)$/, '')
    const match = /^(.*?)(?:\.(get|post|put|patch|delete|head|options))?$/.exec(path)!
    const route = `/api/${match[1]}`.replace(/\/index$/, '').replace(/^\/api\/index$/, '/api')
    return `${(match[2] ?? 'all').toUpperCase()} ${route}`
  }).sort()
}

function expected(c: Case, who: Who, where: Where): number {
  if (c.rule === 'public') return c.status
  if (who === 'anonymous') return 401
  if (c.rule !== 'signed-in' && !can(who, c.rule)) return 403
  if (where === 'other' && c.rowScoped) return 404
  return c.status
}

let own: PracticeFixture
let other: PracticeFixture
const sessions = new Map<Who, Client>()

beforeAll(async () => {
  await resetRateLimits()
  own = await createPractice('Matrix own')
  other = await createPractice('Matrix other')
  sessions.set('anonymous', new Client(undefined, false))
  for (const role of ROLES) {
    const client = await new Client().signIn(own.people[role].email)
    // Freeze the cookie: a route that signs out or switches practice must not change later rows.
    sessions.set(role, Object.assign(new Client(undefined, false), { cookies: new Map(client.cookies) }))
  }
})
afterAll(async () => {
  await resetRateLimits()
  await closeTestDb()
})

describe('authorization matrix', () => {
  it('has an entry for every route file, and no entry without one', () => {
    const files = routeFiles()
    const entries = Object.keys(MATRIX).sort()
    expect({ missingEntries: files.filter(f => !entries.includes(f)), staleEntries: entries.filter(e => !files.includes(e)) })
      .toEqual({ missingEntries: [], staleEntries: [] })
  })

  it.each(Object.keys(MATRIX))('%s answers each role as the permission table says', async (key) => {
    const method = key.split(' ')[0]!
    const mismatches: string[] = []
    for (const c of MATRIX[key]!) {
      for (const who of ['anonymous', ...ROLES] as Who[]) {
        for (const where of (c.rowScoped ? ['own', 'other'] : ['own']) as Where[]) {
          const person = who === 'anonymous' ? null : own.people[who]
          const { path, body } = await c.build({ who, person, own, other, where })
          const reply = await sessions.get(who)!.request(method, path, method === 'GET' || method === 'DELETE' ? undefined : (body ?? {}))
          const want = expected(c, who, where)
          if (reply.status !== want) {
            mismatches.push(`${c.label ?? ''} ${who} / ${where}: expected ${want}, got ${reply.status} ${JSON.stringify(reply.body).slice(0, 160)}`.trim())
          }
          // Whatever the status, the body never carries a stack trace or a 500.
          expect(reply.status).toBeLessThan(500)
        }
      }
    }
    expect(mismatches).toEqual([])
  })

  it('lets no role reach a route its role may not use (the table itself, read back from /api/me)', async () => {
    for (const role of ROLES) {
      const me = await sessions.get(role)!.get('/api/me')
      expect(me.body.role).toBe(role)
      const allowed = new Set(me.body.permissions)
      for (const action of Object.keys(await import('../../shared/permissions').then(m => m.ACTIONS)) as Action[]) {
        expect(allowed.has(action)).toBe(can(role, action))
      }
    }
  })
})

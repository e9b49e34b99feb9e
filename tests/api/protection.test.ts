// Protection around every request: security headers, same-origin checks, body size, and bad
// input (wrong types, unknown fields, SQL- and script-looking text) that never becomes a 500.
import { spawn } from 'node:child_process'
import { join } from 'node:path'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { inject } from 'vitest'
import fc from 'fast-check'
import { eq, sql } from 'drizzle-orm'
import { users } from '../../server/db/schema'
import { freePort } from '../setup/ports'
import { Client, closeTestDb, createPractice, resetRateLimits, signedIn, testDb, uniqueEmail, type PracticeFixture } from './support/accounts'

let practice: PracticeFixture
beforeAll(async () => {
  await resetRateLimits()
  practice = await createPractice('Protection')
})
afterAll(async () => {
  await resetRateLimits()
  await closeTestDb()
})

describe('security headers', () => {
  it('sends a strict policy on pages: own scripts plus hashes of the inline ones, no framing', async () => {
    const reply = await fetch(`${inject('baseUrl')}/sign-in`)
    const csp = reply.headers.get('content-security-policy') ?? ''
    expect(csp).toContain('default-src \'self\'')
    expect(csp).toContain('frame-ancestors \'none\'')
    expect(csp).not.toContain('unsafe-eval')
    expect(csp).not.toMatch(/script-src[^;]*unsafe-inline/)
    expect(reply.headers.get('x-content-type-options')).toBe('nosniff')
    expect(reply.headers.get('referrer-policy')).toBe('strict-origin-when-cross-origin')
    // Every executable inline script in the page is named by its hash.
    const html = await reply.text()
    const { createHash } = await import('node:crypto')
    for (const [, attrs = '', body = ''] of html.matchAll(/<script(\s[^>]*)?>([\s\S]*?)<\/script>/gi)) {
      if (/\ssrc=/.test(attrs) || /type="application\/json"/.test(attrs) || !body.trim()) continue
      expect(csp).toContain(`'sha256-${createHash('sha256').update(body).digest('base64')}'`)
    }
  })

  it('sends the same headers on API answers, and never lets them be cached', async () => {
    const reply = await fetch(`${inject('baseUrl')}/api/health`)
    expect(reply.headers.get('content-security-policy')).toContain('frame-ancestors \'none\'')
    expect(reply.headers.get('cache-control')).toBe('no-store')
  })
})

describe('same-origin check on requests that change something', () => {
  it('refuses a sign-in posted from another site, with a plain message', async () => {
    const reply = await new Client().request('POST', '/api/auth/sign-in', { email: practice.people.owner.email, password: 'x' }, { origin: 'https://elsewhere.example.test' })
    expect(reply.status).toBe(403)
    expect(reply.body.message).toMatch(/came from another site/)
  })

  it('refuses a cross-site fetch by its Sec-Fetch-Site header, even to nuxt-auth-utils\' own session route', async () => {
    const owner = await signedIn(practice.people.owner.email)
    const reply = await owner.request('DELETE', '/api/_auth/session', undefined, { 'sec-fetch-site': 'cross-site' })
    expect(reply.status).toBe(403)
    expect((await owner.get('/api/me')).status).toBe(200)
  })

  it('accepts the app\'s own origin', async () => {
    const owner = await signedIn(practice.people.owner.email)
    const reply = await owner.request('PATCH', '/api/me', { name: practice.people.owner.name }, { origin: inject('baseUrl'), 'sec-fetch-site': 'same-origin' })
    expect(reply.status).toBe(200)
  })

  it('does not hand the session\'s secure part to the browser', async () => {
    const owner = await signedIn(practice.people.owner.email)
    const session = await owner.get('/api/_auth/session')
    expect(session.body.user.email).toBe(practice.people.owner.email)
    expect(session.body.secure).toBeUndefined()
    expect(JSON.stringify(session.body)).not.toContain('passwordHash')
  })
})

describe('bad input', () => {
  it('answers an oversized body with 413 and a plain message', async () => {
    const reply = await new Client().request('POST', '/api/auth/sign-in', { email: 'a@b.test', password: 'x'.repeat(300 * 1024) })
    expect(reply.status).toBe(413)
    expect(reply.body.message).toMatch(/at most 256 KB/)
  })

  it('answers a body that is not JSON with 400 naming the body', async () => {
    const reply = await new Client().request('POST', '/api/auth/sign-in', '{"email": ', { 'content-type': 'application/json' })
    expect(reply.status).toBe(400)
  })

  it('names wrong types and unknown fields', async () => {
    const reply = await new Client().post('/api/auth/sign-in', { email: 42, password: ['x'], admin: true })
    expect(reply.status).toBe(400)
    expect(reply.body.data.issues).toEqual(expect.arrayContaining([
      { path: 'body.email', message: 'The e-mail address must be text.' },
      { path: 'body.password', message: 'The password must be text.' },
      { path: 'body.admin', message: 'This field is not part of the request; leave it out.' },
    ]))
  })

  it('rejects a role that does not exist and an id that is not one', async () => {
    const owner = await signedIn(practice.people.owner.email)
    const role = await owner.request('PATCH', `/api/members/${practice.people.client.membershipId}`, { role: 'superuser' })
    expect(role.status).toBe(400)
    expect(role.body.data.issues[0].path).toBe('body.role')
    const id = await owner.request('PATCH', `/api/members/${encodeURIComponent('1 OR 1=1; --')}`, { role: 'client' })
    expect(id.status).toBe(400)
    expect(id.body.data.issues[0].path).toBe('params.id')
  })

  it('stores SQL-looking and script-looking names as plain text and returns them unchanged', async () => {
    const name = '<script>alert(1)</script> Robert\'); DROP TABLE users; --'
    const email = uniqueEmail('odd')
    const client = new Client()
    const reply = await client.post('/api/auth/sign-up', { name, email, password: 'a-long-enough-pass', practiceName: '"; DELETE FROM practices; --' })
    expect(reply.status).toBe(201)
    const me = await client.get('/api/me')
    expect(me.body.user.name).toBe(name)
    expect(me.body.practice.name).toBe('"; DELETE FROM practices; --')
    const [row] = await testDb().select().from(users).where(eq(users.email, email))
    expect(row!.name).toBe(name)
    const [{ count }] = await testDb().execute<{ count: number }>(sql`SELECT count(*)::int AS count FROM practices`) as unknown as [{ count: number }]
    expect(count).toBeGreaterThan(1)
    // Sign-in with an injection-looking address is just a wrong address.
    const injected = await new Client().post('/api/auth/sign-in', { email: '\' OR \'1\'=\'1@x.test', password: '\' OR 1=1 --' })
    expect([400, 401]).toContain(injected.status)
    await resetRateLimits()
  })

  it('never answers random JSON bodies with a 500 on any route that takes a body', async () => {
    const owner = await signedIn(practice.people.owner.email)
    const routes: [string, string][] = [
      ['POST', '/api/auth/sign-up'], ['POST', '/api/auth/forgot'], ['POST', '/api/auth/reset'],
      ['POST', '/api/invitations'], ['PATCH', `/api/members/${practice.people.client.membershipId}`], ['PATCH', '/api/practice'],
      ['PATCH', '/api/me'], ['POST', '/api/me/practice'], ['POST', `/api/invitations/${'t'.repeat(43)}/accept`],
      ['POST', '/api/templates'],
    ]
    await fc.assert(fc.asyncProperty(fc.constantFrom(...routes), fc.jsonValue({ maxDepth: 3 }), async ([method, path], body) => {
      const reply = await owner.request(method, path, JSON.stringify(body), { 'content-type': 'application/json' })
      return reply.status < 500
    }), { numRuns: 120 })
    // The fuzzing could have renamed people; it cannot have broken the owner's session.
    expect((await owner.get('/api/me')).body.role).toBe('owner')
  })
})

describe('start-up and dev-only routes', () => {
  const serve = async (env: Record<string, string | undefined>) => {
    const port = await freePort()
    const child = spawn(process.execPath, [join(process.cwd(), '.output', 'server', 'index.mjs')], {
      env: { PATH: process.env.PATH, NODE_ENV: 'production', PORT: String(port), HOST: '127.0.0.1', DATABASE_URL: inject('databaseUrl'), ...env },
      stdio: ['ignore', 'pipe', 'pipe'],
    })
    let output = ''
    child.stdout!.on('data', (c) => { output += c })
    child.stderr!.on('data', (c) => { output += c })
    return { child, port, output: () => output }
  }

  it.each([
    ['no session password', undefined],
    ['a short one', 'too-short'],
    ['the local default', 'lamina-local-development-only-session-password-0001'],
  ])('refuses to start in production with %s', async (_, password) => {
    const { child, output } = await serve({ NUXT_SESSION_PASSWORD: password })
    const code = await new Promise<number | null>((resolve) => {
      const timer = setTimeout(() => { child.kill('SIGKILL'); resolve(null) }, 15_000)
      child.once('exit', (c) => { clearTimeout(timer); resolve(c) })
    })
    expect(code).not.toBe(0)
    expect(code).not.toBeNull()
    expect(output()).toMatch(/Lamina will not start in production: NUXT_SESSION_PASSWORD/)
  })

  it('starts with a real password, and then has no dev mail route', async () => {
    const { child, port } = await serve({ NUXT_SESSION_PASSWORD: 'a-real-production-secret-with-40-characters!' })
    try {
      let status = 0
      for (let i = 0; i < 100 && !status; i++) {
        status = await fetch(`http://127.0.0.1:${port}/api/dev/mail`).then(r => r.status, () => 0)
        if (!status) await new Promise(r => setTimeout(r, 100))
      }
      expect(status).toBe(404)
    }
    finally {
      child.kill('SIGTERM')
    }
  })
})

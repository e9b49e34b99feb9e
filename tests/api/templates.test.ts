// Templates and their drafts: create, read, save with a revision guard, and who may do what.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { emptyProtocol } from '../../shared/studio/document'
import type { Protocol } from '../../shared/protocol/schema'
import { Client, closeTestDb, createPractice, resetRateLimits, type PracticeFixture } from './support/accounts'

let own: PracticeFixture
let other: PracticeFixture
const as: Record<string, Client> = {}

const withHold = (name: string, hold = 45): Protocol => {
  const doc = emptyProtocol(name)
  doc.tracks[0]!.blocks.push({ kind: 'hold', id: 'hold-a', block: 'wall-squat', sets: 3, hold, rest: 60 })
  return doc
}

async function newTemplate(client: Client, body: Record<string, unknown> = {}) {
  const reply = await client.post('/api/templates', body)
  expect(reply.status).toBe(201)
  return reply.body.template.id as string
}

beforeAll(async () => {
  await resetRateLimits()
  own = await createPractice('Studio own')
  other = await createPractice('Studio other')
  for (const role of ['owner', 'senior_coach', 'junior_coach', 'reviewer', 'client'] as const) {
    as[role] = await new Client().signIn(own.people[role].email)
  }
  as.otherSenior = await new Client().signIn(other.people.senior_coach.email)
})
afterAll(async () => {
  await closeTestDb()
})

describe('template drafts', () => {
  it('creates an empty protocol at revision 1 that its author can open and edit', async () => {
    const id = await newTemplate(as.senior_coach!, { name: 'Morning wall squats' })
    const draft = await as.senior_coach!.get(`/api/templates/${id}/draft`)
    expect(draft.status).toBe(200)
    expect(draft.body.canEdit).toBe(true)
    expect(draft.body.draft.revision).toBe(1)
    expect(draft.body.draft.document.name).toBe('Morning wall squats')
    expect(draft.body.draft.document.tracks.map((t: { kind: string }) => t.kind)).toEqual(['body', 'breath'])
    const list = await as.senior_coach!.get('/api/templates')
    expect(list.body.templates.find((t: { id: string }) => t.id === id)).toMatchObject({ name: 'Morning wall squats', canEdit: true, revision: 1 })
  })

  it('saves on the current revision and answers a stale one with 409 and what is stored now', async () => {
    const id = await newTemplate(as.senior_coach!)
    const first = await as.senior_coach!.request('PUT', `/api/templates/${id}/draft`, { document: withHold('Saved first'), baseRevision: 1 })
    expect(first.status).toBe(200)
    expect(first.body.revision).toBe(2)

    const stale = await as.senior_coach!.request('PUT', `/api/templates/${id}/draft`, { document: withHold('Saved from an old tab', 30), baseRevision: 1 })
    expect(stale.status).toBe(409)
    expect(stale.body.message).toMatch(/saved elsewhere/i)
    expect(stale.body.data.current.revision).toBe(2)
    expect(stale.body.data.current.document.name).toBe('Saved first')
    expect(stale.body.data.current.updatedBy.name).toBe(own.people.senior_coach.name)

    // The stale save changed nothing; the template's name follows the saved document.
    const now = await as.senior_coach!.get(`/api/templates/${id}/draft`)
    expect(now.body.draft.revision).toBe(2)
    expect(now.body.draft.document.tracks[0].blocks[0].hold).toBe(45)
    expect(now.body.template.name).toBe('Saved first')
  })

  it('lets only one of two simultaneous saves on the same revision win', async () => {
    const id = await newTemplate(as.senior_coach!)
    const saves = await Promise.all([1, 2, 3, 4].map(n =>
      as.senior_coach!.request('PUT', `/api/templates/${id}/draft`, { document: withHold(`Racer ${n}`), baseRevision: 1 })))
    expect(saves.map(s => s.status).sort()).toEqual([200, 409, 409, 409])
    const now = await as.senior_coach!.get(`/api/templates/${id}/draft`)
    expect(now.body.draft.revision).toBe(2)
  })

  it('refuses a document outside the protocol format with 400 naming each field, and writes nothing', async () => {
    const id = await newTemplate(as.senior_coach!)
    const bad = { format: 1, name: '', tracks: [{ kind: 'body', blocks: [{ kind: 'hold', block: 'wall-squat', sets: 'four', hold: 30 }] }] }
    const reply = await as.senior_coach!.request('PUT', `/api/templates/${id}/draft`, { document: bad, baseRevision: 1 })
    expect(reply.status).toBe(400)
    const paths = reply.body.data.issues.map((i: { path: string }) => i.path)
    expect(paths).toContain('body.document.name')
    expect(paths).toContain('body.document.tracks.0.blocks.0.sets')
    const missingBase = await as.senior_coach!.request('PUT', `/api/templates/${id}/draft`, { document: withHold('x') })
    expect(missingBase.status).toBe(400)
    expect(missingBase.body.data.issues.map((i: { path: string }) => i.path)).toContain('body.baseRevision')
    const notJson = await as.senior_coach!.request('PUT', `/api/templates/${id}/draft`, '{"document":', { 'content-type': 'application/json' })
    expect(notJson.status).toBe(400)
    expect((await as.senior_coach!.get(`/api/templates/${id}/draft`)).body.draft.revision).toBe(1)
  })

  it('keeps a draft that the engine finds errors in (errors block approval, not saving)', async () => {
    const id = await newTemplate(as.senior_coach!)
    const reply = await as.senior_coach!.request('PUT', `/api/templates/${id}/draft`, { document: withHold('Half-edited', 0), baseRevision: 1 })
    expect(reply.status).toBe(200)
  })

  it('shows another coach\'s draft read-only and refuses their saves; a practice owner may save', async () => {
    const id = await newTemplate(as.senior_coach!)
    for (const role of ['junior_coach', 'reviewer'] as const) {
      const draft = await as[role]!.get(`/api/templates/${id}/draft`)
      expect(draft.status).toBe(200)
      expect(draft.body.canEdit).toBe(false)
      const save = await as[role]!.request('PUT', `/api/templates/${id}/draft`, { document: withHold('Not mine'), baseRevision: 1 })
      expect(save.status).toBe(403)
    }
    expect((await as.client!.get(`/api/templates/${id}/draft`)).status).toBe(403)
    const byOwner = await as.owner!.request('PUT', `/api/templates/${id}/draft`, { document: withHold('Owner fixed it'), baseRevision: 1 })
    expect(byOwner.status).toBe(200)
    expect((await as.owner!.get(`/api/templates/${id}/draft`)).body.canEdit).toBe(true)
  })

  it('answers 404 for a template of another practice, to read or to save', async () => {
    const id = await newTemplate(as.otherSenior!)
    expect((await as.senior_coach!.get(`/api/templates/${id}/draft`)).status).toBe(404)
    expect((await as.owner!.request('PUT', `/api/templates/${id}/draft`, { document: withHold('Intruder'), baseRevision: 1 })).status).toBe(404)
    const list = await as.senior_coach!.get('/api/templates')
    expect(list.body.templates.some((t: { id: string }) => t.id === id)).toBe(false)
    // And the other practice's draft is untouched.
    expect((await as.otherSenior!.get(`/api/templates/${id}/draft`)).body.draft.revision).toBe(1)
  })

  it('starts from each shipped starter with ids on every block and breathing tied by id', async () => {
    const starters = await as.senior_coach!.get('/api/starters')
    expect(starters.status).toBe(200)
    expect(starters.body.starters.length).toBeGreaterThanOrEqual(3)
    for (const starter of starters.body.starters) {
      const id = await newTemplate(as.senior_coach!, { starter: starter.id })
      const draft = await as.senior_coach!.get(`/api/templates/${id}/draft`)
      const doc = draft.body.draft.document as Protocol
      expect(doc.name).toBe(starter.name)
      const blocks = doc.tracks.flatMap(t => t.blocks as { id?: string, during?: object }[])
      expect(blocks.length).toBeGreaterThan(0)
      expect(blocks.every(b => typeof b.id === 'string')).toBe(true)
      expect(blocks.filter(b => b.during).every(b => 'id' in b.during!)).toBe(true)
    }
    const unknown = await as.senior_coach!.post('/api/templates', { starter: 'no-such-starter' })
    expect(unknown.status).toBe(400)
    expect(unknown.body.data.issues[0].path).toBe('body.starter')
    // Junior coaches clone approved versions instead of creating from nothing.
    expect((await as.junior_coach!.post('/api/templates', {})).status).toBe(403)
  })
})

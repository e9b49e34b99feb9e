import { describe, expect, inject, it } from 'vitest'
// @ts-expect-error plain ESM helper shared with the start script
import { cluster } from '../../scripts/lib/postgres.mjs'

const health = () => fetch(`${inject('baseUrl')}/api/health`)

describe('health', () => {
  it('reports 200 with the database up and 503 with a clear reason while it is stopped', async () => {
    const up = await health()
    expect(up.status).toBe(200)
    expect(await up.json()).toMatchObject({ status: 'ok', app: { status: 'up' }, database: { status: 'up' } })

    const pg = cluster({ dir: inject('pgDir'), port: inject('pgPort'), log: () => {} })
    pg.stop()
    try {
      const down = await health()
      expect(down.status).toBe(503)
      const body = await down.json()
      expect(body).toMatchObject({ status: 'degraded', app: { status: 'up' }, database: { status: 'down' } })
      expect(body.database.error).toMatch(/database is not reachable/i)
    }
    finally {
      await pg.start()
    }

    // The pool reconnects by itself once the server is back.
    let again = await health()
    for (let i = 0; i < 20 && again.status !== 200; i++) {
      await new Promise(resolve => setTimeout(resolve, 250))
      again = await health()
    }
    expect(again.status).toBe(200)
  })
})

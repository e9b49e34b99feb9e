import { readdirSync, readFileSync } from 'node:fs'
import { fileURLToPath } from 'node:url'
import { eq, sql } from 'drizzle-orm'
import { parse as parseYaml } from 'yaml'
import { ProtocolSchema, type Protocol } from '../../shared/protocol/schema'
import { normalizeDocument } from '../../shared/studio/document'
import type { Database } from './client'
import { DEMO_PASSWORD, DEMO_PEOPLE, DEMO_PRACTICE } from './demo'
import { appMeta, memberships, practices, templateDrafts, templates, users } from './schema'

const STARTERS = fileURLToPath(new URL('../../blocks/starters', import.meta.url))

/** The starter protocols shipped in blocks/starters, which the demo's senior coach begins with. */
function starterDocuments(): Protocol[] {
  return readdirSync(STARTERS).filter(f => /\.ya?ml$/.test(f)).sort()
    .map(f => normalizeDocument(ProtocolSchema.parse(parseYaml(readFileSync(`${STARTERS}/${f}`, 'utf8')))))
}

const SEED_KEY = 'demo_seed'

export type SeedOutcome = 'seeded' | 'already-seeded' | 'skipped-real-data'

/**
 * Seeds the demo practice once. Never twice (a marker row records it), and never
 * over real data (a database that already holds practices is left alone).
 * Runs in one transaction under an advisory lock, so two starts cannot race.
 */
export async function seedDemo(db: Database, hash: (password: string) => Promise<string>): Promise<SeedOutcome> {
  const passwordHash = await hash(DEMO_PASSWORD)
  return db.transaction(async (tx) => {
    await tx.execute(sql`SELECT pg_advisory_xact_lock(727001)`)
    const [marker] = await tx.select().from(appMeta).where(eq(appMeta.key, SEED_KEY))
    if (marker) return 'already-seeded'
    const [existing] = await tx.select({ id: practices.id }).from(practices).limit(1)
    if (existing) return 'skipped-real-data'

    const [practice] = await tx.insert(practices).values({ ...DEMO_PRACTICE, isDemo: true }).returning()
    let designer: string | undefined
    for (const person of DEMO_PEOPLE) {
      const [user] = await tx.insert(users).values({ name: person.name, email: person.email, passwordHash }).returning()
      await tx.insert(memberships).values({ practiceId: practice!.id, userId: user!.id, role: person.role })
      if (person.role === 'senior_coach') designer ??= user!.id
    }
    for (const document of designer ? starterDocuments() : []) {
      const [template] = await tx.insert(templates).values({ practiceId: practice!.id, ownerId: designer!, name: document.name }).returning()
      await tx.insert(templateDrafts).values({ templateId: template!.id, practiceId: practice!.id, document, revision: 1, updatedBy: designer })
    }
    await tx.insert(appMeta).values({ key: SEED_KEY, value: { practiceId: practice!.id, at: new Date().toISOString() } })
    return 'seeded'
  })
}

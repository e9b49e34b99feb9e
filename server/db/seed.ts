import { eq, sql } from 'drizzle-orm'
import type { Database } from './client'
import { DEMO_PASSWORD, DEMO_PEOPLE, DEMO_PRACTICE } from './demo'
import { appMeta, memberships, practices, users } from './schema'

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
    for (const person of DEMO_PEOPLE) {
      const [user] = await tx.insert(users).values({ name: person.name, email: person.email, passwordHash }).returning()
      await tx.insert(memberships).values({ practiceId: practice!.id, userId: user!.id, role: person.role })
    }
    await tx.insert(appMeta).values({ key: SEED_KEY, value: { practiceId: practice!.id, at: new Date().toISOString() } })
    return 'seeded'
  })
}

import { eq } from 'drizzle-orm'
import { PracticeSettingsBody } from '#shared/schemas/account'
import { practices } from '../../db/schema'

// Changes the current practice's settings: its name and the blood-pressure guideline it follows.
export default defineEventHandler(async (event) => {
  const ctx = await requireMember(event, 'practice.settings')
  const body = await readBodyWith(event, PracticeSettingsBody)
  const [updated] = await useDb().transaction(async (tx) => {
    const rows = await tx.update(practices).set(body).where(eq(practices.id, ctx.practice.id))
      .returning({ id: practices.id, name: practices.name, guideline: practices.guideline })
    await audit(event, ctx, 'practice.settings_changed', { type: 'practice', id: ctx.practice.id }, { ...body }, tx)
    return rows
  })
  return { practice: updated! }
})

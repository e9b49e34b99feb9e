import { eq } from 'drizzle-orm'
import { z } from 'zod'
import { IdSchema } from '#shared/schemas/account'
import { memberships } from '../../db/schema'

const Params = z.object({ id: IdSchema })

// Removes a member from the practice; their next request there is refused. The account stays.
export default defineEventHandler(async (event) => {
  const ctx = await requireMember(event, 'members.manage')
  const { id } = paramsWith(event, Params)
  await useDb().transaction(async (tx) => {
    const member = await lockMembership(tx, ctx.practice.id, id)
    if (member.role === 'owner') await keepAnOwner(tx, ctx.practice.id, member.id)
    await tx.delete(memberships).where(eq(memberships.id, member.id))
    await audit(event, ctx, 'member.removed', { type: 'membership', id: member.id }, { userId: member.userId, role: member.role }, tx)
  })
  return { removed: true }
})

import { eq } from 'drizzle-orm'
import { z } from 'zod'
import { IdSchema, RoleChangeBody } from '#shared/schemas/account'
import { memberships } from '../../db/schema'

const Params = z.object({ id: IdSchema })

// Changes a member's role. The practice always keeps at least one owner.
export default defineEventHandler(async (event) => {
  const ctx = await requireMember(event, 'members.manage')
  const { id } = paramsWith(event, Params)
  const body = await readBodyWith(event, RoleChangeBody)
  return useDb().transaction(async (tx) => {
    const member = await lockMembership(tx, ctx.practice.id, id)
    if (member.role === body.role) return { member: { id: member.id, role: member.role } }
    if (member.role === 'owner') await keepAnOwner(tx, ctx.practice.id, member.id)
    const [updated] = await tx.update(memberships).set({ role: body.role }).where(eq(memberships.id, member.id)).returning()
    await audit(event, ctx, 'member.role_changed', { type: 'membership', id: member.id }, { userId: member.userId, from: member.role, to: body.role }, tx)
    return { member: { id: updated!.id, role: updated!.role } }
  })
})

import { and, eq, isNull } from 'drizzle-orm'
import { z } from 'zod'
import { IdSchema } from '#shared/schemas/account'
import { invitations } from '../../../db/schema'

const Params = z.object({ id: IdSchema })

// Withdraws an open invitation: its link stops working at once.
export default defineEventHandler(async (event) => {
  const ctx = await requireMember(event, 'members.invite')
  const { id } = paramsWith(event, Params)
  await useDb().transaction(async (tx) => {
    const [withdrawn] = await tx.update(invitations).set({ revokedAt: new Date() })
      .where(and(rowInPractice(invitations, id, ctx), isNull(invitations.acceptedAt), isNull(invitations.revokedAt)))
      .returning({ id: invitations.id, email: invitations.email })
    if (!withdrawn) throw notFound('open invitation')
    await audit(event, ctx, 'invitation.withdrawn', { type: 'invitation', id: withdrawn.id }, { email: withdrawn.email }, tx)
  })
  return { withdrawn: true }
})

import { and, eq, sql } from 'drizzle-orm'
import { z } from 'zod'
import { ProtocolSchema } from '#shared/protocol/schema'
import { templateDrafts, templates } from '../../../db/schema'

const Params = z.object({ id: z.string().min(1).max(64) })
// Drafts may hold engine errors while being edited (they block approval, not saving);
// only a document outside the protocol format is refused.
const SaveDraft = z.strictObject({
  document: ProtocolSchema,
  baseRevision: z.int().min(1),
})

// Saves a draft if nobody saved since `baseRevision`; otherwise 409 with what is stored now.
export default defineEventHandler(async (event) => {
  const context = await requireMember(event, 'templates.edit')
  const { id } = paramsWith(event, Params)
  const body = await readBodyWith(event, SaveDraft)
  const current = await loadTemplateWithDraft(context, id)
  if (!mayEditDraft(context, current.template.ownerId)) {
    throw createError({ status: 403, message: `Only the template's author (${current.ownerName}) or a practice owner may change this draft.` })
  }

  const saved = await useDb().transaction(async (tx) => {
    // One conditional statement: two saves on the same base revision cannot both win.
    const [row] = await tx.update(templateDrafts)
      .set({ document: body.document, revision: sql`${templateDrafts.revision} + 1`, updatedBy: context.user.id, updatedAt: new Date() })
      .where(and(eq(templateDrafts.templateId, id), eq(templateDrafts.practiceId, context.practice.id), eq(templateDrafts.revision, body.baseRevision)))
      .returning({ revision: templateDrafts.revision, updatedAt: templateDrafts.updatedAt })
    if (!row) return null
    await tx.update(templates).set({ name: body.document.name, updatedAt: new Date() })
      .where(and(eq(templates.id, id), eq(templates.practiceId, context.practice.id)))
    return row
  })

  if (!saved) {
    const latest = await loadTemplateWithDraft(context, id)
    throw createError({
      status: 409,
      message: `This draft was saved elsewhere (revision ${latest.draft.revision}) after the revision ${body.baseRevision} you edited.`,
      data: { current: { ...latest.draft, updatedBy: latest.updatedBy } },
    })
  }
  return { revision: saved.revision, updatedAt: saved.updatedAt }
})

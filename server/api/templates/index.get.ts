import { and, desc, eq, isNull } from 'drizzle-orm'
import { templateDrafts, templates, users } from '../../db/schema'

// The practice's templates, newest first, each with whether the caller may edit its draft.
export default defineEventHandler(async (event) => {
  const context = await requireMember(event, 'templates.view')
  const rows = await useDb()
    .select({
      id: templates.id,
      name: templates.name,
      tags: templates.tags,
      ownerId: templates.ownerId,
      ownerName: users.name,
      revision: templateDrafts.revision,
      document: templateDrafts.document,
      updatedAt: templateDrafts.updatedAt,
    })
    .from(templates)
    .innerJoin(templateDrafts, eq(templateDrafts.templateId, templates.id))
    .innerJoin(users, eq(users.id, templates.ownerId))
    .where(and(eq(templates.practiceId, context.practice.id), isNull(templates.archivedAt)))
    .orderBy(desc(templateDrafts.updatedAt))
  return {
    templates: await Promise.all(rows.map(async ({ document, ...row }) => ({
      ...row,
      summary: await summarize(document),
      canEdit: mayEditDraft(context, row.ownerId),
    }))),
  }
})

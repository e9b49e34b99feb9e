import { z } from 'zod'

const Params = z.object({ id: z.string().min(1).max(64) })

// A template's draft; `canEdit` says whether the caller may save it (others see it read-only).
export default defineEventHandler(async (event) => {
  const context = await requireMember(event, 'templates.view')
  const { id } = paramsWith(event, Params)
  const row = await loadTemplateWithDraft(context, id)
  return {
    template: { ...row.template, ownerName: row.ownerName },
    draft: { ...row.draft, updatedBy: row.updatedBy },
    canEdit: mayEditDraft(context, row.template.ownerId),
  }
})

import { z } from 'zod'
import { ProtocolSchema } from '#shared/protocol/schema'
import { emptyProtocol, normalizeDocument } from '#shared/studio/document'
import { templateDrafts, templates } from '../../db/schema'

const CreateTemplate = z.strictObject({
  name: z.string().trim().min(1, 'Give the protocol a name.').max(200).optional(),
  starter: z.string().regex(/^[a-z0-9-]{1,64}$/, 'Name a starter by its id.').optional(),
  document: ProtocolSchema.optional(),
}).refine(b => !(b.starter && b.document), { message: 'Send a starter or a document, not both.', path: ['starter'] })

// A new template owned by the caller, with its draft at revision 1: empty, from a starter or from a document.
export default defineEventHandler(async (event) => {
  const context = await requireMember(event, 'templates.create')
  const body = await readBodyWith(event, CreateTemplate)
  let document = body.document ? normalizeDocument(body.document) : emptyProtocol(body.name)
  if (body.starter) {
    const starter = (await loadStarters()).find(s => s.id === body.starter)
    if (!starter) throw badRequest([{ path: 'body.starter', message: `There is no starter "${body.starter}".` }])
    document = starter.document
  }
  if (body.name) document.name = body.name

  const created = await useDb().transaction(async (tx) => {
    const [template] = await tx.insert(templates).values({
      practiceId: context.practice.id, ownerId: context.user.id, name: document.name,
    }).returning({ id: templates.id, name: templates.name })
    await tx.insert(templateDrafts).values({
      templateId: template!.id, practiceId: context.practice.id, document, revision: 1, updatedBy: context.user.id,
    })
    await audit(event, context, 'template.create', { type: 'template', id: template!.id }, { starter: body.starter ?? null }, tx)
    return template!
  })
  setResponseStatus(event, 201)
  return { template: created, draft: { document, revision: 1 } }
})

import { and, eq, isNull } from 'drizzle-orm'
import { alias } from 'drizzle-orm/pg-core'
import { parse as parseYaml } from 'yaml'
import { can } from '#shared/permissions'
import { analyze } from '#shared/protocol/analyze'
import { ProtocolSchema, type Protocol } from '#shared/protocol/schema'
import { normalizeDocument } from '#shared/studio/document'
import { templateDrafts, templates, users } from '../db/schema'
import type { MemberContext } from './auth'
import { notFound } from './tenancy'

/** Only the template's author, or an owner of the practice, may change its draft. */
export function mayEditDraft(context: MemberContext, ownerId: string): boolean {
  return context.role === 'owner' || (context.user.id === ownerId && can(context.role, 'templates.edit'))
}

/** The template with its draft and the names of its author and last editor, in the caller's practice; 404 otherwise. */
export async function loadTemplateWithDraft(context: MemberContext, id: string) {
  const editor = alias(users, 'editor')
  const [row] = await useDb()
    .select({
      template: { id: templates.id, name: templates.name, tags: templates.tags, ownerId: templates.ownerId, updatedAt: templates.updatedAt },
      ownerName: users.name,
      draft: { document: templateDrafts.document, revision: templateDrafts.revision, updatedAt: templateDrafts.updatedAt },
      updatedBy: { id: editor.id, name: editor.name },
    })
    .from(templates)
    .innerJoin(templateDrafts, eq(templateDrafts.templateId, templates.id))
    .innerJoin(users, eq(users.id, templates.ownerId))
    .leftJoin(editor, eq(editor.id, templateDrafts.updatedBy))
    .where(and(eq(templates.id, id), eq(templates.practiceId, context.practice.id), isNull(templates.archivedAt)))
  if (!row) throw notFound('template')
  return row
}

/** A starter protocol shipped in blocks/starters. */
export interface Starter {
  id: string
  name: string
  notes: string | undefined
  document: Protocol
}

/** Reads and validates every starter; a broken file is a server fault worth naming. */
export async function loadStarters(): Promise<Starter[]> {
  const storage = useStorage('assets:blocks')
  const keys = (await storage.getKeys('starters')).filter(k => /\.ya?ml$/.test(k)).sort()
  const starters: Starter[] = []
  for (const key of keys) {
    const raw = await storage.getItemRaw(key)
    const text = typeof raw === 'string' ? raw : new TextDecoder().decode(raw as Uint8Array)
    const parsed = ProtocolSchema.safeParse(parseYaml(text))
    if (!parsed.success) {
      throw createError({ status: 500, message: `The starter ${key} does not match the protocol format: ${parsed.error.issues[0]?.message}` })
    }
    const id = key.replace(/^starters:/, '').replace(/\.ya?ml$/, '')
    starters.push({ id, name: parsed.data.name, notes: parsed.data.notes, document: normalizeDocument(parsed.data) })
  }
  return starters
}

/** The few figures a list shows for a protocol, from the shared engine; null for a document outside the format. */
export async function summarize(document: unknown) {
  const parsed = ProtocolSchema.safeParse(document)
  if (!parsed.success) return null
  const { blocks, rules } = await useEngineLibrary()
  const { metrics, findings } = analyze(parsed.data, { library: blocks, rules })
  return {
    blocks: parsed.data.tracks.reduce((n, t) => n + t.blocks.length, 0),
    sessionSeconds: metrics.sessionSeconds,
    tensionSeconds: metrics.tensionSeconds,
    breathSeconds: metrics.breathSeconds,
    retentionUnderTensionSeconds: metrics.retentionUnderTensionSeconds,
    errors: findings.filter(f => f.severity === 'error').length,
  }
}

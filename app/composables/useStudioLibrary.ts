// The block library and rules the studio analyzes against, validated on the server
// (the browser never loads ajv) and fetched once per page.
import type { LibraryBlock, Rule } from '#shared/library/types'

export interface StudioLibrary { blocks: LibraryBlock[], rules: Rule[] }

export async function fetchStudioLibrary(): Promise<StudioLibrary> {
  const res = await $fetch<{ blocks?: LibraryBlock[], rules?: Rule[] }>('/api/blocks')
  const blocks = res.blocks ?? []
  const rules = res.rules ?? (await $fetch<{ rules: Rule[] }>('/api/blocks/rules')).rules
  return { blocks, rules }
}

import { defineStore } from 'pinia'
import { watchDebounced } from '@vueuse/core'
import { analyze } from '#shared/protocol/analyze'
import type { ClientProfile } from '#shared/protocol/profile'
import type { BreathBlock, HoldBlock, Protocol, ProtocolBlock, RestBlock } from '#shared/protocol/schema'
import type { LibraryBlock, Rule } from '#shared/library/types'
import { emptyProtocol, findBlock, fitsTrack, newBlockId, normalizeDocument } from '#shared/studio/document'

/** What the server holds when a save lost the race against another one. */
export interface TheirDraft {
  document: Protocol
  revision: number
  updatedAt: string
  updatedBy: { id: string, name: string } | null
}

export type SaveStatus = 'saved' | 'pending' | 'saving' | 'invalid' | 'conflict' | 'offline' | 'read-only'

interface Step { json: string, label: string }

/** Undo keeps this many steps (the floor promised to coaches is 50). */
export const UNDO_LIMIT = 200
/** Edits of one field within this window count as one undo step (typing "120" is one change). */
const COALESCE_MS = 1200

/** A new block for `lib` with the library's defaults and a fresh id. */
export function blockFromLibrary(lib: LibraryBlock): ProtocolBlock {
  const id = newBlockId()
  if (lib.kind === 'hold') {
    const block: HoldBlock = { kind: 'hold', id, block: lib.id, sets: lib.defaults.sets, hold: lib.defaults.hold, rest: lib.defaults.rest }
    if (lib.defaults.target) block.target = { ...lib.defaults.target }
    return block
  }
  if (lib.kind === 'rest') return { kind: 'rest', id, block: lib.id, rest: lib.defaults.rest } satisfies RestBlock
  const block: BreathBlock = { kind: 'breath', id, block: lib.id }
  if (lib.defaults.cycles !== undefined && lib.defaults.duration === undefined) block.cycles = lib.defaults.cycles
  else block.duration = lib.defaults.duration ?? 60
  return block
}

export const useStudioStore = defineStore('studio', () => {
  const templateId = ref<string | null>(null)
  const document = ref<Protocol>(emptyProtocol())
  const canEdit = ref(false)
  const revision = ref(0)
  const version = ref(0)
  const savedVersion = ref(0)
  const undoStack = shallowRef<Step[]>([])
  const redoStack = shallowRef<Step[]>([])
  const selectedId = ref<string | null>(null)
  /** The block that takes Tab focus on the tracks (roving tabindex). */
  const focusId = ref<string | null>(null)
  const library = shallowRef<LibraryBlock[]>([])
  const rules = shallowRef<Rule[]>([])
  const profile = shallowRef<ClientProfile | undefined>()
  const sessionsPerWeek = ref(3)
  const saveStatus = ref<SaveStatus>('saved')
  const saveIssues = shallowRef<{ path: string, message: string }[]>([])
  const conflict = shallowRef<TheirDraft | null>(null)
  const announcement = ref('')
  let lastCoalesce = { key: '', at: 0 }

  const member = useMemberStore()
  const libraryById = computed(() => new Map(library.value.map(b => [b.id, b])))
  // The shared engine, re-run on every change; `version` is the one dependency.
  const analysis = computed(() => {
    void version.value
    return analyze(toRaw(document.value), {
      library: library.value,
      rules: rules.value,
      // A client is judged by the guideline their practice follows unless the profile names one.
      profile: profile.value && { guideline: member.practice?.guideline, ...profile.value },
      sessionsPerWeek: sessionsPerWeek.value,
    })
  })
  // Worst finding per block id, for the marks drawn on the tracks.
  const blockSeverity = computed(() => {
    const rank = { error: 3, warning: 2, info: 1 } as const
    const out = new Map<string, 'error' | 'warning' | 'info'>()
    for (const f of analysis.value.findings) {
      const id = f.location.blockId
      if (!id) continue
      const seen = out.get(id)
      if (!seen || rank[f.severity] > rank[seen]) out.set(id, f.severity)
    }
    return out
  })
  const dirty = computed(() => version.value !== savedVersion.value)
  const selected = computed(() => {
    void version.value
    return selectedId.value ? findBlock(document.value, selectedId.value) : undefined
  })

  function announce(message: string) {
    // A changed string is what screen readers notice; repeat messages get a trailing space toggle.
    announcement.value = announcement.value === message ? `${message} ` : message
  }

  function load(input: { templateId: string, document: Protocol, revision: number, canEdit: boolean, library: LibraryBlock[], rules: Rule[] }) {
    templateId.value = input.templateId
    library.value = input.library
    rules.value = input.rules
    document.value = normalizeDocument(input.document)
    revision.value = input.revision
    canEdit.value = input.canEdit
    undoStack.value = []
    redoStack.value = []
    selectedId.value = null
    conflict.value = null
    saveIssues.value = []
    version.value++
    savedVersion.value = version.value
    saveStatus.value = input.canEdit ? 'saved' : 'read-only'
  }

  /** Every edit goes through here: one undo step (or coalesced), the change, an announcement. */
  function change(label: string, mutate: (doc: Protocol) => void, coalesceKey?: string) {
    if (!canEdit.value) return
    const now = Date.now()
    const merge = coalesceKey !== undefined && coalesceKey === lastCoalesce.key && now - lastCoalesce.at < COALESCE_MS
    if (!merge) {
      const steps = [...undoStack.value, { json: JSON.stringify(toRaw(document.value)), label }]
      undoStack.value = steps.length > UNDO_LIMIT ? steps.slice(-UNDO_LIMIT) : steps
    }
    lastCoalesce = { key: coalesceKey ?? '', at: now }
    redoStack.value = []
    mutate(document.value)
    version.value++
    announce(label)
  }

  function restore(from: typeof undoStack, to: typeof undoStack, verb: string) {
    const step = from.value.at(-1)
    if (!step || !canEdit.value) return
    from.value = from.value.slice(0, -1)
    to.value = [...to.value, { json: JSON.stringify(toRaw(document.value)), label: step.label }]
    document.value = JSON.parse(step.json) as Protocol
    lastCoalesce = { key: '', at: 0 }
    if (selectedId.value && !findBlock(document.value, selectedId.value)) selectedId.value = null
    version.value++
    announce(`${verb}: ${step.label}`)
  }
  const undo = () => restore(undoStack, redoStack, 'Undone')
  const redo = () => restore(redoStack, undoStack, 'Redone')

  const nameOf = (block: ProtocolBlock) => (block.block && libraryById.value.get(block.block)?.name) || 'Custom breathing'
  const trackName = (t: number) => {
    const track = document.value.tracks[t]
    return track?.label || (track?.kind === 'breath' ? 'Breath track' : 'Body track')
  }

  function insertBlock(track: number, index: number, block: ProtocolBlock) {
    const target = document.value.tracks[track]
    if (!target || !fitsTrack(block.kind, target)) return false
    change(`Added ${nameOf(block)} to ${trackName(track)} at position ${index + 1}`, (doc) => {
      (doc.tracks[track]!.blocks as ProtocolBlock[]).splice(index, 0, block)
    })
    selectedId.value = block.id ?? null
    return true
  }

  function moveBlock(id: string, track: number, index: number) {
    const from = findBlock(document.value, id)
    const target = document.value.tracks[track]
    if (!from || !target || !fitsTrack(from.block.kind, target)) return false
    const count = target.blocks.length - (from.track === track ? 1 : 0)
    const to = Math.max(0, Math.min(index, count))
    if (from.track === track && from.index === to) return false
    const where = from.track === track ? `position ${to + 1} of ${count + 1}` : `${trackName(track)}, position ${to + 1}`
    change(`Moved ${nameOf(from.block)} to ${where}`, (doc) => {
      const [moved] = (doc.tracks[from.track]!.blocks as ProtocolBlock[]).splice(from.index, 1)
      ;(doc.tracks[track]!.blocks as ProtocolBlock[]).splice(to, 0, moved!)
    })
    return true
  }

  function removeBlock(id: string) {
    const at = findBlock(document.value, id)
    if (!at) return
    change(`Removed ${nameOf(at.block)} from ${trackName(at.track)}`, (doc) => {
      doc.tracks[at.track]!.blocks.splice(at.index, 1)
    })
    if (selectedId.value === id) selectedId.value = null
  }

  /** Sets fields of a block; `undefined` removes a field. */
  function updateBlock(id: string, fields: Record<string, unknown>, label: string) {
    const at = findBlock(document.value, id)
    if (!at) return
    change(`${label} (${nameOf(at.block)})`, () => {
      const target = at.block as Record<string, unknown>
      for (const [key, value] of Object.entries(fields)) {
        if (value === undefined) delete target[key]
        else target[key] = value
      }
    }, `${id}:${Object.keys(fields).join(',')}`)
  }

  function addTrack(kind: 'body' | 'breath') {
    change(`Added a ${kind} track`, (doc) => {
      doc.tracks.push(kind === 'body'
        ? { id: newBlockId(), kind, label: 'Body', blocks: [] }
        : { id: newBlockId(), kind, label: 'Breath', blocks: [] })
    })
  }

  function removeTrack(index: number) {
    const track = document.value.tracks[index]
    if (!track || track.blocks.length > 0) return
    change(`Removed ${trackName(index)}`, doc => void doc.tracks.splice(index, 1))
  }

  function rename(name: string) {
    change('Renamed the protocol', (doc) => { doc.name = name }, 'name')
  }

  // Autosave: a quiet second after the last change, at most every 5 s while editing goes on.
  let inFlight: Promise<void> | null = null
  async function save(options: { force?: boolean } = {}) {
    if (!templateId.value || !canEdit.value) return
    if (conflict.value && !options.force) return
    if (inFlight) await inFlight
    if (!dirty.value && !options.force) return
    const sent = version.value
    saveStatus.value = 'saving'
    inFlight = (async () => {
      try {
        const result = await $fetch<{ revision: number }>(`/api/templates/${templateId.value}/draft`, {
          method: 'PUT', body: { document: toRaw(document.value), baseRevision: revision.value },
        })
        revision.value = result.revision
        savedVersion.value = sent
        saveIssues.value = []
        saveStatus.value = version.value === sent ? 'saved' : 'pending'
      }
      catch (error) {
        const status = (error as { statusCode?: number }).statusCode
        const data = (error as { data?: { data?: { issues?: { path: string, message: string }[], current?: TheirDraft } } }).data?.data
        if (status === 409 && data?.current) {
          conflict.value = data.current
          saveStatus.value = 'conflict'
        }
        else if (status === 400) {
          saveIssues.value = data?.issues ?? [{ path: 'document', message: 'The server refused the draft.' }]
          saveStatus.value = 'invalid'
        }
        else {
          saveStatus.value = 'offline'
        }
      }
      finally {
        inFlight = null
      }
    })()
    await inFlight
    // Edits made while the request was out go in the next save.
    if ((saveStatus.value as SaveStatus) === 'pending') void save()
  }
  watch(version, () => {
    if (dirty.value && canEdit.value && !conflict.value) saveStatus.value = 'pending'
  })
  watchDebounced(version, () => void save(), { debounce: 1000, maxWait: 5000 })

  /** The page is going away with edits not yet saved: send them in a request that outlives it. */
  function saveOnExit() {
    if (!templateId.value || !canEdit.value || !dirty.value || conflict.value) return
    void fetch(`/api/templates/${templateId.value}/draft`, {
      method: 'PUT', keepalive: true, headers: { 'content-type': 'application/json' },
      body: JSON.stringify({ document: toRaw(document.value), baseRevision: revision.value }),
    }).catch(() => {})
  }

  /** Conflict: keep what this page holds, saving it over the newer revision. */
  async function keepMine() {
    if (!conflict.value) return
    revision.value = conflict.value.revision
    conflict.value = null
    await save({ force: true })
  }

  /** Conflict: take the other revision; this page's version stays one undo step away. */
  function takeTheirs() {
    const theirs = conflict.value
    if (!theirs) return
    undoStack.value = [...undoStack.value, { json: JSON.stringify(toRaw(document.value)), label: 'Took the other saved version' }].slice(-UNDO_LIMIT)
    redoStack.value = []
    document.value = normalizeDocument(theirs.document)
    revision.value = theirs.revision
    conflict.value = null
    version.value++
    savedVersion.value = version.value
    saveStatus.value = 'saved'
    announce('Took the other saved version; undo brings yours back')
  }

  return {
    templateId, document, canEdit, revision, version, dirty, undoStack, redoStack, selectedId, focusId, selected, blockSeverity,
    library, libraryById, rules, profile, sessionsPerWeek, analysis, saveStatus, saveIssues, conflict, announcement,
    load, change, undo, redo, insertBlock, moveBlock, removeBlock, updateBlock, addTrack, removeTrack, rename,
    save, saveOnExit, keepMine, takeTheirs, announce, nameOf, trackName,
  }
})

// The keyboard path for everything a drag does on the tracks: focus moves with the
// arrows (roving tabindex), Alt+arrows move the block, Delete removes, Enter selects.
import type { ProtocolBlock } from '#shared/protocol/schema'
import { findBlock, fitsTrack } from '#shared/studio/document'

/** Focuses the block element with `id` once the DOM shows the change. */
export function focusStudioBlock(id: string | null | undefined) {
  if (!id) return
  void nextTick(() => {
    const el = document.querySelector<HTMLElement>(`[data-block-id="${CSS.escape(id)}"]`)
    el?.focus()
    el?.scrollIntoView({ block: 'nearest', inline: 'nearest' })
  })
}

export function useStudioKeys() {
  const store = useStudioStore()
  const blocksOf = (t: number) => (store.document.tracks[t]?.blocks ?? []) as ProtocolBlock[]

  /** The nearest track above (-1) or below (+1) that takes this kind of block. */
  function compatibleTrack(from: number, dir: -1 | 1, kind: ProtocolBlock['kind'] | null): number {
    for (let t = from + dir; t >= 0 && t < store.document.tracks.length; t += dir) {
      const track = store.document.tracks[t]!
      if (kind === null ? track.blocks.length > 0 : fitsTrack(kind, track)) return t
    }
    return -1
  }

  function focus(id: string | undefined) {
    if (!id) return
    store.focusId = id
    focusStudioBlock(id)
  }

  function onKeydown(event: KeyboardEvent, id: string) {
    const at = findBlock(store.document, id)
    if (!at) return
    const { track, index, block } = at
    const list = blocksOf(track)
    const key = event.key
    let handled = true
    if (event.altKey && (key === 'ArrowLeft' || key === 'ArrowRight')) {
      if (store.moveBlock(id, track, index + (key === 'ArrowLeft' ? -1 : 1))) focus(id)
      else store.announce(key === 'ArrowLeft' ? 'Already the first block on this track' : 'Already the last block on this track')
    }
    else if (event.altKey && (key === 'ArrowUp' || key === 'ArrowDown')) {
      const to = compatibleTrack(track, key === 'ArrowUp' ? -1 : 1, block.kind)
      if (to >= 0 && store.moveBlock(id, to, index)) focus(id)
      else store.announce(`No ${block.kind === 'breath' ? 'breath' : 'body'} track ${key === 'ArrowUp' ? 'above' : 'below'}`)
    }
    else if (key === 'ArrowLeft' || key === 'ArrowRight') {
      focus(list[index + (key === 'ArrowLeft' ? -1 : 1)]?.id)
    }
    else if (key === 'Home' || key === 'End') {
      focus((key === 'Home' ? list[0] : list.at(-1))?.id)
    }
    else if (key === 'ArrowUp' || key === 'ArrowDown') {
      const to = compatibleTrack(track, key === 'ArrowUp' ? -1 : 1, null)
      if (to >= 0) focus(blocksOf(to)[Math.min(index, blocksOf(to).length - 1)]?.id)
    }
    else if (key === 'Delete' || key === 'Backspace') {
      const next = list[index + 1]?.id ?? list[index - 1]?.id
      store.removeBlock(id)
      if (next) focus(next)
      else store.focusId = null
    }
    else if (key === 'Enter' || key === ' ') {
      store.selectedId = id
      store.focusId = id
      store.announce(`Selected ${store.nameOf(block)}; its settings are in the inspector`)
    }
    else if (key === 'Escape') {
      store.selectedId = null
    }
    else {
      handled = false
    }
    if (handled) event.preventDefault()
  }

  return { onKeydown }
}

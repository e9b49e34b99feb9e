import { loadLibrary } from '#shared/library/load'
import type { LibraryFile } from '#shared/library/load'
import type { Library } from '#shared/library/types'

// The block library and rules from blocks/, bundled as Nitro server assets
// (`serverAssets: [{ baseName: 'blocks', dir: '../blocks' }]`), so the built server
// does not depend on the working directory. Loaded and validated once per process.

let loading: Promise<Library> | undefined

async function filesUnder(prefix: string): Promise<LibraryFile[]> {
  const storage = useStorage('assets:blocks')
  const keys = (await storage.getKeys(prefix)).filter(k => /\.ya?ml$/.test(k)).sort()
  return Promise.all(keys.map(async (key) => {
    const raw = await storage.getItemRaw(key)
    const text = typeof raw === 'string' ? raw : new TextDecoder().decode(raw as Uint8Array)
    return { name: `blocks/${key.replace(/:/g, '/')}`, text }
  }))
}

/** The validated block library and rules; a broken library file fails with its file, line and field. */
export function useEngineLibrary(): Promise<Library> {
  loading ??= (async () => loadLibrary({ blocks: await filesUnder('library'), rules: await filesUnder('rules') }))()
    .catch((error: unknown) => {
      loading = undefined
      throw createError({ status: 500, message: `The block library could not be loaded: ${error instanceof Error ? error.message : String(error)}` })
    })
  return loading
}

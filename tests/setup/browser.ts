// Debian's Chromium driven by playwright-core. A browser test fails (never skips) when it is missing.
import { existsSync, mkdirSync, mkdtempSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { chromium, type BrowserContext } from 'playwright-core'

export const CHROMIUM = process.env.CHROMIUM_PATH || '/usr/bin/chromium'
export const ARTIFACTS = join(process.cwd(), 'artifacts')

/** A fresh, isolated Chromium profile; close it in afterAll. */
export async function openBrowser(): Promise<BrowserContext> {
  if (!existsSync(CHROMIUM)) {
    throw new Error(`Chromium is not at ${CHROMIUM}. Install it with: apt-get install -y chromium (npm test does this itself).`)
  }
  mkdirSync(ARTIFACTS, { recursive: true })
  return chromium.launchPersistentContext(mkdtempSync(join(tmpdir(), 'lamina-chromium-')), {
    executablePath: CHROMIUM,
    headless: true,
    viewport: { width: 1280, height: 800 },
    args: ['--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking',
      '--disable-component-update', '--disable-sync', '--disable-dev-shm-usage'],
  })
}

/** Path for a screenshot under the git-ignored artifacts/ folder. */
export const artifact = (name: string) => join(ARTIFACTS, name)

/**
 * client_initial_kb_gzip: the JavaScript and CSS the browser fetches to show the sign-in page and
 * then, signed in as the operator, the operator's first page — measured by loading both pages in
 * Debian's Chromium (playwright-core) from the real server and gzip-compressing (level 6, what a
 * compressing proxy sends) every script and stylesheet it received — the floor views the line
 * pages prefetch for offline use included. Fonts and images are not counted; each file once.
 */
import { mkdtempSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { gzipSync } from 'node:zlib'
import { chromium } from 'playwright-core'

export interface ClientSize {
  kbGzip: number
  files: { url: string; gzipBytes: number }[]
  firstPage: string
}

export async function measureClientSize(
  base: string,
  email: string,
  password: string,
): Promise<ClientSize> {
  const profile = mkdtempSync(join(tmpdir(), 'filmtrail-bench-'))
  const context = await chromium.launchPersistentContext(profile, {
    executablePath: '/usr/bin/chromium',
    headless: true,
    viewport: { width: 1280, height: 800 },
    args: [
      '--no-sandbox',
      '--disable-gpu',
      '--disable-quic',
      '--no-first-run',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync',
    ],
  })
  const seen = new Map<string, Promise<number>>()
  try {
    const page = context.pages()[0] ?? (await context.newPage())
    page.setDefaultTimeout(30_000)
    page.on('response', (res) => {
      const type = res.request().resourceType()
      const url = res.url()
      if ((type === 'script' || type === 'stylesheet') && url.startsWith(base) && !seen.has(url)) {
        const size = res.body().then(
          (b) => gzipSync(b, { level: 6 }).length,
          (err: Error) => Promise.reject(new Error(`could not read ${url}: ${err.message}`)),
        )
        size.catch(() => {}) // reported where the sizes are summed, not as an unhandled rejection
        seen.set(url, size)
      }
    })
    await page.goto(`${base}/sign-in`, { waitUntil: 'networkidle' })
    await page.getByLabel('E-mail').fill(email)
    await page.getByLabel('Password', { exact: true }).fill(password)
    await page.getByRole('button', { name: 'Sign in' }).click()
    await page.getByRole('button', { name: 'Your account and units' }).waitFor()
    await page.waitForLoadState('networkidle')
    // The line pages prefetch the other floor views once mounted (offline readiness): wait for
    // that too, so the count does not depend on how fast the machine was.
    await page.waitForTimeout(2000)
    await page.waitForLoadState('networkidle')
    const firstPage = new URL(page.url()).pathname
    // Bodies are read while the page is still open; a file that cannot be read fails the count.
    const files = await Promise.all(
      [...seen].map(async ([url, size]) => ({
        url: url.slice(base.length),
        gzipBytes: await size,
      })),
    )
    const total = files.reduce((s, f) => s + f.gzipBytes, 0)
    return {
      kbGzip: total / 1024,
      files: files.sort((a, b) => b.gzipBytes - a.gzipBytes),
      firstPage,
    }
  } finally {
    await context.close()
    rmSync(profile, { recursive: true, force: true })
  }
}

import { readFileSync } from 'node:fs'
import { createRequire } from 'node:module'
import type { Page } from 'playwright-core'

const AXE = createRequire(import.meta.url).resolve('axe-core/axe.min.js')

/** axe-core's serious and critical findings on the page as it is now, one line each. */
export async function seriousViolations(page: Page): Promise<string[]> {
  // Evaluated through the debugging protocol: the page's CSP (script hashes) would refuse an injected <script>.
  await page.evaluate(readFileSync(AXE, 'utf8'))
  const result = await page.evaluate(async () => {
    const axe = (window as unknown as { axe: { run: (ctx: Document) => Promise<{ violations: { id: string, impact: string, nodes: { target: string[] }[] }[] }> } }).axe
    return axe.run(document)
  })
  return result.violations
    .filter(v => v.impact === 'serious' || v.impact === 'critical')
    .map(v => `${v.id} (${v.impact}): ${v.nodes.slice(0, 3).map(n => n.target.join(' ')).join(', ')}`)
}

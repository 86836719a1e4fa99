// The desk's print downloads: the "For print" section on a story's desk page lists
// each graph and table with its files at the three column widths, a link
// downloads the PDF under its own name, and the print package is one click.
// Screenshots at desktop and phone widths go to .data/test/screenshots.
import { mkdirSync } from 'node:fs'
import { join } from 'node:path'
import { beforeAll, describe, expect, it } from 'vitest'
import { signedIn } from '../support/http'
import { openBrowser, signInThroughPage } from '../support/browser'
import { createStory, storyBench, storyBody } from '../support/stories'

const SHOTS = join(process.cwd(), '.data', 'test', 'screenshots')
let storyId = 0

beforeAll(async () => {
  mkdirSync(SHOTS, { recursive: true })
  const editor = await signedIn('editor@example.com')
  const bench = await storyBench(editor)
  const story = await createStory(editor, bench.benchTestId, { body: `${storyBody(bench)}\n\n::results-table\n::\n` })
  storyId = story.id
}, 120_000)

describe('print downloads on the desk', () => {
  for (const width of [1280, 390]) {
    it(`lists the figures and downloads them at ${width} px`, async () => {
      const { page, close } = await openBrowser()
      try {
        // Signed in at desktop width, where the header shows the name the helper waits for.
        await signInThroughPage(page, 'editor@example.com', 'pullsheet-demo')
        await page.setViewportSize({ width, height: 900 })
        await page.goto(`/desk/${storyId}`)
        const section = page.getByTestId('print-exports')
        await section.waitFor({ timeout: 20_000 })
        expect(await section.getByTestId('print-figure').allTextContents()).toEqual([
          expect.stringMatching(/^\s*Figure 1, graph.*svg.*1 col.*2 col.*3 col.*pdf.*1 col.*2 col.*3 col/is),
          expect.stringMatching(/^\s*Figure 2, results table.*pdf.*csv\s*table for layout/is),
        ])
        const [download] = await Promise.all([
          page.waitForEvent('download'),
          section.getByRole('link', { name: 'Figure 1, graph, PDF, two columns wide' }).click(),
        ])
        expect(download.suggestedFilename()).toMatch(/-figure-1-pull-graph-two-column\.pdf$/)
        await section.scrollIntoViewIfNeeded()
        await section.screenshot({ path: join(SHOTS, `print-desk-${width}.png`) })
      }
      finally {
        await close()
      }
    }, 90_000)
  }
})

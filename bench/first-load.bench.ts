// First-load JavaScript of a story page, run on demand (not a test):
//   flock /tmp/pullsheet-test.lock npx tsx bench/first-load.bench.ts
// Budget (issue 7): under 120 KB gzip; ECharts loads only when a graph turns interactive.
import { firstLoad } from './first-load'
import { readerFixture } from './reader-fixture'

const BUDGET_KB = 120
const fixture = await readerFixture()
try {
  const result = await firstLoad(`${fixture.base}/stories/${fixture.slug}`)
  for (const f of result.files.sort((a, b) => b.gzip - a.gzip)) console.log(`${(f.gzip / 1024).toFixed(1).padStart(7)} KB gzip  ${(f.bytes / 1024).toFixed(1).padStart(7)} KB  ${new URL(f.url).pathname}`)
  const kb = result.totalGzip / 1024
  console.log(`\nfirst-load JS: ${result.files.length} files, ${kb.toFixed(1)} KB gzip (${(result.totalBytes / 1024).toFixed(1)} KB raw); budget ${BUDGET_KB} KB: ${kb < BUDGET_KB ? 'met' : 'NOT met'}`)
}
finally {
  await fixture.stop()
}

// The framework's own yardstick for bench/editions.bench.ts: Nuxt with nothing of ours
// (no module, plugin, layout, database or session), the same versions from the project's
// node_modules. Its one page is 30 paragraphs of plain text (about 4 KB; the site's /about
// is 12 KB), not compressed. Built into .data; the app's build and typecheck leave it out.
import { defineNuxtConfig } from 'nuxt/config'

export default defineNuxtConfig({
  devtools: { enabled: false },
  buildDir: '../../.data/bench/minimal-nuxt/.nuxt',
  experimental: { appManifest: false },
  compatibilityDate: '2026-11-01',
  nitro: { output: { dir: '../../.data/bench/minimal-nuxt/.output' } },
})

// https://nuxt.com/docs/api/configuration/nuxt-config
import { fileURLToPath } from 'node:url'
import { STAFF_COLLECTIONS } from './shared/types/content'

export default defineNuxtConfig({
  modules: ['@nuxtjs/tailwindcss', '@pinia/nuxt', 'nuxt-auth-utils', '@nuxt/content', '@nuxt/eslint'],
  devtools: { enabled: false },
  app: {
    head: {
      htmlAttrs: { lang: 'en' },
      titleTemplate: '%s · Pullsheet',
      meta: [{ name: 'viewport', content: 'width=device-width, initial-scale=1' }],
      link: [{ rel: 'icon', type: 'image/svg+xml', href: '/favicon.svg' }],
    },
  },
  css: [
    '@fontsource/merriweather/400.css',
    '@fontsource/merriweather/400-italic.css',
    '@fontsource/merriweather/700.css',
    '@fontsource/merriweather/900.css',
    '~/assets/css/main.css',
    '~/assets/css/print.css',
  ],
  content: {
    // Inside .data so the built server can write it (the output folder may be read-only).
    database: { type: 'sqlite', filename: '.data/content/contents.sqlite' },
    experimental: { sqliteConnector: 'better-sqlite3' },
  },
  runtimeConfig: {
    session: {
      name: 'pullsheet-session',
      maxAge: 60 * 60 * 24 * 14,
      // Overridden by NUXT_SESSION_COOKIE_SECURE=false for plain-http local runs.
      cookie: { sameSite: 'lax', secure: true, httpOnly: true },
    },
  },
  // The app manifest (fetched by the browser to learn of prerendered pages and new builds)
  // serves nothing here: no page is prerendered and no route rule acts in the browser. A
  // navigation after a new deploy still reloads the page when an old chunk is gone.
  experimental: { appManifest: false },
  compatibilityDate: '2026-11-01',
  nitro: {
    experimental: { tasks: true },
    // Built assets ship with .br and .gz beside them, served by Accept-Encoding;
    // pages and data are compressed by server/plugins/page-cache.ts.
    compressPublicAssets: { brotli: true, gzip: true },
    // Photos are sized in worker threads by server/workers/photo-worker.mjs, which
    // the bundle never imports: ship its packages and copy it beside the server.
    externals: { traceInclude: [fileURLToPath(new URL('./server/workers/photo-worker.mjs', import.meta.url))] },
    // The print face for figure exports and social cards (server/services/figures/fonts.ts).
    serverAssets: [{
      baseName: 'print-fonts',
      dir: fileURLToPath(new URL('./node_modules/@fontsource/merriweather/files', import.meta.url)),
      pattern: 'merriweather-latin-{400,700}-normal.woff',
    }],
    // The production server's entry answers page-cache hits before Nitro's listener
    // (server/node-server.ts); only for the node-server preset, so `nuxi dev` and the
    // prerenderer keep their own entries.
    modules: [(nitro) => {
      if (nitro.options.preset === 'node-server') nitro.options.entry = fileURLToPath(new URL('./server/node-server.ts', import.meta.url))
    }],
    hooks: {
      async compiled(nitro) {
        const { cp } = await import('node:fs/promises')
        await cp(`${nitro.options.rootDir}/server/workers`, `${nitro.options.output.serverDir}/workers`, { recursive: true })
        // PULLSHEET_PROCESSES copies of the server on one port (node:cluster), beside index.mjs.
        await cp(`${nitro.options.rootDir}/server/cluster.mjs`, `${nitro.options.output.serverDir}/cluster.mjs`)
        // Pull checks run in piscina worker threads (server/services/workspace/pull-pool.ts): the
        // worker is TypeScript with shared/dyno behind it, bundled into one plain file.
        const { build } = await import('esbuild')
        await build({
          entryPoints: [`${nitro.options.rootDir}/server/pull-worker/pull-check-worker.ts`],
          outfile: `${nitro.options.output.serverDir}/workers/pull-check-worker.mjs`,
          bundle: true,
          format: 'esm',
          platform: 'node',
          target: 'node20',
          logLevel: 'warning',
          // papaparse is CommonJS; ESM output needs a require for its Node branch.
          banner: { js: 'import { createRequire } from "node:module"; const require = createRequire(import.meta.url);' },
        })
      },
    },
  },
  vite: {
    build: { sourcemap: false },
    // No component of ours or of the packages the browser loads uses the Options API
    // (data/methods/computed objects, mixins): without it Vue's runtime is smaller in
    // every page's first load (bench/first-load.bench.ts). Pinia's option stores are
    // Pinia's own and unaffected.
    vue: { features: { optionsAPI: false } },
    $client: {
      // Dozens of chunks of a few hundred bytes each cost more than their code (their
      // own import lists, a compression window each): Rollup merges chunks below this
      // size into others where that runs no code a page did not run before.
      build: { rollupOptions: { output: { experimentalMinChunkSize: 8 * 1024 } } },
    },
  },
  // Component tests mount .vue files: they are checked with the app's types, not the tools'.
  typescript: { strict: true, tsConfig: { include: ['../tests/components/**/*'] } },
  telemetry: false,
  hooks: {
    // nuxt-auth-utils' own session plugins fetch /api/_auth/session inside every server
    // render (a second request per page, with its own session unsealing); the app reads
    // the user from /api/auth/me (app/plugins/current-user.ts) and never uses them.
    'app:resolve'(app) {
      app.plugins = app.plugins.filter(plugin => !/nuxt-auth-utils\/dist\/runtime\/app\/plugins\/session\./.test(plugin.src))
    },
    // No OAuth or WebAuthn sign-in here: Nitro copies the runtime config and reads the
    // environment for every key of it on each request, and those two were 300 of its lines.
    'nitro:config'(config) {
      delete config.runtimeConfig?.oauth
      delete config.runtimeConfig?.webauthn
      // nuxt-auth-utils' own /api/_auth/session routes are not used (sign-in state comes
      // from /api/auth/me, sign-out is POST /api/auth/logout) and were not honest: a GET
      // gave an anonymous visitor a session cookie, a DELETE cleared the cookie but left
      // the session valid. Left out, the address answers 404 like any unknown route.
      config.handlers = (config.handlers ?? []).filter(handler => handler?.route !== '/api/_auth/session')
      // @nuxt/content prerenders each collection's SQL dump into the public files, which
      // are served before any server middleware: the desk's collections must not be
      // there. Their dump is then served by the module's route, behind
      // server/middleware/03.content-privacy.ts.
      for (const collection of STAFF_COLLECTIONS) {
        const dump = `/__nuxt_content/${collection}/sql_dump.txt`
        config.routeRules = { ...config.routeRules, [dump]: { ...config.routeRules?.[dump], prerender: false } }
        if (config.prerender?.routes) config.prerender.routes = config.prerender.routes.filter(route => !route?.startsWith(`/__nuxt_content/${collection}/`))
      }
    },
  },
  eslint: { config: { stylistic: true } },
  tailwindcss: { cssPath: false },
})

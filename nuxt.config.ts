// https://nuxt.com/docs/api/configuration/nuxt-config
export default defineNuxtConfig({
  compatibilityDate: '2026-11-01',
  modules: ['@nuxtjs/tailwindcss', '@pinia/nuxt', 'nuxt-auth-utils', '@nuxt/content', '@nuxt/eslint'],
  devtools: { enabled: false },
  telemetry: false,
  css: [
    '@fontsource/merriweather/400.css',
    '@fontsource/merriweather/400-italic.css',
    '@fontsource/merriweather/700.css',
    '@fontsource/merriweather/900.css',
    '~/assets/css/main.css',
  ],
  app: {
    head: {
      htmlAttrs: { lang: 'en' },
      titleTemplate: '%s · Pullsheet',
      meta: [{ name: 'viewport', content: 'width=device-width, initial-scale=1' }],
      link: [{ rel: 'icon', type: 'image/svg+xml', href: '/favicon.svg' }],
    },
  },
  typescript: { strict: true },
  runtimeConfig: {
    session: {
      name: 'pullsheet-session',
      maxAge: 60 * 60 * 24 * 14,
      // Overridden by NUXT_SESSION_COOKIE_SECURE=false for plain-http local runs.
      cookie: { sameSite: 'lax', secure: true, httpOnly: true },
    },
  },
  content: {
    // Inside .data so the built server can write it (the output folder may be read-only).
    database: { type: 'sqlite', filename: '.data/content/contents.sqlite' },
    experimental: { sqliteConnector: 'better-sqlite3' },
  },
  nitro: {
    experimental: { tasks: true },
  },
  eslint: { config: { stylistic: true } },
  tailwindcss: { cssPath: false },
  vite: { build: { sourcemap: false } },
})

import { fileURLToPath } from 'node:url'
import { defineConfig } from 'vitest/config'

const alias = { '#shared': fileURLToPath(new URL('./shared', import.meta.url)) }

// unit: pure code, no services. api and browser: run by scripts/test.ts against
// the built server and the real MariaDB, s3rver and SMTP catcher it started.
export default defineConfig({
  test: {
    projects: [
      { resolve: { alias }, test: { name: 'unit', include: ['tests/unit/**/*.test.ts'], environment: 'node' } },
      { resolve: { alias }, test: { name: 'api', include: ['tests/api/**/*.test.ts'], environment: 'node', fileParallelism: false, testTimeout: 30_000, hookTimeout: 60_000 } },
      { resolve: { alias }, test: { name: 'browser', include: ['tests/browser/**/*.test.ts'], environment: 'node', fileParallelism: false, testTimeout: 60_000, hookTimeout: 60_000 } },
    ],
  },
})

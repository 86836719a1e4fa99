import { fileURLToPath } from 'node:url'
import { BaseSequencer, type TestSpecification } from 'vitest/node'
import { defineConfig } from 'vitest/config'
import { defineVitestProject } from '@nuxt/test-utils/config'

const alias = { '#shared': fileURLToPath(new URL('./shared', import.meta.url)) }

/** Files in name order, so fault drills named zz-* run after everything else. */
class ByName extends BaseSequencer {
  override async sort(files: TestSpecification[]) {
    return [...files].sort((a, b) => a.moduleId.localeCompare(b.moduleId))
  }
}

// unit: pure code, no services. components: the components that carry logic, mounted
// in Nuxt's own test environment (happy-dom), no services. api and browser: run by scripts/test.ts (one file at
// a time, --no-file-parallelism) against the built server and the real MariaDB,
// s3rver and SMTP catcher it started.
export default defineConfig({
  test: {
    projects: [
      { resolve: { alias }, test: { name: 'unit', include: ['tests/unit/**/*.test.ts'], environment: 'node' } },
      await defineVitestProject({ test: { name: 'components', include: ['tests/components/**/*.test.ts'], environment: 'nuxt', environmentOptions: { nuxt: { domEnvironment: 'happy-dom' } } } }),
      { resolve: { alias }, test: { name: 'api', include: ['tests/api/**/*.test.ts'], environment: 'node', testTimeout: 30_000, hookTimeout: 60_000, sequence: { sequencer: ByName } } },
      { resolve: { alias }, test: { name: 'browser', include: ['tests/browser/**/*.test.ts'], environment: 'node', testTimeout: 60_000, hookTimeout: 60_000, sequence: { sequencer: ByName } } },
    ],
  },
})

import { defaultServerConditions } from 'vite';
import { defineConfig } from 'vitest/config';

// Tests run straight from TypeScript sources: every package's `exports` has the project-unique
// condition "@bridgework/source" pointing at src/index.ts. Node-side tests resolve through
// ssr.resolve.conditions (resolve.conditions alone is not enough).
const conditions = ['@bridgework/source', ...defaultServerConditions];

export default defineConfig({
  resolve: { conditions },
  ssr: { resolve: { conditions, externalConditions: ['@bridgework/source'] } },
  test: {
    include: ['packages/*/test/**/*.test.ts', 'test/**/*.test.ts'],
    setupFiles: ['test/support/setup.ts'],
    // No test mutates global state, so files may share one module graph (about twice as fast).
    isolate: false,
    reporters: ['default', ['json', { outputFile: 'test-results/vitest.json' }]],
    testTimeout: 60_000,
  },
});

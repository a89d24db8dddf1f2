import { defineConfig, mergeConfig } from 'vitest/config'
import viteConfig from './vite.config.ts'

// The Quasar plugin from vite.config.ts is needed so `quasar` resolves to its client build (STACK.md gotcha 7).
export default mergeConfig(
  viteConfig,
  defineConfig({
    test: {
      include: ['tests/**/*.test.ts', 'shared/**/*.test.ts', 'server/**/*.test.ts', 'src/**/*.test.ts'],
      environment: 'node',
      testTimeout: 30_000,
      hookTimeout: 60_000,
      env: { TZ: 'UTC' },
    },
  }),
)

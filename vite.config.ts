import { fileURLToPath, URL } from 'node:url'
import { defineConfig } from 'vitest/config'
import vue from '@vitejs/plugin-vue'
import Components from 'unplugin-vue-components/vite'
import { ElementPlusResolver } from 'unplugin-vue-components/resolvers'

const apiPort = process.env.PORT ?? '8080'

export default defineConfig({
  plugins: [vue(), Components({ resolvers: [ElementPlusResolver()], dts: 'src/components.d.ts' })],
  resolve: {
    alias: {
      '@': fileURLToPath(new URL('./src', import.meta.url)),
      '@shared': fileURLToPath(new URL('./shared', import.meta.url)),
    },
  },
  server: {
    port: Number(process.env.VITE_PORT ?? 5173),
    proxy: { '/api': `http://127.0.0.1:${process.env.API_PORT ?? apiPort}` },
  },
  build: { outDir: 'dist/client', chunkSizeWarningLimit: 900 },
  test: {
    testTimeout: 30_000,
    hookTimeout: 60_000,
    pool: 'forks',
    projects: [
      // pure engine and shared code: no database, no DOM
      { extends: true, test: { name: 'engine', include: ['tests/electrical/**/*.test.ts', 'tests/shared/**/*.test.ts'] } },
      // HTTP API against a real PostgreSQL cluster started for the run
      {
        extends: true,
        test: { name: 'server', include: ['tests/server/**/*.test.ts'], globalSetup: ['tests/setup/global-postgres.ts'] },
      },
      // Vue components, a spec beside each
      {
        extends: true,
        // element-plus style entries import .css files: let Vite (not Node) load the package
        test: { name: 'client', include: ['src/**/*.spec.ts'], environment: 'jsdom', server: { deps: { inline: ['element-plus'] } } },
      },
      // the designer's journey in Debian's Chromium against the app started as `npm start` starts it
      {
        extends: true,
        test: {
          name: 'browser',
          include: ['tests/browser/**/*.test.ts'],
          globalSetup: ['tests/browser/support/global-app.ts'],
          testTimeout: 180_000,
          // the journeys share one app and its demo data: one after the other
          fileParallelism: false,
        },
      },
    ],
  },
})

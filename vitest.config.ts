import { fileURLToPath, URL } from 'node:url';
import { defineConfig } from 'vitest/config';
import vue from '@vitejs/plugin-vue';
import { quasar, transformAssetUrls } from '@quasar/vite-plugin';

// Four projects: the pure core, the API on a real SQLite file, the exported C bundle compiled
// with the system compiler, and client components in happy-dom.
export default defineConfig({
  test: {
    projects: [
      { test: { name: 'shared', include: ['tests/shared/**/*.test.ts'], environment: 'node' } },
      { test: { name: 'server', include: ['tests/server/**/*.test.ts'], environment: 'node', pool: 'forks', testTimeout: 30000, hookTimeout: 60000 } },
      { test: { name: 'export', include: ['tests/export/**/*.test.ts'], environment: 'node', testTimeout: 120000 } },
      {
        plugins: [vue({ template: { transformAssetUrls } }), quasar({ sassVariables: fileURLToPath(new URL('./src/css/quasar.variables.scss', import.meta.url)) })],
        resolve: { alias: { '@': fileURLToPath(new URL('./src', import.meta.url)) } },
        test: { name: 'client', include: ['tests/client/**/*.test.ts'], environment: 'happy-dom', setupFiles: ['tests/client/setup.ts'], server: { deps: { inline: ['quasar'] } } },
      },
    ],
  },
});

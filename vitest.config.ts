import { fileURLToPath, URL } from 'node:url';
import { defineConfig } from 'vitest/config';
import vue from '@vitejs/plugin-vue';
import { quasar, transformAssetUrls } from '@quasar/vite-plugin';

// Projects: the pure core, the API on a real SQLite file, the same API suite on PostgreSQL
// (`server-pg`, only when TEST_DATABASE_URL names a server), the exported C bundle compiled with
// the system compiler, and client components in happy-dom.
const serverSuite = { include: ['tests/server/**/*.test.ts'], environment: 'node', pool: 'forks' as const, testTimeout: 30000, hookTimeout: 60000 };
const postgresUrl = process.env.TEST_DATABASE_URL;
const projectArgs = process.argv.flatMap((a, i, all) => (a === '--project' ? [all[i + 1]] : a.startsWith('--project=') ? [a.slice(10)] : []));
if (!postgresUrl && (projectArgs.length === 0 || projectArgs.includes('server-pg'))) {
  process.stdout.write('vitest: project server-pg skipped: TEST_DATABASE_URL is not set '
    + '(bash scripts/pg-throwaway.sh -- npx vitest run --project server-pg runs it on a throwaway PostgreSQL)\n');
}

export default defineConfig({
  test: {
    projects: [
      { test: { name: 'shared', include: ['tests/shared/**/*.test.ts'], environment: 'node' } },
      { test: { name: 'server', ...serverSuite } },
      ...(postgresUrl ? [{ test: { name: 'server-pg', ...serverSuite, env: { VARSMITH_TEST_DIALECT: 'postgres' }, globalSetup: ['tests/server/pgSetup.ts'] } }] : []),
      { test: { name: 'export', include: ['tests/export/**/*.test.ts'], environment: 'node', testTimeout: 120000 } },
      {
        plugins: [vue({ template: { transformAssetUrls } }), quasar({ sassVariables: fileURLToPath(new URL('./src/css/quasar.variables.scss', import.meta.url)) })],
        resolve: { alias: { '@': fileURLToPath(new URL('./src', import.meta.url)) } },
        test: { name: 'client', include: ['tests/client/**/*.test.ts'], environment: 'happy-dom', setupFiles: ['tests/client/setup.ts'], server: { deps: { inline: ['quasar'] } } },
      },
    ],
  },
});

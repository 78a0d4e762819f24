// npm start: build the client when dist/ is missing or older than its sources, then run the
// server (migrations, demo seed on an empty database, SPA + API on one port).
import { spawn, spawnSync } from 'node:child_process';
import { existsSync, readdirSync, statSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const bin = (name) => path.join(root, 'node_modules', '.bin', process.platform === 'win32' ? `${name}.cmd` : name);

function newestMtime(entry) {
  if (!existsSync(entry)) return 0;
  const stat = statSync(entry);
  if (!stat.isDirectory()) return stat.mtimeMs;
  let newest = stat.mtimeMs;
  for (const child of readdirSync(entry)) newest = Math.max(newest, newestMtime(path.join(entry, child)));
  return newest;
}

const builtIndex = path.join(root, 'dist', 'index.html');
const sources = ['src', 'shared', 'index.html', 'vite.config.ts', 'package.json'].map((p) => path.join(root, p));
const sourceTime = Math.max(...sources.map(newestMtime));
if (!existsSync(builtIndex) || statSync(builtIndex).mtimeMs < sourceTime) {
  process.stdout.write('Building the client (vite build)...\n');
  const build = spawnSync(bin('vite'), ['build'], { cwd: root, stdio: 'inherit' });
  if (build.status !== 0) {
    process.stderr.write('vite build failed\n');
    process.exit(build.status ?? 1);
  }
}

const server = spawn(bin('tsx'), [path.join(root, 'server', 'index.ts')], { cwd: root, stdio: 'inherit', env: process.env });
for (const signal of ['SIGINT', 'SIGTERM']) process.on(signal, () => server.kill(signal));
server.on('exit', (code, signal) => process.exit(code ?? (signal ? 1 : 0)));

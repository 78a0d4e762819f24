// npm run dev: the API with reload (tsx watch, port 3000 unless PORT) and Vite's dev server
// (which proxies /api to it, see vite.config.ts). Ctrl-C stops both.
import { spawn } from 'node:child_process';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const bin = (name) => path.join(root, 'node_modules', '.bin', process.platform === 'win32' ? `${name}.cmd` : name);

const children = [
  spawn(bin('tsx'), ['watch', '--clear-screen=false', path.join(root, 'server', 'index.ts')], { cwd: root, stdio: 'inherit', env: { ...process.env, VARSMITH_NO_CLIENT: '1' } }),
  spawn(bin('vite'), [], { cwd: root, stdio: 'inherit', env: process.env }),
];
let stopping = false;
function stop(code) {
  if (stopping) return;
  stopping = true;
  for (const child of children) if (child.exitCode === null) child.kill('SIGTERM');
  process.exitCode = code;
}
for (const child of children) child.on('exit', (code) => stop(code ?? 0));
for (const signal of ['SIGINT', 'SIGTERM']) process.on(signal, () => stop(0));

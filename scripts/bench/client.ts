// Size of the JavaScript the sign-in route loads, from a fresh production build: the entry chunk,
// its static imports, and the lazy SignInPage chunk with its static imports (read from Vite's
// build manifest), each gzip-compressed. Target: <= 350 KB gzip.
import { execFileSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { gzipSync } from 'node:zlib';

interface ManifestChunk {
  file: string;
  imports?: string[];
  dynamicImports?: string[];
  isEntry?: boolean;
}

const root = fileURLToPath(new URL('../..', import.meta.url));

function staticClosure(manifest: Record<string, ManifestChunk>, keys: string[]): Set<string> {
  const seen = new Set<string>();
  const stack = [...keys];
  while (stack.length) {
    const key = stack.pop()!;
    if (seen.has(key) || !manifest[key]) continue;
    seen.add(key);
    stack.push(...(manifest[key].imports ?? []));
  }
  return seen;
}

/** Builds the client into .tmp/bench-dist and reports the sign-in route's JS size. */
export async function run(): Promise<Record<string, unknown>> {
  const outDir = join(root, '.tmp', 'bench-dist');
  const started = Date.now();
  execFileSync(process.execPath, [join(root, 'node_modules', 'vite', 'bin', 'vite.js'), 'build', '--outDir', outDir, '--emptyOutDir', '--logLevel', 'error'], { cwd: root, stdio: ['ignore', 'ignore', 'inherit'] });
  const buildMs = Date.now() - started;
  const manifest = JSON.parse(readFileSync(join(outDir, '.vite', 'manifest.json'), 'utf8')) as Record<string, ManifestChunk>;
  const entryKey = Object.keys(manifest).find((k) => manifest[k].isEntry && k.endsWith('index.html'));
  const signInKey = Object.keys(manifest).find((k) => k.endsWith('src/pages/SignInPage.vue'));
  if (!entryKey || !signInKey) throw new Error('client bench: entry or SignInPage chunk missing from the build manifest');
  const chunks = staticClosure(manifest, [entryKey, signInKey]);
  const files = [...chunks].map((k) => manifest[k].file).filter((f) => f.endsWith('.js')).sort();
  let rawBytes = 0;
  let gzipBytes = 0;
  const perFile: Record<string, number> = {};
  for (const file of files) {
    const bytes = readFileSync(join(outDir, file));
    const gz = gzipSync(bytes, { level: 9 }).byteLength;
    rawBytes += bytes.byteLength;
    gzipBytes += gz;
    perFile[file] = Number((gz / 1024).toFixed(1));
  }
  const gzipOf = (keys: Set<string>): number => [...new Set([...keys].map((k) => manifest[k].file).filter((f) => f.endsWith('.js')))]
    .reduce((sum, f) => sum + gzipSync(readFileSync(join(outDir, f)), { level: 9 }).byteLength, 0);
  const workspaceKey = Object.keys(manifest).find((k) => k.endsWith('src/pages/DesignWorkspacePage.vue'));
  const plotsKey = Object.keys(manifest).find((k) => k.endsWith('src/components/AnalysisPlots.vue'));
  const workspaceRouteGzip = workspaceKey ? gzipOf(staticClosure(manifest, [entryKey, workspaceKey])) : null;
  const plotsChunkGzip = plotsKey ? gzipOf(new Set([plotsKey])) : null;
  const allJs = Object.values(manifest).map((c) => c.file).filter((f) => f.endsWith('.js'));
  const totalGzip = [...new Set(allJs)].reduce((sum, f) => sum + gzipSync(readFileSync(join(outDir, f)), { level: 9 }).byteLength, 0);
  return {
    signInRouteJsGzipKB: Number((gzipBytes / 1024).toFixed(1)),
    signInRouteJsRawKB: Number((rawBytes / 1024).toFixed(1)),
    targetGzipKB: 350,
    withinTarget: gzipBytes / 1024 <= 350,
    signInRouteFiles: perFile,
    workspaceRouteJsGzipKB: workspaceRouteGzip === null ? null : Number((workspaceRouteGzip / 1024).toFixed(1)),
    lazyPlotsChunkGzipKB: plotsChunkGzip === null ? null : Number((plotsChunkGzip / 1024).toFixed(1)),
    allJsGzipKB: Number((totalGzip / 1024).toFixed(1)),
    buildMs,
  };
}

import { PassThrough } from 'node:stream';
import { ZipArchive } from 'archiver';

/** One file of a bundle, path relative to the root folder. */
export interface ZipFile {
  path: string;
  content: Buffer;
  /** 0o644 (default) or 0o755. */
  mode?: number;
}

/** Earliest time a zip (MS-DOS) timestamp can hold. */
const DOS_EPOCH_MS = Date.UTC(1980, 0, 1, 0, 0, 0);

/**
 * Deterministic zip: every entry under `<root>/`, directories (0755) and files (0644 unless given)
 * in sorted path order, every timestamp `createdAt` (UTC, clamped to 1980 at the earliest, whole
 * seconds rounded down to even as the zip format stores them), deflate level 6. Same inputs give
 * the same bytes.
 *
 * @param root - root folder name, e.g. `sc-3-bench-unit-1.2.0`.
 * @param files - files with relative paths (forward slashes, no `..`).
 * @param createdAt - timestamp of every entry.
 * @returns the zip bytes.
 */
export async function buildZip(root: string, files: readonly ZipFile[], createdAt: Date): Promise<Buffer> {
  const ms = Math.max(DOS_EPOCH_MS, Math.floor(createdAt.getTime() / 2000) * 2000);
  const date = new Date(ms);
  for (const f of files) {
    if (f.path.startsWith('/') || f.path.split('/').includes('..') || f.path.includes('\\')) throw new Error(`buildZip: bad path ${f.path}`);
  }
  const dirs = new Set<string>();
  for (const f of files) {
    const parts = f.path.split('/');
    for (let i = 1; i < parts.length; i += 1) dirs.add(parts.slice(0, i).join('/'));
  }
  const entries = [
    ...[...dirs].map((d) => ({ path: `${d}/`, dir: true as const, content: Buffer.alloc(0), mode: 0o755 })),
    ...files.map((f) => ({ path: f.path, dir: false as const, content: f.content, mode: f.mode ?? 0o644 })),
  ].sort((p, q) => (p.path < q.path ? -1 : p.path > q.path ? 1 : 0));

  const archive = new ZipArchive({ zlib: { level: 6 } });
  const sink = new PassThrough();
  const chunks: Buffer[] = [];
  sink.on('data', (c: Buffer) => chunks.push(c));
  const done = new Promise<void>((resolve, reject) => {
    sink.on('end', () => resolve());
    sink.on('error', reject);
    archive.on('error', reject);
    archive.on('warning', reject);
  });
  archive.pipe(sink);
  archive.append('', { name: `${root}/`, type: 'directory', date, mode: 0o755 });
  for (const e of entries) {
    if (e.dir) archive.append('', { name: `${root}/${e.path}`, type: 'directory', date, mode: e.mode });
    else archive.append(e.content, { name: `${root}/${e.path}`, date, mode: e.mode });
  }
  await archive.finalize();
  await done;
  return Buffer.concat(chunks);
}

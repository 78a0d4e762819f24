import { spawnSync } from 'node:child_process';
import { mkdirSync, mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import yauzl from 'yauzl';

/** One zip entry as stored. */
export interface ZipEntryInfo {
  name: string;
  content: Buffer;
  /** Unix mode from the external attributes (high 16 bits). */
  mode: number;
  /** Modification time decoded as UTC. */
  modified: Date;
  isDirectory: boolean;
}

/**
 * Reads every entry of a zip with yauzl, in stored order.
 *
 * @param zip - zip bytes.
 * @returns the entries.
 */
export function readZip(zip: Buffer): Promise<ZipEntryInfo[]> {
  return new Promise((resolve, reject) => {
    yauzl.fromBuffer(zip, { lazyEntries: true, strictFileNames: true, validateEntrySizes: true }, (err, file) => {
      if (err || !file) return reject(err ?? new Error('no zip'));
      const out: ZipEntryInfo[] = [];
      file.on('error', reject);
      file.on('end', () => resolve(out));
      file.on('entry', (entry: yauzl.Entry) => {
        const base = { name: entry.fileName, mode: (entry.externalFileAttributes >>> 16) & 0o7777, modified: entry.getLastModDate({ timezone: 'UTC' }), isDirectory: entry.fileName.endsWith('/') };
        if (base.isDirectory) {
          out.push({ ...base, content: Buffer.alloc(0) });
          file.readEntry();
          return;
        }
        file.openReadStream(entry, (e, stream) => {
          if (e || !stream) return reject(e ?? new Error('no stream'));
          const chunks: Buffer[] = [];
          stream.on('data', (c: Buffer) => chunks.push(c));
          stream.on('end', () => {
            out.push({ ...base, content: Buffer.concat(chunks) });
            file.readEntry();
          });
          stream.on('error', reject);
        });
      });
      file.readEntry();
    });
  });
}

/**
 * Extracts a zip into a fresh temporary folder.
 *
 * @param zip - zip bytes.
 * @returns the temporary folder and the entries.
 */
export async function unpack(zip: Buffer): Promise<{ dir: string; entries: ZipEntryInfo[] }> {
  const dir = mkdtempSync(join(tmpdir(), 'varsmith-export-'));
  const entries = await readZip(zip);
  for (const e of entries) {
    const target = join(dir, e.name);
    if (e.isDirectory) mkdirSync(target, { recursive: true });
    else {
      mkdirSync(dirname(target), { recursive: true });
      writeFileSync(target, e.content, { mode: e.mode });
    }
  }
  return { dir, entries };
}

/**
 * Runs `make check` in a folder with the system C compiler.
 *
 * @param dir - bundle root folder.
 * @returns exit status and combined output.
 */
export function makeCheck(dir: string): { status: number | null; output: string } {
  const r = spawnSync('make', ['-s', 'check'], { cwd: dir, encoding: 'utf8' });
  return { status: r.status, output: `${r.stdout}${r.stderr}` };
}

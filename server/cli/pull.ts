import { createHash } from 'node:crypto';
import { renameSync, rmSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import type { Command } from 'commander';

/** Why a pull failed: `verify` (exit 1) when the bytes do not match the server's record, `usage` (exit 2) otherwise. */
export class PullError extends Error {
  constructor(message: string, readonly kind: 'verify' | 'usage') {
    super(message);
  }
}

/** What `pull` needs. */
export interface PullOptions {
  server: string;
  token: string;
  design: string;
  version: string;
  out: string;
}

async function getJson(url: string, token: string): Promise<unknown> {
  const res = await fetch(url, { headers: { Authorization: `Bearer ${token}`, Accept: 'application/json' } });
  const body = await res.text();
  if (!res.ok) {
    let message = body;
    try { message = (JSON.parse(body) as { error?: { message?: string } }).error?.message ?? body; } catch { /* plain text */ }
    throw new PullError(`${res.status} from ${url}: ${message}`, 'usage');
  }
  return JSON.parse(body) as unknown;
}

/**
 * Downloads a released bundle and verifies its SHA-256 against the server's release record;
 * writes `out` only when it matches (via a temporary file and rename).
 * @param o - server, token, design, version, output path.
 * @returns the verified SHA-256 and size.
 */
export async function pullRelease(o: PullOptions): Promise<{ sha256: string; sizeBytes: number; releaseId: number }> {
  const base = o.server.replace(/\/+$/, '');
  const query = new URLSearchParams({ design: o.design, version: o.version });
  const list = (await getJson(`${base}/api/releases?${query}`, o.token)) as { id: number; sha256: string; sizeBytes: number; designName: string; version: string; withdrawnAt: string | null }[];
  const match = list.filter((r) => r.designName === o.design && r.version === o.version);
  if (match.length !== 1) throw new PullError(`no release ${o.version} of design "${o.design}" on ${base}`, 'usage');
  const record = match[0];
  if (!/^[0-9a-f]{64}$/.test(record.sha256)) throw new PullError('the server did not report a SHA-256 for this release', 'verify');
  const res = await fetch(`${base}/api/releases/${record.id}/bundle`, { headers: { Authorization: `Bearer ${o.token}` } });
  if (!res.ok) throw new PullError(`${res.status} downloading release ${record.id}`, 'usage');
  const bytes = Buffer.from(await res.arrayBuffer());
  const actual = createHash('sha256').update(bytes).digest('hex');
  if (actual !== record.sha256 || bytes.length !== record.sizeBytes) {
    throw new PullError(`refusing the download: SHA-256 ${actual} (${bytes.length} bytes) does not match the release record ${record.sha256} (${record.sizeBytes} bytes)`, 'verify');
  }
  const header = res.headers.get('x-content-sha256');
  if (header !== null && header !== record.sha256) throw new PullError(`refusing the download: the download header says ${header}, the release record ${record.sha256}`, 'verify');
  const out = path.resolve(o.out);
  const part = `${out}.part-${process.pid}`;
  try {
    writeFileSync(part, bytes);
    renameSync(part, out);
  } finally {
    rmSync(part, { force: true });
  }
  return { sha256: actual, sizeBytes: bytes.length, releaseId: record.id };
}

/** Registers `varsmith pull` (CONTRACT section 4). */
export function registerPull(program: Command): void {
  program
    .command('pull')
    .description('download a released bundle and verify its SHA-256 against the server record')
    .requiredOption('--server <url>', 'Varsmith server, e.g. http://localhost:3000')
    .requiredOption('--token <token>', 'read-only access token')
    .requiredOption('--design <name>', 'design name')
    .requiredOption('--set-version <semver>', 'released version')
    .requiredOption('-o, --output <file>', 'where to write the zip')
    .action(async (opts: { server: string; token: string; design: string; setVersion: string; output: string }) => {
      try {
        const r = await pullRelease({ server: opts.server, token: opts.token, design: opts.design, version: opts.setVersion, out: opts.output });
        process.stdout.write(`${opts.output}: ${r.sizeBytes} bytes, SHA-256 ${r.sha256} verified\n`);
      } catch (err) {
        process.stderr.write(`varsmith pull: ${(err as Error).message}\n`);
        process.exit(err instanceof PullError && err.kind === 'verify' ? 1 : 2);
      }
    });
}

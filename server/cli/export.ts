import { readFileSync, renameSync, rmSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import type { Command } from 'commander';
import semver from 'semver';
import { formatDesignIssues, parseDesign } from '../../shared/api/design';
import { analyzeDesign } from '../../shared/control/index';
import { buildBundle } from '../export/index';

/**
 * Timestamp of every zip entry of a CLI export when `--timestamp` is not given:
 * 2020-01-01T00:00:00Z. A constant (not the file's mtime, not the wall clock) so that the same
 * design and version give the same bytes on every machine and every run.
 */
export const CLI_DEFAULT_TIMESTAMP = '2020-01-01T00:00:00Z';

const TOOL_VERSION: string = (JSON.parse(readFileSync(new URL('../../package.json', import.meta.url), 'utf8')) as { version: string }).version;

/** Why an export stopped: `usage` (exit 2: bad arguments or design), `refused` (exit 1: an error check without --draft). */
export class ExportCliError extends Error {
  /**
   * @param message - what went wrong, printed on stderr.
   * @param kind - `usage` or `refused`.
   */
  constructor(message: string, readonly kind: 'usage' | 'refused') {
    super(message);
  }
}

/** Options of `varsmith export`. */
export interface ExportCliOptions {
  designPath: string;
  version: string;
  out: string;
  draft: boolean;
  timestamp: string;
  revision: number | null;
}

/**
 * Reads, validates and analyses a design file, then writes its bundle (via a temporary file and rename).
 *
 * @param o - command options.
 * @returns what was written.
 * @throws ExportCliError with `usage` for unreadable or invalid input, `refused` for error checks without `--draft`.
 */
export async function exportDesignFile(o: ExportCliOptions): Promise<{ out: string; sha256: string; sizeBytes: number; warnings: string[] }> {
  if (semver.valid(o.version) === null || semver.clean(o.version) !== o.version) throw new ExportCliError(`--set-version: "${o.version}" is not a semantic version such as 1.2.0`, 'usage');
  if (!/^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}:\d{2}(\.\d+)?(Z|[+-]\d{2}:\d{2})$/.test(o.timestamp) || Number.isNaN(Date.parse(o.timestamp))) {
    throw new ExportCliError(`--timestamp: "${o.timestamp}" is not an ISO 8601 date-time with zone such as 2026-03-01T12:00:00Z`, 'usage');
  }
  const createdAt = new Date(o.timestamp);
  if (createdAt.getUTCFullYear() < 1980 || createdAt.getUTCFullYear() > 2107) throw new ExportCliError('--timestamp: must lie between 1980 and 2107 (zip time stamps)', 'usage');
  let raw: string;
  try {
    raw = readFileSync(o.designPath, 'utf8');
  } catch (err) {
    throw new ExportCliError(`cannot read ${o.designPath}: ${(err as Error).message}`, 'usage');
  }
  let json: unknown;
  try {
    json = JSON.parse(raw);
  } catch (err) {
    throw new ExportCliError(`${o.designPath} is not JSON: ${(err as Error).message}`, 'usage');
  }
  const parsed = parseDesign(json);
  if (!parsed.ok) throw new ExportCliError(`${o.designPath} is not a valid varsmith-design/1 file:\n${formatDesignIssues(parsed.issues)}`, 'usage');
  const analysis = analyzeDesign(parsed.design, { sweepPoints: 0, responseSamples: 0 });
  const errors = analysis.checks.filter((c) => c.severity === 'error');
  if (errors.length > 0 && !o.draft) {
    const lines = errors.map((c) => `  ${c.id}: ${c.message}${c.remedy ? ` (remedy: ${c.remedy})` : ''}`);
    throw new ExportCliError(`refused: ${errors.length} check(s) of severity error; fix the design or export with --draft (stamps DRAFT into every file):\n${lines.join('\n')}`, 'refused');
  }
  const bundle = await buildBundle({ design: parsed.design, analysis, version: o.version, revision: o.revision, createdAt, draft: o.draft, toolVersion: TOOL_VERSION });
  const out = path.resolve(o.out);
  const tmp = `${out}.${process.pid}.part`;
  try {
    writeFileSync(tmp, bundle.zip);
    renameSync(tmp, out);
  } catch (err) {
    rmSync(tmp, { force: true });
    throw new ExportCliError(`cannot write ${out}: ${(err as Error).message}`, 'usage');
  }
  const warnings = analysis.checks.filter((c) => c.severity === 'warning').map((c) => `${c.id}: ${c.message}`);
  return { out, sha256: bundle.sha256, sizeBytes: bundle.zip.length, warnings };
}

/**
 * Registers `varsmith export <design.json> --set-version <semver> -o <bundle.zip> [--draft]
 * [--timestamp <iso>] [--revision <n>]`: exit 0 written, 1 refused (error check without --draft),
 * 2 invalid arguments or design (message on stderr).
 *
 * @param program - the root command.
 * @returns nothing.
 */
export function registerExport(program: Command): void {
  program
    .command('export')
    .description('write the bundle of a design file: C header and reference code, golden vectors, make check, report, manifest')
    .argument('<design>', 'design file (varsmith-design/1 JSON)')
    .requiredOption('--set-version <semver>', 'version of the coefficient set, e.g. 1.2.0')
    .requiredOption('-o, --out <file>', 'zip file to write')
    .option('--draft', 'export even when a check has severity error; stamps DRAFT into every file', false)
    .option('--timestamp <iso>', `time stamp of every zip entry (default ${CLI_DEFAULT_TIMESTAMP}, a constant so that exports are reproducible)`, CLI_DEFAULT_TIMESTAMP)
    .option('--revision <n>', 'revision number printed in the files (default: none)')
    .action(async (designPath: string, opts: { setVersion: string; out: string; draft: boolean; timestamp: string; revision?: string }) => {
      try {
        let revision: number | null = null;
        if (opts.revision !== undefined) {
          if (!/^[1-9]\d{0,8}$/.test(opts.revision)) throw new ExportCliError(`--revision: "${opts.revision}" must be a positive integer`, 'usage');
          revision = Number(opts.revision);
        }
        const r = await exportDesignFile({ designPath, version: opts.setVersion, out: opts.out, draft: opts.draft, timestamp: opts.timestamp, revision });
        for (const w of r.warnings) process.stderr.write(`warning: ${w}\n`);
        process.stdout.write(`wrote ${r.out} (${r.sizeBytes} bytes, sha256 ${r.sha256})${opts.draft ? ' DRAFT' : ''}\n`);
      } catch (err) {
        if (err instanceof ExportCliError) {
          process.stderr.write(`varsmith export: ${err.message}\n`);
          process.exit(err.kind === 'refused' ? 1 : 2);
        }
        throw err;
      }
    });
}

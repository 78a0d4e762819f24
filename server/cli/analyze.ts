import { readFileSync } from 'node:fs';
import type { Command } from 'commander';
import { analyzeDesign } from '../../shared/control';
import { formatDesignIssues, parseDesign } from '../../shared/api/design';

/**
 * Reads and validates a design file for a CLI command; on failure writes the reasons to stderr and exits 2.
 * @param path - design file path.
 * @returns the validated design.
 */
export function readDesignFileOrExit(path: string) {
  let raw: unknown;
  try {
    raw = JSON.parse(readFileSync(path, 'utf8'));
  } catch (err) {
    process.stderr.write(`varsmith: cannot read design file ${path}: ${(err as Error).message}\n`);
    process.exit(2);
  }
  const parsed = parseDesign(raw);
  if (!parsed.ok) {
    process.stderr.write(`varsmith: invalid design file ${path}\n${formatDesignIssues(parsed.issues)}\n`);
    process.exit(2);
  }
  return parsed.design;
}

/** Registers `varsmith analyze <design.json>` (CONTRACT section 4). */
export function registerAnalyze(program: Command): void {
  program
    .command('analyze')
    .description('print the varsmith-analysis/1 JSON of a design file; exit 0 ok, 1 when a check is an error, 2 on invalid input')
    .argument('<design.json>', 'design file (varsmith-design/1)')
    .action((path: string) => {
      const design = readDesignFileOrExit(path);
      const result = analyzeDesign(design, { sweepPoints: 0, responseSamples: 0 });
      process.stdout.write(`${JSON.stringify(result, null, 2)}\n`);
      process.exitCode = result.checks.some((c) => c.severity === 'error') ? 1 : 0;
    });
}

import type { Command } from 'commander';

/** Registers `varsmith export` (placeholder until its issue lands). */
export function registerExport(program: Command): void {
  program.command('export').description('not built yet').action(() => {
    process.stderr.write('varsmith export: not built yet\n');
    process.exit(2);
  });
}

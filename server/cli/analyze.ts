import type { Command } from 'commander';

/** Registers `varsmith analyze` (placeholder until its issue lands). */
export function registerAnalyze(program: Command): void {
  program.command('analyze').description('not built yet').action(() => {
    process.stderr.write('varsmith analyze: not built yet\n');
    process.exit(2);
  });
}

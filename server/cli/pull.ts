import type { Command } from 'commander';

/** Registers `varsmith pull` (placeholder until its issue lands). */
export function registerPull(program: Command): void {
  program.command('pull').description('not built yet').action(() => {
    process.stderr.write('varsmith pull: not built yet\n');
    process.exit(2);
  });
}

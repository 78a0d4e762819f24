import { Command } from 'commander';
import { registerAnalyze } from './cli/analyze';
import { registerExport } from './cli/export';
import { registerPull } from './cli/pull';
import { registerSimulate } from './cli/simulate';

// `npx varsmith <command>`: see CONTRACT section 4. Each command lives in server/cli/<command>.ts.
const program = new Command('varsmith').description('Varsmith controller coefficient tool').exitOverride();
registerAnalyze(program);
registerExport(program);
registerPull(program);
registerSimulate(program);

try {
  await program.parseAsync(process.argv);
} catch (err) {
  const code = (err as { exitCode?: number }).exitCode;
  if (typeof code === 'number') process.exit(code === 0 ? 0 : 2);
  process.stderr.write(`varsmith: ${(err as Error).message}\n`);
  process.exit(2);
}

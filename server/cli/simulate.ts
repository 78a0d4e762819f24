import type { Command } from 'commander';
import { formatPath } from '../middleware/route';
import { analyzeDesign } from '../../shared/control';
import { simulateScenario, SimulationError } from '../../shared/simulation';
import { simulationOptionsSchema, toSimulationOptions } from '../../shared/api/simulation';
import { readDesignFileOrExit } from './analyze';

/** Command-line flag of each option path, for messages. */
const FLAG_OF: Record<string, string> = {
  scenario: '--scenario', model: '--model', durationS: '--duration', shortCircuitRatio: '--scr', harmonicTable: '--harmonic-table',
  coefficients: '--coefficients', rectifierPowerW: '--rectifier-load', tracePoints: '--trace-points',
};

function usage(message: string): never {
  process.stderr.write(`varsmith simulate: ${message}\n`);
  process.exit(2);
}

// A flag's number: plain decimal or exponent notation only (no hex, no empty string).
function numberFlag(flag: string, text: string | undefined): number | undefined {
  if (text === undefined) return undefined;
  if (!/^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/.test(text.trim())) usage(`${flag}: "${text}" is not a number`);
  return Number(text);
}

interface SimulateFlags {
  scenario: string;
  model: string;
  duration?: string;
  scr?: string;
  harmonicTable: string;
  coefficients: string;
  rectifierLoad?: string;
  tracePoints: string;
}

/** Registers `varsmith simulate <design.json> --scenario ...` (CONTRACT section 10). */
export function registerSimulate(program: Command): void {
  program
    .command('simulate')
    .description('print the varsmith-simulation/1 JSON of a whole-system run; exit 0 ok, 1 when the closed loop diverges, 2 on invalid input')
    .argument('<design.json>', 'design file (varsmith-design/1)')
    .requiredOption('--scenario <scenario>', 'steady | reactive-step | frequency-step | voltage-sag')
    .option('--model <model>', 'averaged | switched', 'averaged')
    .option('--duration <s>', 'recorded length in seconds, 10 grid cycles to 10 s (default: the scenario\'s)')
    .option('--scr <ratio>', 'grid short-circuit ratio, or "stiff" (default: the design\'s envelope.shortCircuitRatioMin, else stiff)')
    .option('--harmonic-table <table>', 'ieee-519 | iec-61000-3-2-class-a', 'ieee-519')
    .option('--coefficients <set>', 'double | quantized: the controller runs the designed or the shipped coefficients', 'double')
    .option('--rectifier-load <W>', 'add a diode-rectifier load of this power in W')
    .option('--trace-points <n>', 'points per trace at most', '2000')
    .action((path: string, flags: SimulateFlags) => {
      const design = readDesignFileOrExit(path);
      const candidate = {
        scenario: flags.scenario,
        model: flags.model,
        durationS: numberFlag('--duration', flags.duration) ?? null,
        ...(flags.scr === undefined ? {} : { shortCircuitRatio: flags.scr === 'stiff' ? null : numberFlag('--scr', flags.scr) }),
        harmonicTable: flags.harmonicTable,
        coefficients: flags.coefficients,
        rectifierPowerW: numberFlag('--rectifier-load', flags.rectifierLoad) ?? null,
        tracePoints: numberFlag('--trace-points', flags.tracePoints),
      };
      const parsed = simulationOptionsSchema.safeParse(candidate);
      if (!parsed.success) {
        usage(parsed.error.issues.map((i) => `${FLAG_OF[String(i.path[0])] ?? formatPath('', i.path)}: ${i.message}`).join('\n'));
      }
      const analysis = analyzeDesign(design, { sweepPoints: 0, responseSamples: 0 });
      try {
        const result = simulateScenario(design, analysis, toSimulationOptions(parsed.data));
        process.stdout.write(`${JSON.stringify(result)}\n`);
      } catch (err) {
        if (!(err instanceof SimulationError)) throw err;
        const flag = err.path ? FLAG_OF[err.path.split('.')[0]] : undefined;
        const message = flag ? err.message.replace(err.path ?? '', flag) : err.message;
        if (err.code === 'diverged') {
          process.stderr.write(`varsmith simulate: ${message}\n`);
          process.exitCode = 1;
          return;
        }
        usage(message);
      }
    });
}

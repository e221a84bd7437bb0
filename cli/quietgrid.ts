/**
 * The quietgrid command line: a thin client of engine/. Commands write results to files and
 * messages to the terminal; every exit status means one thing (see HELP).
 */
import { EXIT_FAILED, EXIT_OK, EXIT_USAGE, UsageError, describeDefaults, describeWarnings, hz, loadScenario, parseOptions, scenarioPath, type Io } from './common.ts';
import { solveCommand } from './solve.ts';
import { exportCommand, importCommand } from './system.ts';
import { mergeCommand } from './merge.ts';
import { verifyCommand } from './verify.ts';
import { SolverFailure } from '../engine/solve/linear.ts';
import { applyKernelChoice } from '../engine/node/kernelChoice.ts';

export const HELP = `Usage: quietgrid COMMAND [options]

3D frequency-domain Helmholtz finite elements for duct silencers and enclosures.

Commands:
  solve SCENARIO.json            solve the sweep; write spectrum.csv, bands.csv, summary.json
  validate SCENARIO.json         check a scenario; print its problems, or "ok" and the defaults used
  export-system SCENARIO.json    write the linear system at one frequency as Matrix Market files
  import-solution SCENARIO.json  read an external solver's solution and write the report for it
  merge DIR... --out DIR         join the results of several --frequencies runs into one report
  verify [--json]                run the built-in verification suite on this machine (a few minutes)

Run "quietgrid COMMAND --help" for a command's options. Scenario files are described in
scenarios/schema.json; scenarios/ has examples.

Exit status: 0 success; 1 the solver failed (results of the frequencies that finished are still
written); 2 invalid input (the message names the field or option and the fix); 130 stopped by Ctrl-C.
`;

export const VALIDATE_HELP = `Usage: quietgrid validate SCENARIO.json

Reads and checks the scenario without solving it. Prints every problem found (each naming the
field, its value and the fix) and exits with status 2, or prints "ok", the defaults the file left
to the program, and any warnings, and exits with status 0.
`;

type Command = (args: string[], io: Io) => Promise<number>;

const COMMANDS: Record<string, Command> = {
  solve: solveCommand,
  validate: validateCommand,
  'export-system': exportCommand,
  'import-solution': importCommand,
  merge: mergeCommand,
  verify: verifyCommand,
};

async function validateCommand(args: string[], io: Io): Promise<number> {
  const { values, positionals } = parseOptions('validate', args, { help: { type: 'boolean' } });
  if (values.help) {
    io.out(VALIDATE_HELP);
    return EXIT_OK;
  }
  const { path, scenario: s, warnings } = await loadScenario(scenarioPath('validate', positionals));
  const f = s.sweep.frequenciesHz;
  io.out(`ok: ${path}: ${s.title} (${s.kind}), ${f.length} frequenc${f.length === 1 ? 'y' : 'ies'} from ${hz(f[0])} to ${hz(f[f.length - 1])} Hz`);
  for (const line of [...describeDefaults(s), ...describeWarnings(warnings)]) io.out(line);
  return EXIT_OK;
}

export async function main(argv: string[], io: Io): Promise<number> {
  const [name, ...rest] = argv;
  if (name === undefined || name === '--help' || name === '-h' || name === 'help') {
    io.out(HELP);
    return name === undefined ? EXIT_USAGE : EXIT_OK;
  }
  const command = COMMANDS[name];
  if (!command) {
    io.err(`quietgrid: unknown command "${name}"; the commands are ${Object.keys(COMMANDS).join(', ')} (see quietgrid --help)`);
    return EXIT_USAGE;
  }
  try {
    applyKernelChoice();
  } catch (e) {
    io.err(`quietgrid: ${(e as Error).message}`);
    return EXIT_USAGE;
  }
  try {
    return await command(rest, io);
  } catch (e) {
    return reportError(e, io);
  }
}

function reportError(e: unknown, io: Io): number {
  if (e instanceof UsageError) {
    io.err(`quietgrid: ${e.message}`);
    return EXIT_USAGE;
  }
  if (e instanceof SolverFailure) {
    io.err(`quietgrid: the solve failed at ${hz(e.frequencyHz)} Hz: ${e.message}`);
    return EXIT_FAILED;
  }
  io.err(`quietgrid: ${e instanceof Error ? (e.stack ?? e.message) : String(e)}`);
  return EXIT_FAILED;
}

const io: Io = {
  out: (line) => process.stdout.write(line.endsWith('\n') ? line : `${line}\n`),
  err: (line) => process.stderr.write(line.endsWith('\n') ? line : `${line}\n`),
};

process.exitCode = await main(process.argv.slice(2), io);

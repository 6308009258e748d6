/**
 * The `latchwright` command: a thin shell over src/core. Exit statuses are defined once, in
 * exit.ts (diagnostics printed, never a stack trace). The usage text lists the encodings of
 * the core's encodings registry.
 */
import { parseArgs } from './args.js';
import { runCheck } from './commands/check.js';
import { runBuild } from './commands/build.js';
import { runCompare } from './commands/compare.js';
import { runStepCommand } from './commands/step.js';
import { runDemo } from './commands/demo.js';
import { reportFailure } from './commands/common.js';
import { DEFAULT_ENCODING, diag, didYouMean, ENCODING_REGISTRY } from '../core/index.js';
import { nodeIo, type CliIo } from './io.js';
import { EXIT, exitStatusText } from './exit.js';

export { EXIT } from './exit.js';

const USAGE = `latchwright — design, prove and commission lever-and-capstan state machines

Usage:
  latchwright check FILE [--json]
      Read a machine (text form, JSON form or an xstate config), report diagnostics,
      state counts and which states merge.
  latchwright build FILE [--encoding NAME] [--profile FILE] [--seed N]
                         [--unused dont-care|STATE] [--json] [--out DIR [--force]]
      Synthesise the lever machine, run every check, print the report
      (or the build documents into DIR).
  latchwright compare FILE [--profile FILE] [--seed N] [--json]
      Every state encoding side by side, the cheapest marked.
  latchwright step FILE [--inputs SEQ.json] [--json] [--abstract] [--encoding NAME]
                        [--profile FILE] [--seed N]
      Step the build clock by clock: interactive at a terminal, or scripted from a
      JSON array of input settings (one object per clock).
  latchwright demo
      Build and check the bundled demo machine and print its report.

Encodings (--encoding NAME, default ${DEFAULT_ENCODING}):
${encodingLines()}
Exit status: ${exitStatusText()}.`;

/** One line per registered encoding: its name and what its codes are. */
function encodingLines(): string {
  const width = Math.max(...ENCODING_REGISTRY.map((e) => e.name.length));
  return ENCODING_REGISTRY.map((e) => `  ${e.name.padEnd(width)}  ${e.label}`).join('\n');
}

const SPEC = {
  values: ['encoding', 'profile', 'seed', 'unused', 'inputs', 'out'],
  switches: ['json', 'force', 'abstract', 'help', 'version'],
};

export async function main(argv: readonly string[], io: CliIo = nodeIo()): Promise<number> {
  const args = parseArgs(argv, SPEC);
  if (args.flags.version) {
    io.out('latchwright 0.1.0\n');
    return EXIT.ok;
  }
  if (args.flags.help || args.command === undefined || args.command === 'help') {
    io.out(USAGE + '\n');
    return args.command === undefined && !args.flags.help ? EXIT.badInput : EXIT.ok;
  }
  const json = args.flags.json === true;
  if (args.errors.length > 0) {
    const known = [...SPEC.values, ...SPEC.switches].map((o) => `--${o}`);
    reportFailure(
      args.errors.map((e) => {
        const guess = didYouMean(e.option, known);
        return diag(
          'LW700',
          e.message,
          { path: e.option },
          guess && guess !== e.option
            ? `did you mean ${guess}? Run \`latchwright --help\` for usage`
            : 'run `latchwright --help` for usage',
        );
      }),
      io,
      json,
    );
    return EXIT.badInput;
  }
  try {
    switch (args.command) {
      case 'check':
        return runCheck(args, io);
      case 'build':
        return await runBuild(args, io);
      case 'compare':
        return runCompare(args, io);
      case 'step':
        return await runStepCommand(args, io);
      case 'demo':
        return await runDemo(args, io);
      default:
        reportFailure(
          [
            diag(
              'LW700',
              `unknown command '${args.command}'`,
              { path: args.command },
              'commands: check, build, compare, step, demo',
            ),
          ],
          io,
          json,
        );
        return EXIT.badInput;
    }
  } catch (e) {
    // A fault of ours, not of the input: say so plainly, without a stack trace.
    io.err(`latchwright: internal error: ${e instanceof Error ? e.message : String(e)}\n`);
    io.err('Please report this with the machine file that caused it.\n');
    return EXIT.badInput;
  }
}

/**
 * The `latchwright` command: a thin shell over src/core. Exit statuses are defined once, in
 * exit.ts (diagnostics printed, never a stack trace). The usage text lists the encodings of
 * the core's encodings registry.
 */
import { parseArgs, type ParsedArgs } from './args.js';
import { runCheck } from './commands/check.js';
import { runBuild } from './commands/build.js';
import { runCompare } from './commands/compare.js';
import { runStepCommand } from './commands/step.js';
import { runDemo } from './commands/demo.js';
import { runWrite, WRITE_SPEC } from './commands/write.js';
import { RunContext } from './commands/common.js';
import { BEHAVIOURS, DEFAULT_ENCODING, diag, didYouMean, ENCODING_REGISTRY } from '../core/index.js';
import { nodeIo, type CliIo } from './io.js';
import { EXIT, exitStatusText } from './exit.js';

export { EXIT } from './exit.js';

const USAGE = `latchwright — design, prove and commission lever-and-capstan state machines

Usage:
  latchwright check FILE [--json]
      Read a machine (text form, JSON form or an xstate config), report diagnostics,
      state counts and which states merge.
  latchwright build FILE [--encoding NAME] [--profile FILE] [--seed N]
                         [--unused dont-care|STATE] [--pin PART=BAY[@DRUM] …]
                         [--shop-units metric|inch] [--json] [--out DIR [--force]]
                         [--saw STEP:WHAT=POSITION …]
      Synthesise the lever machine, place every part in a bay along the drum,
      route every cord, run every check, print the report (or the build
      documents into DIR: sheets, frame drawing, cam templates, cut list …).
      --saw names the cords to look at when step STEP of the commissioning
      sheet did not match: --saw 14:s0-set-Z=up (the column's name, dashes
      for spaces). Give it once for every lever that differed, at one step or
      at several: the cords that explain all of it, and the steps ahead that
      tell them apart (steps before the first one named count as the sheet).
      --pin keeps a part in a bay, counted from 1 at the visitor end of drum 1
      (or of drum DRUM): --pin rst=22 --pin m0=5@2; several may be given, or
      joined with commas. Part ids are in netlist.json; a latch id pins its
      set side, and its reset side takes the next bay. --shop-units inch writes
      every document and the printed report in feet, inches, ounces and
      lbf·in for this build (the profile's documentUnits; netlist.json and
      --json stay SI).
  latchwright compare FILE [--profile FILE] [--seed N] [--json]
      Every state encoding side by side, the cheapest marked.
  latchwright step FILE [--inputs SEQ.json] [--json] [--abstract] [--encoding NAME]
                        [--profile FILE] [--seed N]
      Step the build clock by clock: interactive at a terminal, or scripted from a
      JSON array of input settings (one object per clock).
  latchwright demo
      Build and check the bundled demo machine and print its report.
  latchwright write BEHAVIOUR [--OPTION VALUE …] [--json]
      Write the machine of a behaviour in the text form on standard output (the
      JSON form with --json), ready for check, build or step. Behaviours:
      ${BEHAVIOURS.map((b) => b.name).join(', ')}.
      \`latchwright write --help\` lists each behaviour's options.

Encodings (--encoding NAME, default ${DEFAULT_ENCODING}):
${encodingLines()}
Exit status: ${exitStatusText()}.`;

/** One line per registered encoding: its name and what its codes are. */
function encodingLines(): string {
  const width = Math.max(...ENCODING_REGISTRY.map((e) => e.name.length));
  return ENCODING_REGISTRY.map((e) => `  ${e.name.padEnd(width)}  ${e.label}`).join('\n');
}

const SPEC = {
  values: ['encoding', 'profile', 'seed', 'unused', 'inputs', 'out', 'shop-units'],
  switches: ['json', 'force', 'abstract', 'help', 'version'],
  lists: ['pin', 'saw'],
};

export async function main(argv: readonly string[], io: CliIo = nodeIo()): Promise<number> {
  let ctx = new RunContext(io, argv.includes('--json'));
  try {
    const first = parseArgs(argv, SPEC);
    // `write` takes the options of its behaviours (--order, --every …), which no other command takes.
    const args = first.command === 'write' ? parseArgs(argv, WRITE_SPEC) : first;
    ctx = new RunContext(io, args.flags.json === true);
    return await dispatch(args, ctx);
  } catch (e) {
    // A fault of ours, not of the input: one coded diagnostic (JSON with --json), never a stack trace.
    const why = e instanceof Error ? e.message : String(e);
    ctx.fail([
      diag(
        'LW900',
        `internal error: ${why}`,
        ctx.machineFile !== undefined ? { file: ctx.machineFile } : { path: argv[0] ?? 'latchwright' },
        'please report this, with the machine file and the command line that caused it',
      ),
    ]);
    return EXIT.badInput;
  }
}

async function dispatch(args: ParsedArgs, ctx: RunContext): Promise<number> {
  const io = ctx.io;
  if (args.flags.version) {
    io.out('latchwright 0.1.0\n');
    return EXIT.ok;
  }
  if (args.command === 'write' && args.errors.length === 0) return runWrite(args, ctx);
  if (args.flags.help || args.command === undefined || args.command === 'help') {
    io.out(USAGE + '\n');
    return args.command === undefined && !args.flags.help ? EXIT.badInput : EXIT.ok;
  }
  if (args.errors.length > 0) {
    const spec = args.command === 'write' ? WRITE_SPEC : SPEC;
    const known = [...spec.values, ...spec.switches, ...(spec.lists ?? [])].map((o) => `--${o}`);
    ctx.fail(
      args.errors.map((e) => {
        // A near spelling, or the option of which the word typed is the last part (--units: --shop-units).
        const guess = didYouMean(e.option, known) ?? known.find((k) => k.endsWith(`-${e.option.slice(2)}`));
        return diag(
          'LW700',
          e.message,
          { path: e.option },
          guess && guess !== e.option
            ? `did you mean ${guess}? Run \`latchwright --help\` for usage`
            : 'run `latchwright --help` for usage',
        );
      }),
    );
    return EXIT.badInput;
  }
  switch (args.command) {
    case 'check':
      return runCheck(args, ctx);
    case 'build':
      return await runBuild(args, ctx);
    case 'compare':
      return runCompare(args, ctx);
    case 'step':
      return await runStepCommand(args, ctx);
    case 'demo':
      return await runDemo(args, ctx);
    default:
      ctx.fail([
        diag(
          'LW700',
          `unknown command '${args.command}'`,
          { path: args.command },
          'commands: check, build, compare, step, demo, write',
        ),
      ]);
      return EXIT.badInput;
  }
}

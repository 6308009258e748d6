/** `latchwright step FILE`: build the machine, then step it (scripted or at the terminal). */
import { runStep, terminalKeys, type SeqArray } from '../step.js';
import type { ParsedArgs } from '../args.js';
import type { CliIo } from '../io.js';
import { buildFromArgs } from './build-common.js';
import { EXIT } from '../exit.js';
import { readFileArg, reportFailure } from './common.js';
import { diag } from '../../core/index.js';

export async function runStepCommand(args: ParsedArgs, io: CliIo): Promise<number> {
  const json = args.flags.json === true;
  let sequence: SeqArray | undefined;
  if (typeof args.flags.inputs === 'string') {
    const file = args.flags.inputs;
    const r = readFileArg(file, io);
    if (!r.ok) {
      reportFailure(r.diagnostics, io, false);
      return EXIT.badInput;
    }
    try {
      sequence = JSON.parse(r.text) as SeqArray;
    } catch (e) {
      const why = e instanceof Error ? e.message : String(e);
      reportFailure(
        [
          diag(
            'LW100',
            `the input sequence is not valid JSON (${why})`,
            { file, path: '$' },
            'give an array with one object per clock, e.g. [{"marble": 1}, {}]',
          ),
        ],
        io,
        false,
      );
      return EXIT.badInput;
    }
  }
  const b = await buildFromArgs(args, io, { checks: false });
  if (!b.ok) {
    reportFailure(b.diagnostics, io, false);
    return EXIT.badInput;
  }
  const built = b.built;
  const spec = { original: built.analysed.flat, merged: built.analysed.minimised.merged };
  return runStep(
    built.build,
    spec,
    {
      inputsFile: sequence,
      ...(typeof args.flags.inputs === 'string' ? { inputsPath: args.flags.inputs } : {}),
      json,
      abstract: args.flags.abstract === true,
      profile: built.profile,
    },
    {
      write: (s) => io.out(s),
      error: (s) => io.err(s),
      ...(sequence === undefined && io.interactive ? { readKeys: terminalKeys } : {}),
    },
  );
}

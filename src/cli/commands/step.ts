/** `latchwright step FILE`: build the machine, then step it (scripted or at the terminal). */
import { nameRecordOf } from '../../core/index.js';
import { runStep, terminalKeys, type SeqArray } from '../step.js';
import type { ParsedArgs } from '../args.js';
import { buildFromArgs } from './build-common.js';
import { EXIT } from '../exit.js';
import { readJsonArg, type RunContext } from './common.js';

/**
 * The clocks of a sequence file as records without a prototype, so an input named like a key
 * of every object (`constructor`, `toString`) reads as released when a clock does not set it.
 * Anything that is not an array of objects is passed on as it is, for the step's own checks.
 */
function ownRecords(value: unknown): unknown {
  if (!Array.isArray(value)) return value;
  return value.map((row: unknown) =>
    typeof row === 'object' && row !== null && !Array.isArray(row) ? nameRecordOf(Object.entries(row)) : row,
  );
}

export async function runStepCommand(args: ParsedArgs, ctx: RunContext): Promise<number> {
  let sequence: SeqArray | undefined;
  const inputs = typeof args.flags.inputs === 'string' ? args.flags.inputs : undefined;
  if (inputs !== undefined) {
    const r = readJsonArg(inputs, ctx, 'the input sequence');
    if (!r.ok) {
      ctx.fail(r.diagnostics);
      return EXIT.badInput;
    }
    sequence = ownRecords(r.value) as SeqArray;
  }
  const b = await buildFromArgs(args, ctx, { checks: false });
  if (!b.ok) {
    ctx.fail(b.diagnostics);
    return EXIT.badInput;
  }
  ctx.show(b.diagnostics);
  const built = b.built;
  const spec = { original: built.analysed.flat, merged: built.analysed.minimised.merged };
  return runStep(
    built.build,
    spec,
    {
      inputsFile: sequence,
      ...(inputs !== undefined ? { inputsPath: inputs } : {}),
      json: ctx.json,
      abstract: args.flags.abstract === true,
      profile: built.profile,
    },
    {
      write: (s) => ctx.io.out(s),
      error: (s) => ctx.io.err(s),
      fail: (ds) => ctx.fail(ds),
      ...(sequence === undefined && ctx.io.interactive ? { readKeys: terminalKeys } : {}),
    },
  );
}

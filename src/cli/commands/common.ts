/** Pieces the commands share. */
import type { Analysed } from '../../core/pipeline.js';
import type { ParsedArgs } from '../args.js';
import type { CliIo } from '../io.js';

export const EXIT_OK = 0;
export const EXIT_CHECK_FAILED = 1;
export const EXIT_BAD_INPUT = 2;

/** The machine file named on the command line, read as text; errors printed. */
export function loadSource(args: ParsedArgs, io: CliIo): { file: string; text: string } | undefined {
  const file = args.positional[0];
  if (file === undefined) {
    io.err('latchwright: no machine file given. Usage: latchwright ' + (args.command ?? 'check') + ' FILE\n');
    return undefined;
  }
  if (args.positional.length > 1) {
    io.err(`latchwright: one machine file at a time (got ${args.positional.length}).\n`);
    return undefined;
  }
  const r = io.readText(file);
  if ('error' in r) {
    io.err(`latchwright: ${r.error}\n`);
    return undefined;
  }
  return { file, text: r.text };
}

/** The `machine` and `merged` blocks that `check --json` and `build --json` share. */
export function machineSummary(a: Analysed) {
  return {
    machine: {
      name: a.machine.name,
      states: a.machine.states.length,
      reachable: a.machine.states.length - a.minimised.unreachable.length,
      minimized: a.minimised.machine.states.length,
      inputs: a.machine.inputs.length,
      outputs: a.machine.outputs.length,
      inputNames: a.machine.inputs,
      outputNames: a.machine.outputs,
    },
    merged: a.minimised.merged,
    method: a.minimised.method,
    exact: a.minimised.exact,
  };
}

/** `latchwright demo`: build and check the bundled demo machine and print its report. */
import { fileURLToPath } from 'node:url';
import { dirname, join, relative } from 'node:path';
import type { ParsedArgs } from '../args.js';
import type { CliIo } from '../io.js';
import { runBuild } from './build.js';

/** The demo machine shipped with the package. */
export const DEMO_FILE = join(dirname(fileURLToPath(import.meta.url)), '..', '..', '..', 'examples', 'marble-bell.lw');

export async function runDemo(args: ParsedArgs, io: CliIo): Promise<number> {
  const file = relative(process.cwd(), DEMO_FILE) || DEMO_FILE;
  io.out(`Demo: building ${file} — a marble lift that rings a bell on every third marble.\n\n`);
  const code = await runBuild({ ...args, command: 'build', positional: [file] }, io);
  io.out(
    `\nNext: \`npx latchwright step ${file}\` to work its levers, or \`npx latchwright build ${file} --out build/\` for the workshop documents.\n`,
  );
  return code;
}

/** `latchwright demo`: build and check the bundled demo machine and print its report. */
import { fileURLToPath } from 'node:url';
import { dirname, join, relative } from 'node:path';
import type { ParsedArgs } from '../args.js';
import { runBuild } from './build.js';
import type { RunContext } from './common.js';

/** The demo machine shipped with the package. */
export const DEMO_FILE = join(dirname(fileURLToPath(import.meta.url)), '..', '..', '..', 'examples', 'marble-bell.lw');

/** With --json the report alone is printed (one JSON document), without the words around it. */
export async function runDemo(args: ParsedArgs, ctx: RunContext): Promise<number> {
  const io = ctx.io;
  const file = relative(process.cwd(), DEMO_FILE) || DEMO_FILE;
  if (!ctx.json) io.out(`Demo: building ${file} — a marble lift that rings a bell on every third marble.\n\n`);
  const code = await runBuild({ ...args, command: 'build', positional: [file] }, ctx);
  if (!ctx.json)
    io.out(
      `\nNext: \`npx latchwright step ${file}\` to work its levers, or \`npx latchwright build ${file} --out build/\` for the workshop documents.\n`,
    );
  return code;
}

/**
 * `latchwright` itself (src/cli/main.ts): usage, version, command dispatch, command-line errors
 * as coded diagnostics, and the last-resort guard that turns a fault of ours into one plain line
 * and exit 2 instead of a stack trace. Everything runs through `main(argv, io)` with a
 * capturing io; bin/latchwright.js only hands main's result to process.exitCode.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { EXIT, main } from '../../src/cli/main.js';
import { EXIT_MEANINGS } from '../../src/cli/exit.js';
import { DEFAULT_ENCODING, ENCODING_REGISTRY } from '../../src/core/index.js';
import type { CliIo } from '../../src/cli/io.js';
import { expectNoStack, run } from './support.js';

const COMMANDS = ['check', 'build', 'compare', 'step', 'demo', 'write'];

describe('cli/main', () => {
  it('exit statuses are 0 all good, 1 a check failed, 2 bad input, each meaning given once', () => {
    expect(EXIT).toEqual({ ok: 0, checkFailed: 1, badInput: 2 });
    expect(EXIT_MEANINGS.map((e) => e.status)).toEqual([0, 1, 2]);
  });

  it('--help and -h print the usage, naming every command and every encoding of the registry, exit 0', async () => {
    for (const flag of ['--help', '-h']) {
      const r = await run([flag]);
      expect(r.code).toBe(0);
      for (const c of COMMANDS) expect(r.out).toContain(`latchwright ${c}`);
      expect(r.out).toContain(`Encodings (--encoding NAME, default ${DEFAULT_ENCODING}):`);
      const listed = r.out.split('\n').filter((l) => /^ {2}[a-z-]+ {2,}\S/.test(l));
      expect(listed.map((l) => l.trim().split(/\s+/)[0])).toEqual(ENCODING_REGISTRY.map((e) => e.name));
      expect(r.out).toContain('  one-hot  one latch per state\n');
      expect(r.out).toContain('Exit status: 0 all good, 1 a check failed, 2 bad input.');
      expect(r.err).toBe('');
    }
    expect((await run(['help'])).code).toBe(0);
  });

  it('no command at all: the usage, exit 2', async () => {
    const r = await run([]);
    expect(r.code).toBe(2);
    expect(r.out).toMatch(/^latchwright — /);
  });

  it('--version prints the package version', async () => {
    const r = await run(['--version']);
    const pkg = JSON.parse(readFileSync('package.json', 'utf8')) as { version: string };
    expect(r).toEqual({ code: 0, out: `latchwright ${pkg.version}\n`, err: '' });
  });

  it('an unknown command: LW700 naming the commands there are', async () => {
    const r = await run(['assemble', 'examples/marble-bell.lw']);
    expect(r.code).toBe(2);
    expect(r.err).toBe(
      "assemble: error LW700: unknown command 'assemble' — commands: check, build, compare, step, demo, write\n",
    );
    expect(r.out).toBe('');
  });

  it('command-line errors come as JSON on standard output when --json is given', async () => {
    const r = await run(['check', 'examples/marble-bell.lw', '--json', '--colour']);
    expect(r.code).toBe(2);
    expect(JSON.parse(r.out)).toEqual({
      ok: false,
      diagnostics: [
        {
          code: 'LW700',
          severity: 'error',
          message: 'unknown option --colour',
          location: { path: '--colour' },
          hint: 'run `latchwright --help` for usage',
        },
      ],
    });
    expect(r.err).toBe('');
  });

  it('`--` ends the options: what follows is a file name', async () => {
    const r = await run(['check', '--', '--json']);
    expect(r.code).toBe(2);
    expect(r.err).toBe('--json: error LW705: no such file: --json — check the path; name a file, not a folder\n');
  });

  it('demo builds the bundled marble bell and passes every check', async () => {
    const r = await run(['demo']);
    expect(r.code).toBe(0);
    expect(r.out).toMatch(/^Demo: building .*marble-bell\.lw/);
    expect(r.out).toContain('marble_bell: 4 states → 4 after minimisation');
    expect(r.out).not.toContain('FAIL');
    expectNoStack(r);
  });

  it('a fault of ours becomes one coded line (LW900) asking for a report, and exit 2, never a stack trace', async () => {
    const faulty = (argv: string[], fault: () => never) => {
      let out = '';
      let err = '';
      const io: CliIo = {
        out: (s) => void (out += s),
        err: (s) => void (err += s),
        readText: fault,
        interactive: false,
      };
      return main(argv, io).then((code) => ({ code, out, err }));
    };
    const fell = await faulty(['check', 'examples/marble-bell.lw'], () => {
      throw new Error('the disk fell off');
    });
    expect(fell).toEqual({
      code: 2,
      out: '',
      err: 'check: error LW900: internal error: the disk fell off — please report this, with the machine file and the command line that caused it\n',
    });
    // With --json the fault is JSON on standard output, like every other failure.
    const deep = await faulty(['build', 'examples/marble-bell.lw', '--json'], () => {
      throw new RangeError('Maximum call stack size exceeded');
    });
    expect(deep.code).toBe(2);
    expect(deep.err).toBe('');
    expect(JSON.parse(deep.out)).toEqual({
      ok: false,
      diagnostics: [
        {
          code: 'LW900',
          severity: 'error',
          message: 'internal error: Maximum call stack size exceeded',
          location: { path: 'build' },
          hint: 'please report this, with the machine file and the command line that caused it',
        },
      ],
    });
  });
});

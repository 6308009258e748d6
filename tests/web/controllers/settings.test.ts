/**
 * Names and settings the page keeps: the file name that follows the machine's name, a file
 * name typed by hand, stored code choices read back only when they have the shape of one, and
 * the `latchwright build` command shown for the settings (its options as src/cli spells them).
 */
import { describe, expect, it } from 'vitest';
import { cleanFileName, fileFor } from '../../../src/web/controllers/source.js';
import {
  codesAreDefault,
  codesToDefaults,
  commandLine,
  isDefault,
  parseChoice,
  parseUnused,
} from '../../../src/web/controllers/synthesis.js';
import { DEFAULT_SETTINGS } from '../../../src/web/worker/protocol.js';
import { run } from '../../cli/support.js';

describe('src/web/controllers (names and settings)', () => {
  it('names the file after the machine, and cleans a name typed by hand', () => {
    expect(fileFor('cabinet_lock')).toBe('cabinet_lock.lw');
    expect(fileFor('-x')).toBe('x.lw');
    expect(fileFor('')).toBe('machine.lw');
    expect(cleanFileName(' lock-v2 ')).toBe('lock-v2.lw');
    expect(cleanFileName('notes.txt')).toBe('notes.txt');
    expect(cleanFileName('a/b')).toBe('a_b.lw');
    expect(cleanFileName('')).toBeUndefined();
    expect(cleanFileName('.lw')).toBeUndefined();
  });

  it('reads back a stored code choice only when it has the shape of one', () => {
    expect(parseChoice('{"strategy":"gray"}')).toEqual({ strategy: 'gray' });
    const kept = { kept: { strategy: 'auto', bits: 2, codes: ['00', '01', '11'] }, states: ['a', 'b', 'c'] };
    expect(parseChoice(JSON.stringify(kept))).toEqual(kept);
    for (const bad of [
      '{',
      'null',
      '{"strategy":"pinned"}',
      '{"strategy":"fancy"}',
      '{"kept":{"strategy":"auto","bits":2,"codes":["00","00"]},"states":["a","b"]}',
      '{"kept":{"strategy":"auto","bits":2,"codes":["00","012"]},"states":["a","b"]}',
      '{"kept":{"strategy":"auto","bits":2,"codes":["00"]},"states":["a","b"]}',
      '{"kept":{"strategy":"auto","bits":2,"codes":["00","01"]},"states":["a",2]}',
    ])
      expect(parseChoice(bad), bad).toBeUndefined();
    expect(parseUnused('road_open')).toBe('road_open');
    expect(parseUnused('dont-care')).toBe('dont-care');
    expect(parseUnused('../x')).toBeUndefined();
  });

  it('takes the codes back to the defaults and leaves the workshop: its profile, and the parts kept in bays', () => {
    const workshop = {
      profile: { name: 'slippery-cord.json', value: { mu: 0.12 } },
      pins: { 'in.marble': { bay: 7 } },
    };
    const own = { ...DEFAULT_SETTINGS, encoding: { strategy: 'gray' as const }, unusedCodes: 'dont-care', ...workshop };
    expect(codesAreDefault(own)).toBe(false);
    const back = codesToDefaults(own);
    expect(back).toEqual({ ...DEFAULT_SETTINGS, ...workshop });
    expect(codesAreDefault(back)).toBe(true);
    // Still own settings (the status says so): the profile and the pins stay until let go.
    expect(isDefault(back)).toBe(false);
    expect(codesToDefaults(DEFAULT_SETTINGS)).toEqual(DEFAULT_SETTINGS);
  });

  it('shows the command line that builds what the settings build, and the command line accepts it', async () => {
    expect(isDefault(DEFAULT_SETTINGS)).toBe(true);
    expect(commandLine('m.lw', DEFAULT_SETTINGS)).toBe('latchwright build m.lw');
    const own = { ...DEFAULT_SETTINGS, encoding: { strategy: 'gray' as const }, unusedCodes: 'none' };
    expect(isDefault(own)).toBe(false);
    expect(commandLine('my lock.lw', own)).toBe("latchwright build 'my lock.lw' --encoding gray --unused none");
    const r = await run(['build', 'examples/marble-bell.lw', '--encoding', 'gray', '--unused', 'none', '--json']);
    expect(r.code).toBe(0);
  });
});

/**
 * The parts kept in a bay, as the page holds them (src/web/controllers/pins.ts): a drop or a
 * named bay turned into a pin, the pins written as the command line's `--pin PART=BAY@DRUM`
 * options and read back by the command line's own parser (src/cli), the browser's storage round
 * trip, and the pins of parts a changed machine no longer has. Placements come from building
 * the bundled marble-bell example with the core.
 */
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { analyse, buildMachine, diag, type Placement } from '../../../src/core/index.js';
import { parseArgs } from '../../../src/cli/args.js';
import { pinsFrom } from '../../../src/cli/commands/build-common.js';
import {
  bayOf,
  parseStoredPins,
  pinForDrop,
  pinNotes,
  pinOptions,
  pinsAway,
  pinWords,
  spotFrom,
  spotOfPin,
  storedPins,
  withoutPin,
  withPin,
} from '../../../src/web/controllers/pins.js';
import { commandLine, isDefault } from '../../../src/web/controllers/synthesis.js';
import { DEFAULT_SETTINGS } from '../../../src/web/worker/protocol.js';

function placementOf(file: string): Placement {
  const a = analyse(readFileSync(file, 'utf8'), file);
  if (!a.ok) throw new Error(`${file} must read`);
  const b = buildMachine(a, { checks: false });
  if (!b.ok) throw new Error(`${file} must build`);
  return b.placement;
}

const bell = placementOf('examples/marble-bell.lw');

describe('src/web/controllers/pins', () => {
  it('turns a part dropped on another bay into the pin of that bay, and a drop where it stands into none', () => {
    const at = bayOf(bell, 'in.marble');
    expect(at).toEqual({ drum: 1, bay: 1 });
    expect(pinForDrop(bell, 'in.marble', { drum: 1, bay: 7 })).toEqual({ bay: 7 });
    expect(pinForDrop(bell, 'in.marble', { drum: 2, bay: 3 })).toEqual({ bay: 3, drum: 2 });
    expect(pinForDrop(bell, 'in.marble', { drum: 1, bay: 1 })).toBeUndefined();
    expect(pinForDrop(bell, 'no.such', { drum: 1, bay: 2 })).toBeUndefined();
    // A latch's id stands where its first bay is.
    expect(bayOf(bell, 'm1')).toEqual({ drum: 1, bay: 2 });
    // A pin's spot: drum 1 when the pin names none, as `--pin PART=BAY` means.
    expect(spotOfPin({ bay: 7 })).toEqual({ drum: 1, bay: 7 });
    expect(spotOfPin({ bay: 3, drum: 2 })).toEqual({ drum: 2, bay: 3 });
  });

  it('reads a bay and drum typed in the field: whole numbers from 1, an empty drum being drum 1', () => {
    expect(spotFrom('7', '')).toEqual({ drum: 1, bay: 7 });
    expect(spotFrom(' 12 ', '2')).toEqual({ drum: 2, bay: 12 });
    for (const [bay, drum] of [
      ['0', '1'],
      ['', '1'],
      ['3.5', '1'],
      ['-2', '1'],
      ['4', '0'],
      ['4', 'x'],
    ])
      expect(spotFrom(bay, drum), `${bay}@${drum}`).toBeUndefined();
  });

  it('keeps the order pins were set in; setting one again moves it, letting go removes it', () => {
    let pins = withPin(undefined, 'rst', { bay: 22 });
    pins = withPin(pins, 'in.marble', { bay: 5 });
    pins = withPin(pins, 'rst', { bay: 20 });
    expect(Object.entries(pins)).toEqual([
      ['in.marble', { bay: 5 }],
      ['rst', { bay: 20 }],
    ]);
    expect(withoutPin(pins, 'rst')).toEqual({ 'in.marble': { bay: 5 } });
    expect(withoutPin(withoutPin(pins, 'rst'), 'in.marble')).toBeUndefined();
  });

  it('writes the pins as the command line takes them, and its own parser reads them back', () => {
    const pins = { 'in.marble': { bay: 5 }, m1: { bay: 2, drum: 2 }, rst: { bay: 3, drum: 1 } };
    expect(pinWords('m1', { bay: 2, drum: 2 })).toBe('m1=2@2');
    expect(pinWords('rst', { bay: 3, drum: 1 })).toBe('rst=3');
    expect(pinOptions(pins)).toEqual(['--pin', 'in.marble=5', '--pin', 'm1=2@2', '--pin', 'rst=3']);
    const settings = { ...DEFAULT_SETTINGS, pins };
    expect(isDefault(settings)).toBe(false);
    const line = commandLine('bell.lw', settings);
    expect(line).toBe('latchwright build bell.lw --pin in.marble=5 --pin m1=2@2 --pin rst=3');
    const back = pinsFrom(parseArgs(line.split(' ').slice(1), { values: [], switches: [], lists: ['pin'] }));
    expect(back).toEqual({ pins: { 'in.marble': { bay: 5 }, m1: { bay: 2, drum: 2 }, rst: { bay: 3 } } });
  });

  it('round-trips the pins through the browser storage, and refuses a stored value of another shape', () => {
    const pins = { 'in.marble': { bay: 5 }, m1: { bay: 2, drum: 2 } };
    expect(parseStoredPins(storedPins(pins))).toEqual(pins);
    expect(Object.keys(parseStoredPins(storedPins(pins)) ?? {})).toEqual(['in.marble', 'm1']);
    for (const bad of [
      '{',
      '[]',
      '{"in.marble":{"bay":5}}',
      '[["g1",{"bay":0}]]',
      '[["g1",{"bay":2.5}]]',
      '[["g1",{"bay":2,"drum":0}]]',
      '[["",{"bay":2}]]',
      '[["g1"]]',
      '[[3,{"bay":2}]]',
    ])
      expect(parseStoredPins(bad), bad).toBeUndefined();
  });

  it('names the pins of parts a changed machine no longer has, and finds what the build said of each pin', () => {
    const pins = { 'in.marble': { bay: 5 }, 'in.pebble': { bay: 2 }, m9: { bay: 4 } };
    expect(pinsAway(pins, bell)).toEqual(['in.pebble', 'm9']);
    expect(pinsAway(pins, undefined)).toEqual([]);
    const notes = [
      diag('LW707', "a pin names 'in.pebble', which is not a part of this build", { path: '--pin in.pebble' }, 'x'),
      diag('LW708', 'could not be kept', { path: '--pin in.marble' }, 'y'),
      diag('LW703', 'unused codes', {}),
    ];
    expect(pinNotes(notes, 'in.pebble').map((d) => d.code)).toEqual(['LW707']);
    expect(pinNotes(notes, 'in.marble').map((d) => d.code)).toEqual(['LW708']);
    expect(pinNotes(notes, 'm9')).toEqual([]);
  });
});

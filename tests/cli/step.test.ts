import { describe, expect, it } from 'vitest';
import { runStep, type StepIo } from '../../src/cli/step.js';
import { brokenBuild } from '../core/checks/builds.js';
import { toggleBuild } from '../core/sim/handmade.js';

/** Keypresses delivered one at a time, asynchronously, as a terminal delivers them. */
function keysFrom(keys: readonly string[]): AsyncIterable<string> {
  return {
    [Symbol.asyncIterator]: () => {
      let i = 0;
      return {
        next: (): Promise<IteratorResult<string>> =>
          Promise.resolve(i < keys.length ? { value: keys[i++], done: false } : { value: undefined, done: true }),
      };
    },
  };
}

function capture(keys?: string[]): StepIo & { out: string[]; errors: string[] } {
  const out: string[] = [];
  const errors: string[] = [];
  return {
    out,
    errors,
    write: (s) => void out.push(s),
    error: (s) => void errors.push(s),
    ...(keys ? { readKeys: () => keysFrom(keys) } : {}),
  };
}

describe('cli/step', () => {
  it('prints one table row per scripted clock', async () => {
    const io = capture();
    const code = await runStep(
      toggleBuild(),
      {},
      { inputsFile: [{ t: 1 }, {}, { t: 1 }], json: false, abstract: false },
      io,
    );
    expect(code).toBe(0);
    expect(io.out.join('')).toBe(
      [
        'clock  state  code  inputs  outputs  next  alarms',
        '1      off    0     t=1     lit=0    on    -',
        '2      on     1     t=0     lit=1    on    -',
        '3      on     1     t=1     lit=1    off   -',
        '',
      ].join('\n'),
    );
  });

  it('prints JSON rows, the same at part level and abstract level for a sound build', async () => {
    const part = capture();
    const abs = capture();
    const seq = [{ t: 1 as const }, { t: 0 as const }];
    await runStep(toggleBuild(), {}, { inputsFile: seq, json: true, abstract: false }, part);
    await runStep(toggleBuild(), {}, { inputsFile: seq, json: true, abstract: true }, abs);
    const rows = JSON.parse(part.out.join('')) as unknown[];
    expect(rows[0]).toEqual({
      clock: 1,
      state: 'off',
      code: '0',
      inputs: { t: 1 },
      outputs: { lit: 0 },
      next: 'on',
      nextCode: '1',
      alarms: [],
    });
    expect(JSON.parse(abs.out.join(''))).toEqual(rows);
  });

  it('exits 1 and shows the alarms in words when the build misbehaves', async () => {
    const io = capture();
    const code = await runStep(
      brokenBuild('toggle-release-race'),
      {},
      { inputsFile: [{}], json: true, abstract: false },
      io,
    );
    expect(code).toBe(1);
    const [row] = JSON.parse(io.out.join('')) as { next: string | null; nextCode: string; alarms: string[] }[];
    expect(row.next).toBeNull();
    expect(row.nextCode).toBe('X');
    expect(row.alarms).toContain('latch M0 sees the forbidden input: S̄ and R̄ are pulled at once');
  });

  it('rejects a bad sequence with diagnostics and exit 2', async () => {
    const io = capture();
    expect(
      await runStep(
        toggleBuild(),
        {},
        { inputsFile: [{ go: 1 }], inputsPath: 'clocks.json', json: false, abstract: false },
        io,
      ),
    ).toBe(2);
    expect(io.errors.join('')).toBe(
      "clocks.json $[0].go: error LW208: clock 1 sets 'go', which is not an input of toggle — inputs: t\n",
    );
  });

  it('asks for a sequence when there is no terminal', async () => {
    const io = capture();
    expect(await runStep(toggleBuild(), {}, { json: false, abstract: false }, io)).toBe(2);
    expect(io.errors.join('')).toMatch(/not at a terminal/);
  });

  it('steps interactively, one key per hand action, redrawing each time', async () => {
    const io = capture(['1', ',', '1', ',', '.', '.', 'z', 'u', 'q']);
    expect(
      await runStep(toggleBuild(), { merged: { off: 'off', off2: 'off' } }, { json: false, abstract: false }, io),
    ).toBe(0);
    const screens = io.out;
    expect(screens).toHaveLength(9);
    expect(screens[0]).toContain('state:   off (stands for off, off2)   code 0');
    expect(screens[0]).toContain(
      "keys: 1 input lever 't' · , φ1 · . φ2 · space whole clock · r reset · u undo · q quit",
    );
    // t pulled, φ1 pulled, then t moved under φ1: the operating rule alarm in words.
    expect(screens[3]).toContain(
      "alarms:  operating rule broken (input levers stay still while φ1 is pulled): release input lever 't'",
    );
    expect(screens[2]).toContain('masters: M0: Q=1 Q̄=0');
    expect(screens[2]).toContain('slaves:  Q0: Q=0 Q̄=1');
    expect(screens[7]).toContain("alarms:  key 'z' does nothing here");
    expect(screens[8]).toContain('alarms:  undone');
  });

  it('steps the abstract machine a whole clock at a time', async () => {
    const io = capture(['1', ' ', ',', 'r']);
    await runStep(toggleBuild(), {}, { json: false, abstract: true }, io);
    expect(io.out[2]).toContain('state:   on');
    expect(io.out[3]).toContain('the abstract machine has no clock levers');
    expect(io.out[4]).toContain('state:   off');
  });
});

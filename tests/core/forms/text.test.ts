import { readdirSync, readFileSync } from 'node:fs';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { machineFromJson, machineToJson } from '../../../src/core/forms/json.js';
import { parseTextMachine, printTextMachine } from '../../../src/core/forms/text.js';
import { formatDiagnostic } from '../../../src/core/model/diagnostics.js';
import { jsonMachineArb } from './machine-arb.js';

const TINY = `# Door chime
#
#  indented note

machine door_chime   # a comment
inputs a, b
outputs bell lamp
start idle
unspecified dont-care
never a & b

state idle with lamp=1 code 01
  when a go busy with bell=1, lamp=-
  go idle
state busy
`;

describe('core/forms/text', () => {
  it('reads a tiny machine exactly, with line and column on every part', () => {
    const r = parseTextMachine(TINY, 'door.lw');
    expect(r.diagnostics).toEqual([]);
    const m = r.machine!;
    expect(m).toMatchObject({
      name: 'door_chime',
      description: 'Door chime\n\n indented note',
      inputs: ['a', 'b'],
      outputs: ['bell', 'lamp'],
      start: 'idle',
      unspecified: 'dont-care',
    });
    expect(m.never[0]).toMatchObject({ text: 'a & b', cubes: ['11'], loc: { file: 'door.lw', line: 10, column: 7 } });
    const idle = m.states[0];
    expect(idle).toMatchObject({ name: 'idle', code: '01', outputs: { lamp: 1 }, loc: { line: 12, column: 1 } });
    expect(idle.partLocs?.code).toEqual({ file: 'door.lw', line: 12, column: 29 });
    const [t0, t1] = idle.transitions;
    expect(t0).toMatchObject({ to: 'busy', outputs: { bell: 1, lamp: '-' }, loc: { line: 13, column: 3 } });
    expect(t0.when).toMatchObject({ text: 'a', cubes: ['1-'], loc: { line: 13, column: 8 } });
    expect(t0.partLocs?.to).toEqual({ file: 'door.lw', line: 13, column: 13 });
    expect(t0.partLocs?.['out:lamp']).toEqual({ file: 'door.lw', line: 13, column: 31 });
    expect(t1).toMatchObject({ to: 'idle', when: { text: '1', cubes: ['--'] } });
    expect(m.states[1]).toMatchObject({ name: 'busy', transitions: [] });
    expect(m.partLocs?.['input:1']).toEqual({ file: 'door.lw', line: 6, column: 11 });
    expect(m.partLocs?.['output:1']).toEqual({ file: 'door.lw', line: 7, column: 14 });
    expect(m.partLocs?.start).toEqual({ file: 'door.lw', line: 8, column: 7 });
  });

  it('prints the canonical layout', () => {
    expect(printTextMachine(parseTextMachine(TINY).machine!)).toBe(`# Door chime
#
#  indented note

machine door_chime
inputs a, b
outputs bell, lamp
start idle
unspecified dont-care
never a & b

state idle code 01 with lamp=1
  when a go busy with bell=1, lamp=-
  go idle

state busy
`);
  });

  it('does not reserve its keywords: an input may be called go, a state with', () => {
    const r = parseTextMachine(
      'machine m\ninputs go, stop\nstart with\nstate with\n  when go & !stop go with\n  when go go code\nstate code\n',
    );
    expect(r.diagnostics).toEqual([]);
    expect(r.machine!.states[0].transitions.map((t) => [t.when.cubes, t.to])).toEqual([
      [['10'], 'with'],
      [['1-'], 'code'],
    ]);
  });

  it('machines without inputs and with Windows line ends read the same', () => {
    const unix = 'machine spin\noutputs lamp\nstart a\nstate a with lamp=1\n  go b\nstate b\n  go a\n';
    const r = parseTextMachine(unix.replace(/\n/g, '\r\n'));
    expect(r.diagnostics).toEqual([]);
    expect(r.machine!.states[0].transitions[0].when.cubes).toEqual(['']);
    expect(machineToJson(r.machine!)).toEqual(machineToJson(parseTextMachine(unix).machine!));
  });

  // Each row: the text, the expected code, line and column.
  const head = 'machine m\ninputs a, b\noutputs z\nstart s\n';
  const errorKinds: [string, string, string, number, number][] = [
    ['unknown statement', head + 'stat s\n', 'LW101', 5, 1],
    ['a transition before any state', head + 'go s\n', 'LW101', 5, 1],
    ['a second start line', head + 'start t\n', 'LW101', 5, 1],
    ['junk after the target', head + 'state s\n  go s soon\n', 'LW101', 6, 8],
    ['guard without go', head + 'state s\n  when a s\n', 'LW101', 6, 10],
    ['with and no values', head + 'state s\n  go s with\n', 'LW101', 6, 12],
    ['guard syntax', head + 'state s\n  when a & | b go s\n', 'LW102', 6, 12],
    ['guard ends before go', head + 'state s\n  when a & go s\n', 'LW102', 6, 12],
    ['never syntax', head + 'never (a\n', 'LW102', 5, 9],
    ['unknown unspecified rule', head + 'unspecified keep\n', 'LW103', 5, 13],
    ['no machine line', 'inputs a\nstart s\nstate s\n', 'LW104', 1, 1],
    ['go without a state', head + 'state s\n  go\n', 'LW104', 6, 5],
    ['state without a name', head + 'state\n', 'LW104', 5, 6],
    ['code without digits', head + 'state s code\n', 'LW104', 5, 13],
    ['bad output value', head + 'state s with z=2\n', 'LW106', 5, 16],
    // One value per output and one `with` list per statement (docs/notation.md, Text form): a
    // second was read over the first without a word, and the build then showed the other value.
    ['two values for one output', head + 'state s with z=1, z=0\n', 'LW106', 5, 19],
    ['two values in a transition', head + 'state s\n  go s with z=1 z=-\n', 'LW106', 6, 17],
    ['a second with list on a state', head + 'state s with z=1 with z=0\n', 'LW101', 5, 18],
    ['a second with list after final', head + 'state s with z=1 final with z=0\n', 'LW101', 5, 24],
    ['a load without a unit', head + 'load z 300\n', 'LW107', 5, 8],
    ['a load in pounds', head + 'load z 2 lb\n', 'LW107', 5, 8],
    ['a load of nothing', head + 'load z 0 g\n', 'LW107', 5, 8],
    ['a load that is not a number', head + 'load z heavy g\n', 'LW107', 5, 8],
    ['a load without a mass', head + 'load z\n', 'LW107', 5, 7],
    ['two loads for one output', head + 'load z 1 g, z 2 g\n', 'LW107', 5, 13],
    ['load without an output', head + 'load\n', 'LW104', 5, 5],
    ['junk after a load', head + 'load z 3 g soon\n', 'LW101', 5, 12],
    ['unknown input', head + 'state s\n  when a & c go s\n', 'LW201', 6, 12],
    [
      'guard too large',
      `machine m\ninputs ${Array.from({ length: 30 }, (_, i) => `x${i}`).join(' ')}\nstart s\nstate s\n  when ${Array.from({ length: 30 }, (_, i) => `x${i}`).join(' ^ ')} go s\n`,
      'LW403',
      5,
      8,
    ],
  ];
  it('names what a stray word follows in plain words ("after the name", not "after the a name")', () => {
    const said = (text: string) => parseTextMachine(text, 'bad.lw').diagnostics.map((d) => d.message);
    expect(said('machine m soon\n')).toContain("unexpected 'soon' after the name");
    expect(said(head + 'unspecified hold soon\nstate s\n')).toContain("unexpected 'soon' after the rule");
    expect(said('machine m\nstart s soon\nstate s\n')).toContain("unexpected 'soon' after the state name");
  });

  it.each(errorKinds)('reports %s with file:line:column and a hint', (_name, text, code, line, column) => {
    const r = parseTextMachine(text, 'bad.lw');
    expect(r.machine).toBeUndefined();
    const d = r.diagnostics.find((x) => x.code === code);
    expect(d, r.diagnostics.map(formatDiagnostic).join('\n')).toBeDefined();
    expect(d!.location).toEqual({ file: 'bad.lw', line, column });
    expect(d!.hint).toBeTruthy();
    expect(formatDiagnostic(d!)).toMatch(new RegExp(`^bad\\.lw:${line}:${column}: error ${code}: `));
  });

  it('reads output loads with their unit (g or kg), several per line, and final states', () => {
    const src = head + 'load z 450 g\nstate s final with z=1\nstate t final code 1\n';
    const r = parseTextMachine(
      'machine m\ninputs a\noutputs gate, paddle, bell\nload gate 0.45 kg, paddle 300g\nload bell 120 g\nstart s\nstate s final with gate=1\n',
      'lock.lw',
    );
    expect(r.diagnostics).toEqual([]);
    expect(r.machine?.loadsG).toEqual({ gate: 450, paddle: 300, bell: 120 });
    expect(r.machine?.partLocs?.['load:bell']).toEqual({ file: 'lock.lw', line: 5, column: 6 });
    expect(r.machine?.states[0]).toMatchObject({ name: 's', final: true, outputs: { gate: 1 } });
    expect(printTextMachine(r.machine!)).toContain('load gate 450 g\nload paddle 300 g\nload bell 120 g\n');
    expect(printTextMachine(r.machine!)).toContain('state s final with gate=1\n');
    // final, code and with in any order; a state may even be called final.
    const q = parseTextMachine(src);
    expect(q.diagnostics).toEqual([]);
    expect(q.machine?.states.map((x) => [x.name, x.final, x.code])).toEqual([
      ['s', true, undefined],
      ['t', true, '1'],
    ]);
    expect(parseTextMachine(head + 'state final\n').machine?.states[0]).toMatchObject({ name: 'final' });
    expect(parseTextMachine(head + 'state final\n').machine?.states[0].final).toBeUndefined();
    // JSON form: the same loads in grams, and "final": true.
    const j = machineToJson(r.machine!);
    expect(j.loadsG).toEqual({ gate: 450, paddle: 300, bell: 120 });
    expect(j.states[0].final).toBe(true);
  });

  it('names the likely unit of a load given as a force', () => {
    const [d] = parseTextMachine(head + 'load z 3 N\n').diagnostics;
    expect(d.code).toBe('LW107');
    expect(d.hint).toContain('a force in newtons divided by 9.81 is a mass in kg');
  });

  it('gives a did-you-mean hint for misspelt statements', () => {
    const d = parseTextMachine('machine m\nstat s\n').diagnostics[0];
    expect(d.hint).toMatch(/did you mean 'sta(rt|te)'\?/);
  });

  it('round trip text → Machine → JSON → Machine → text is stable on generated machines (property)', () => {
    fc.assert(
      fc.property(jsonMachineArb, (j) => {
        const m0 = machineFromJson(j).machine!;
        const t1 = printTextMachine(m0);
        const r1 = parseTextMachine(t1, 'gen.lw');
        expect(r1.diagnostics, t1).toEqual([]);
        const json = JSON.parse(JSON.stringify(machineToJson(r1.machine!))) as unknown;
        expect(json).toEqual(machineToJson(m0));
        const t2 = printTextMachine(machineFromJson(json).machine!);
        expect(t2).toBe(t1);
      }),
      { seed: 42, numRuns: 300 },
    );
  });

  it('every example round-trips and keeps its header as the description', () => {
    const files = readdirSync('examples').filter((f) => f.endsWith('.lw'));
    expect(files.length).toBeGreaterThanOrEqual(5);
    for (const f of files) {
      const r = parseTextMachine(readFileSync(`examples/${f}`, 'utf8'), f);
      expect(r.diagnostics, f).toEqual([]);
      const m = r.machine!;
      expect(m.description, f).toMatch(/How a visitor operates it/);
      const t1 = printTextMachine(m);
      const back = machineFromJson(JSON.parse(JSON.stringify(machineToJson(m)))).machine!;
      expect(printTextMachine(back), f).toBe(t1);
      expect(printTextMachine(parseTextMachine(t1).machine!), f).toBe(t1);
    }
  });

  it('the worked example of docs/notation.md: its text and JSON blocks are the same machine', () => {
    const doc = readFileSync('docs/notation.md', 'utf8');
    const section = doc.slice(doc.indexOf('## Worked example'));
    const text = /```\n([\s\S]*?)```/.exec(section)![1];
    const json = /```json\n([\s\S]*?)```/.exec(section)![1];
    const fromText = parseTextMachine(text);
    expect(fromText.diagnostics).toEqual([]);
    expect(machineToJson(fromText.machine!)).toEqual(JSON.parse(json));
  });

  it('never throws on arbitrary text, and every diagnostic has a line and column (property)', () => {
    const token = fc.constantFrom(
      'machine',
      'inputs',
      'outputs',
      'start',
      'unspecified',
      'never',
      'state',
      'when',
      'go',
      'with',
      'code',
      'a',
      'b',
      's',
      'z',
      'a, b',
      'z=1',
      '=',
      ',',
      '-',
      '0',
      '1',
      '01',
      '&',
      '|',
      '^',
      '!',
      '(',
      ')',
      '#',
      'dont-care',
      'hold',
      '\n',
      '\n  ',
      ' ',
      '\t',
      '\r\n',
    );
    const check = (t: string): void => {
      const r = parseTextMachine(t, 'p.lw');
      expect(r.machine !== undefined || r.diagnostics.some((d) => d.severity === 'error')).toBe(true);
      for (const d of r.diagnostics) {
        expect(d.location.line).toBeGreaterThanOrEqual(1);
        expect(d.location.column).toBeGreaterThanOrEqual(1);
        expect(d.hint).toBeTruthy();
      }
    };
    fc.assert(fc.property(fc.string({ unit: 'binary', maxLength: 200 }), check), { seed: 42, numRuns: 500 });
    fc.assert(
      fc.property(
        fc.array(token, { maxLength: 40 }).map((x) => x.join(' ')),
        check,
      ),
      { seed: 42, numRuns: 1500 },
    );
    fc.assert(
      fc.property(jsonMachineArb, fc.nat(), fc.nat(), (j, cut, drop) => {
        const t = printTextMachine(machineFromJson(j).machine!);
        check(t.slice(0, cut % (t.length + 1)));
        check(t.slice(0, drop % (t.length + 1)) + t.slice((drop % (t.length + 1)) + 3));
      }),
      { seed: 42, numRuns: 300 },
    );
  });
});

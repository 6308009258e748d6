/**
 * Names that are keys of every JavaScript object (`__proto__`, `constructor`, `toString`, …):
 * a machine whose states, inputs and outputs are all such names must behave exactly as the
 * same machine with ordinary names. Each command runs on both; the JSON it prints and the
 * JSON and CSV documents it writes must be equal once the ordinary names are mapped back.
 * The list of names is the own properties of Object.prototype (ECMAScript 2024, §20.1.3,
 * plus the Annex B accessors), read from the running engine.
 */
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { expectNoStack, removeTempDirs, run, tempDir, type Run } from './support.js';

afterAll(removeTempDirs);

const PROTO_NAMES = Object.getOwnPropertyNames(Object.prototype).sort();

/** States, inputs and outputs all named by keys of Object.prototype. */
const PROTO_MACHINE = `# every name here is a key of every JavaScript object
machine constructor
inputs __proto__, toString, valueOf
outputs hasOwnProperty, isPrototypeOf, __defineGetter__
load isPrototypeOf 250 g
start constructor

state constructor code 000 with hasOwnProperty=1
  when __proto__ go toLocaleString with isPrototypeOf=1
  when toString go __lookupGetter__
state toLocaleString code 001 with __defineGetter__=1
  when valueOf go constructor
  go propertyIsEnumerable
state __lookupGetter__ code 011 with hasOwnProperty=1, isPrototypeOf=1
  when __proto__ & toString go toLocaleString
  go constructor
state propertyIsEnumerable code 010
  when !valueOf go __lookupSetter__
state __lookupSetter__ code 110 with hasOwnProperty=-
  go __defineSetter__
state __defineSetter__ code 111 with __defineGetter__=1
  when __proto__ ^ valueOf go constructor
`;

/** The same names with a suffix no other word in the outputs carries. */
const SUFFIX = 'Qz';
const WORD = new RegExp(`\\b(${PROTO_NAMES.map((n) => n.replace(/\$/g, '\\$')).join('|')})\\b`, 'g');
const forward = (s: string): string => s.replace(WORD, (n) => n + SUFFIX);
const PLAIN_MACHINE = PROTO_MACHINE.split('\n')
  .map((l) => (l.startsWith('#') ? l : forward(l)))
  .join('\n');
const back = (s: string): string => s.replace(new RegExp(`(\\w+)${SUFFIX}\\b`, 'g'), '$1');

// The build takes 60 bays, three drums of the longest the default profile allows; the frame here carries three.
const FRAME = ['--profile', 'frame.json'];
const FILES = {
  'proto.lw': PROTO_MACHINE,
  'plain.lw': PLAIN_MACHINE,
  'frame.json': '{ "frame": { "drumsPerFrame": 3 } }',
};
// Written as text: in an object literal `__proto__: 1` would set the prototype, not a key.
const SEQUENCE = '[{}, {"__proto__": 1}, {"valueOf": 1}, {}, {"toString": 1}, {"__proto__": 1, "valueOf": 1}, {}]';

/** Run a command on both machines ('FILE' in argv is replaced; names in argv and files are renamed for the plain one). */
async function both(argv: readonly string[], files: Record<string, string> = {}): Promise<[Run, Run]> {
  const proto = await run(
    argv.map((a) => (a === 'FILE' ? 'proto.lw' : a)),
    { ...FILES, ...files },
  );
  const plain = await run(
    argv.map((a) => (a === 'FILE' ? 'plain.lw' : a.startsWith('--') ? a : forward(a))),
    { ...FILES, ...Object.fromEntries(Object.entries(files).map(([k, v]) => [k, forward(v)])) },
  );
  return [proto, plain];
}

/** Same exit status and output; `table`: text tables compare with runs of spaces as one (the names differ in length). */
function expectSame([proto, plain]: [Run, Run], table = false): void {
  expectNoStack(proto);
  expect(proto.code).toBe(plain.code);
  const norm = (s: string): string => (table ? s.replace(/ +/g, ' ') : s);
  expect(norm(proto.out.replaceAll('proto.lw', 'FILE'))).toBe(norm(back(plain.out).replaceAll('plain.lw', 'FILE')));
}

describe('cli: names that are keys of Object.prototype', () => {
  it('the test machine uses every key of Object.prototype as a name', () => {
    for (const n of PROTO_NAMES) expect(PROTO_MACHINE).toMatch(new RegExp(`\\b${n}\\b`));
    expect(PLAIN_MACHINE).not.toMatch(WORD);
  });

  it('check --json and check report the same as with plain names', async () => {
    expectSame(await both(['check', 'FILE', '--json']));
    expectSame(await both(['check', 'FILE']), true);
  });

  for (const encoding of ['binary', 'gray', 'one-hot', 'pinned', 'auto']) {
    it(`build --json --encoding ${encoding} gives the same report`, async () => {
      const r = await both(['build', 'FILE', '--json', '--encoding', encoding, ...FRAME]);
      expect(r[0].code).toBe(0);
      expectSame(r);
    });
  }

  it('--unused naming a state called constructor, and an output called hasOwnProperty', async () => {
    const r = await both(['build', 'FILE', '--json', '--encoding', 'binary', '--unused', 'constructor', ...FRAME]);
    expect(r[0].code).toBe(0);
    expectSame(r);
    const bad = await both(['build', 'FILE', '--json', '--unused', 'hasOwnProperty']);
    expect(bad[0].code).toBe(2);
    expectSame(bad);
  });

  it('compare --json gives the same table', async () => {
    expectSame(await both(['compare', 'FILE', '--json']));
  });

  it('step --json and step give the same clocks', async () => {
    const r = await both(['step', 'FILE', '--inputs', 'seq.json', '--json', '--encoding', 'binary'], {
      'seq.json': SEQUENCE,
    });
    expect(r[0].code).toBe(0);
    expectSame(r);
    const abstract = await both(['step', 'FILE', '--inputs', 'seq.json', '--abstract', '--encoding', 'binary'], {
      'seq.json': SEQUENCE,
    });
    expectSame(abstract, true);
    expect(abstract[0].out).toMatch(/^2 +constructor +000 +__proto__=1 toString=0 valueOf=0 /m);
  });

  it('build --out writes the same JSON and CSV documents, and every document names the states', async () => {
    const dirs = [join(tempDir(), 'proto'), join(tempDir(), 'plain')];
    const [proto, plain] = await Promise.all([
      run(['build', 'proto.lw', '--encoding', 'binary', '--out', dirs[0], ...FRAME], FILES),
      run(['build', 'plain.lw', '--encoding', 'binary', '--out', dirs[1], ...FRAME], FILES),
    ]);
    expectNoStack(proto);
    expect(proto.code).toBe(0);
    expect(plain.code).toBe(0);
    const files = readdirSync(dirs[0]).sort();
    expect(files).toEqual(readdirSync(dirs[1]).sort());
    for (const f of files) {
      const a = readFileSync(join(dirs[0], f), 'utf8');
      const b = readFileSync(join(dirs[1], f), 'utf8');
      if (f.endsWith('.json') || f.endsWith('.csv')) expect(a, f).toBe(back(b));
      if (f === 'build-sheet.html' || f === 'state-diagram.svg') expect(a, f).toContain('propertyIsEnumerable');
    }
  });
});

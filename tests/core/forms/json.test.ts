import { readdirSync, readFileSync } from 'node:fs';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { machineFromJson, machineToJson, parseJsonMachine } from '../../../src/core/forms/json.js';
import { parseTextMachine } from '../../../src/core/forms/text.js';
import { jsonMachineArb } from './machine-arb.js';

const FIXTURES = 'tests/fixtures/lgsynth91';
const schema = JSON.parse(readFileSync('schemas/machine.schema.json', 'utf8')) as Schema;

/** A tiny checker for the JSON Schema keywords our schema uses (draft 2020-12 meaning). */
type Schema = { [k: string]: unknown };
function schemaErrors(value: unknown, s: Schema, path = '$', root: Schema = s): string[] {
  if (typeof s.$ref === 'string')
    return schemaErrors(value, (root.$defs as Record<string, Schema>)[s.$ref.replace('#/$defs/', '')], path, root);
  const errs: string[] = [];
  const isObj = typeof value === 'object' && value !== null && !Array.isArray(value);
  if (s.type === 'object' && !isObj) return [`${path}: not an object`];
  if (s.type === 'array' && !Array.isArray(value)) return [`${path}: not an array`];
  if (s.type === 'string' && typeof value !== 'string') return [`${path}: not a string`];
  if (Array.isArray(s.enum) && !s.enum.includes(value)) return [`${path}: not one of ${JSON.stringify(s.enum)}`];
  if (typeof value === 'string') {
    if (typeof s.pattern === 'string' && !new RegExp(s.pattern, 'u').test(value))
      errs.push(`${path}: does not match ${s.pattern}`);
    if (typeof s.minLength === 'number' && value.length < s.minLength) errs.push(`${path}: too short`);
  }
  if (Array.isArray(value)) {
    if (typeof s.maxItems === 'number' && value.length > s.maxItems) errs.push(`${path}: too many items`);
    if (s.uniqueItems === true && new Set(value.map((v) => JSON.stringify(v))).size !== value.length)
      errs.push(`${path}: repeated items`);
    if (s.items) value.forEach((v, i) => errs.push(...schemaErrors(v, s.items as Schema, `${path}[${i}]`, root)));
  }
  if (isObj) {
    const o = value as Record<string, unknown>;
    const props = (s.properties ?? {}) as Record<string, Schema>;
    for (const r of (s.required ?? []) as string[]) if (!(r in o)) errs.push(`${path}: missing ${r}`);
    for (const [k, v] of Object.entries(o)) {
      if (s.propertyNames) errs.push(...schemaErrors(k, s.propertyNames as Schema, `${path} key ${k}`, root));
      if (k in props) errs.push(...schemaErrors(v, props[k], `${path}.${k}`, root));
      else if (s.additionalProperties === false) errs.push(`${path}: unknown ${k}`);
      else if (typeof s.additionalProperties === 'object')
        errs.push(...schemaErrors(v, s.additionalProperties as Schema, `${path}.${k}`, root));
    }
  }
  return errs;
}

const tiny = (extra: object = {}, state: object = {}, transition: object = {}): string =>
  JSON.stringify({
    name: 'm',
    inputs: ['a'],
    outputs: ['z'],
    start: 's',
    states: [{ name: 's', transitions: [{ when: 'a', to: 's', ...transition }], ...state }],
    ...extra,
  });

describe('core/forms/json', () => {
  it('reads a tiny machine exactly, with JSON paths on every part', () => {
    const r = parseJsonMachine(
      '{"name":"m","inputs":["a","b"],"outputs":["z"],"start":"s","never":["a & b"],"states":[{"name":"s","code":"0","outputs":{"z":1},"transitions":[{"when":"a","to":"t","outputs":{"z":"-"}},{"to":"s"}]}]}',
      'm.json',
    );
    expect(r.diagnostics).toEqual([]);
    const m = r.machine!;
    expect(m).toMatchObject({ name: 'm', inputs: ['a', 'b'], outputs: ['z'], start: 's', unspecified: 'hold' });
    expect(m.never.map((g) => g.cubes)).toEqual([['11']]);
    expect(m.states[0]).toMatchObject({
      name: 's',
      code: '0',
      outputs: { z: 1 },
      loc: { file: 'm.json', path: '$.states[0]' },
    });
    const [t0, t1] = m.states[0].transitions;
    expect(t0.when).toMatchObject({ text: 'a', cubes: ['1-'], loc: { path: '$.states[0].transitions[0].when' } });
    expect(t0).toMatchObject({ to: 't', outputs: { z: '-' } });
    expect(t0.partLocs?.to).toEqual({ file: 'm.json', path: '$.states[0].transitions[0].to' });
    expect(t0.partLocs?.['out:z']).toEqual({ file: 'm.json', path: '$.states[0].transitions[0].outputs.z' });
    expect(t1.when.cubes).toEqual(['--']);
    expect(t1.when.text).toBe('1');
  });

  it('writes the canonical JSON: `when` omitted for the constant 1, empty maps omitted', () => {
    const m = parseJsonMachine(
      tiny({ unspecified: 'dont-care' }, { outputs: {} }, { when: '1', outputs: {} }),
    ).machine!;
    expect(machineToJson(m)).toEqual({
      name: 'm',
      inputs: ['a'],
      outputs: ['z'],
      start: 's',
      unspecified: 'dont-care',
      states: [{ name: 's', transitions: [{ to: 's' }] }],
    });
    const g = parseJsonMachine(tiny({}, {}, { when: '(a)' })).machine!;
    expect(machineToJson(g).states[0].transitions[0]).toEqual({ when: 'a', to: 's' });
  });

  // Each row: the input, the expected code, the expected location, and (for a JSON path) what the
  // text holds at the line and column given: the value the path names, or the object that lacks it.
  const errorKinds: [string, string, string, object, string?][] = [
    ['syntax: missing value', '{"name": }', 'LW100', { line: 1, column: 10 }],
    ['syntax: bad literal on line 3', '{\n  "name": "m",\n  "inputs": tru\n}', 'LW100', { line: 3, column: 13 }],
    ['syntax: empty file', '', 'LW100', { line: 1, column: 1 }],
    ['syntax: unclosed string', '{"name": "m', 'LW100', { line: 1, column: 10 }],
    ['not an object', '[1, 2]', 'LW100', { path: '$' }, '[1, 2]'],
    ['guard syntax', tiny({}, {}, { when: 'a &' }), 'LW102', { path: '$.states[0].transitions[0].when' }, '"a &"'],
    ['wrong type', tiny({ inputs: 'a' }), 'LW103', { path: '$.inputs' }, '"a"'],
    ['bad unspecified', tiny({ unspecified: 'keep' }), 'LW103', { path: '$.unspecified' }, '"keep"'],
    ['wrong type of code', tiny({}, { code: 1 }), 'LW103', { path: '$.states[0].code' }, '1}'],
    [
      'missing states',
      JSON.stringify({ name: 'm', inputs: [], outputs: [], start: 's' }),
      'LW104',
      { path: '$' },
      '{"name"',
    ],
    ['missing to', tiny({}, {}, { to: undefined }), 'LW104', { path: '$.states[0].transitions[0]' }, '{"when":"a"}'],
    ['missing transitions', tiny({}, { transitions: undefined }), 'LW104', { path: '$.states[0]' }, '{"name":"s"}'],
    ['unknown field', tiny({ start_state: 's' }), 'LW105', { path: '$.start_state' }, '"s"}'],
    ['bad output value', tiny({}, { outputs: { z: 2 } }), 'LW106', { path: '$.states[0].outputs.z' }, '2}'],
    ['unknown input', tiny({ never: ['b'] }), 'LW201', { path: '$.never[0]' }, '"b"]'],
    [
      'guard too large',
      JSON.stringify({
        name: 'm',
        inputs: Array.from({ length: 30 }, (_, i) => `x${i}`),
        outputs: [],
        start: 's',
        states: [
          { name: 's', transitions: [{ when: Array.from({ length: 30 }, (_, i) => `x${i}`).join(' ^ '), to: 's' }] },
        ],
      }),
      'LW403',
      { path: '$.states[0].transitions[0].when' },
      '"x0 ^ x1',
    ],
  ];
  it.each(errorKinds)('reports %s', (_name, text, code, location, there) => {
    const r = parseJsonMachine(text, 'f.json');
    const d = r.diagnostics.find((x) => x.code === code);
    expect(d, JSON.stringify(r.diagnostics)).toBeDefined();
    const { line, column } = d!.location;
    expect(d!.location).toEqual({ file: 'f.json', ...location, line, column });
    expect(line).toBeGreaterThan(0);
    if (there !== undefined)
      expect(
        text
          .split('\n')
          [line! - 1].slice(column! - 1)
          .startsWith(there),
        there,
      ).toBe(true);
    expect(d!.hint).toBeTruthy();
    if (d!.severity === 'error') expect(r.machine).toBeUndefined();
  });

  it('gives line and column on a file of many lines, and skips a byte order mark', () => {
    const text =
      '\ufeff{\n  "name": "m",\n  "inputs": ["a"],\n  "outputs": [],\n  "start": "s",\n  "states": [\n    { "name": "s", "transitions": [ { "when": "a |", "to": "s" } ] }\n  ]\n}\n';
    const r = parseJsonMachine(text, 'f.json');
    expect(r.diagnostics.map((d) => d.location)).toEqual([
      { file: 'f.json', path: '$.states[0].transitions[0].when', line: 7, column: 47 },
    ]);
    expect(parseJsonMachine(text.replace('a |', 'a')).diagnostics).toEqual([]);
  });

  it('refuses a number too large to hold (1e309 reads as infinity) as LW108 at its line and column', () => {
    const r = parseJsonMachine('{"name": "m",\n "states": [{"name": "s", "code": 1e309}]}', 'f.json');
    expect(r.machine).toBeUndefined();
    expect(r.diagnostics).toEqual([
      expect.objectContaining({
        code: 'LW108',
        location: { file: 'f.json', line: 2, column: 35, path: '$.states[0].code' },
      }),
    ]);
    expect(r.diagnostics[0].message).toContain('1e309');
    // Large but finite numbers and tiny ones are ordinary values (reported, if at all, for their type).
    expect(parseJsonMachine('{"name": 1e308}').diagnostics.map((d) => d.code)).not.toContain('LW108');
    expect(parseJsonMachine('{"name": 1e-400}').diagnostics.map((d) => d.code)).not.toContain('LW108');
  });

  it('reads loadsG (grams above 0) and final, naming a bad load by its path (LW107)', () => {
    const r = parseJsonMachine(tiny({ loadsG: { z: 300 } }, { final: true }), 'm.json');
    expect(r.diagnostics).toEqual([]);
    expect(r.machine?.loadsG).toEqual({ z: 300 });
    expect(r.machine?.partLocs?.['load:z']).toEqual({ file: 'm.json', path: '$.loadsG.z' });
    expect(r.machine?.states[0].final).toBe(true);
    expect(machineToJson(r.machine!)).toMatchObject({ loadsG: { z: 300 }, states: [{ final: true }] });
    const bad = parseJsonMachine(tiny({ loadsG: { z: '300 g', y: -1, w: 0 } }), 'm.json');
    expect(bad.machine).toBeUndefined();
    expect(bad.diagnostics.map((d) => [d.code, d.location.path])).toEqual([
      ['LW107', '$.loadsG.z'],
      ['LW107', '$.loadsG.y'],
      ['LW107', '$.loadsG.w'],
    ]);
    expect(bad.diagnostics[0].hint).toBe('write the grams as a number: "z": 300');
    expect(parseJsonMachine(tiny({ loadsG: [300] })).diagnostics[0]).toMatchObject({
      code: 'LW103',
      location: { path: '$.loadsG' },
    });
    expect(parseJsonMachine(tiny({}, { final: 'yes' })).diagnostics[0]).toMatchObject({ code: 'LW103' });
  });

  it('still gives a machine when only warnings were found', () => {
    const r = parseJsonMachine(tiny({ colour: 'red' }));
    expect(r.diagnostics.map((d) => d.code)).toEqual(['LW105']);
    expect(r.machine).toBeDefined();
  });

  it('leaves references to the validate phase (unknown target and start still parse)', () => {
    const r = parseJsonMachine(tiny({ start: 'nowhere' }, {}, { to: 'elsewhere' }));
    expect(r.diagnostics).toEqual([]);
    expect(r.machine!.start).toBe('nowhere');
  });

  it('keeps odd keys as plain data (no prototype surprises)', () => {
    const text = tiny({ outputs: ['constructor'] }, { outputs: { constructor: 1, proto_: 0 } }).replace(
      '"proto_"',
      '"__proto__"',
    );
    const r = parseJsonMachine(text);
    const m = r.machine!;
    expect(Object.keys(m.states[0].outputs)).toEqual(['constructor', '__proto__']);
    expect(m.states[0].transitions[0].outputs.constructor).toBeUndefined();
  });

  it("reads every LGSynth'91 fixture (MCNC benchmark set, tests/fixtures/lgsynth91/PROVENANCE.md) without diagnostics and round-trips it", () => {
    for (const f of readdirSync(FIXTURES).filter((x) => x.endsWith('.json'))) {
      const text = readFileSync(`${FIXTURES}/${f}`, 'utf8');
      const r = parseJsonMachine(text, f);
      expect(r.diagnostics, f).toEqual([]);
      const out = machineToJson(r.machine!);
      expect(machineToJson(machineFromJson(out).machine!), f).toEqual(out);
      // The fixtures are written canonically apart from key order and spacing.
      const raw = JSON.parse(text) as { states: { transitions: object[] }[] };
      expect(
        out.states.map((s) => s.transitions.length),
        f,
      ).toEqual(raw.states.map((s) => s.transitions.length));
    }
  });

  it('the schema (JSON Schema 2020-12) accepts every fixture and every example, and rejects malformed machines', () => {
    expect(schema.$schema).toBe('https://json-schema.org/draft/2020-12/schema');
    for (const f of readdirSync(FIXTURES).filter((x) => x.endsWith('.json'))) {
      expect(schemaErrors(JSON.parse(readFileSync(`${FIXTURES}/${f}`, 'utf8')), schema), f).toEqual([]);
    }
    for (const f of readdirSync('examples').filter((x) => x.endsWith('.lw'))) {
      const m = parseTextMachine(readFileSync(`examples/${f}`, 'utf8'), f).machine!;
      expect(schemaErrors(machineToJson(m), schema), f).toEqual([]);
    }
    expect(schemaErrors(JSON.parse(tiny({ unspecified: 'keep' })), schema)).toEqual([
      '$.unspecified: not one of ["hold","dont-care"]',
    ]);
    expect(schemaErrors(JSON.parse(tiny({}, { outputs: { z: 2 } })), schema)).toHaveLength(1);
    expect(schemaErrors(JSON.parse(tiny({ name: undefined })), schema)).toEqual(['$: missing name']);
    expect(schemaErrors(JSON.parse(tiny({}, { colour: 1 })), schema)).toEqual(['$.states[0]: unknown colour']);
  });

  it('canonical JSON of generated machines passes the schema and is a fixed point (property)', () => {
    fc.assert(
      fc.property(jsonMachineArb, (j) => {
        const r = machineFromJson(j);
        expect(r.diagnostics).toEqual([]);
        const out = machineToJson(r.machine!);
        expect(schemaErrors(out, schema)).toEqual([]);
        expect(machineToJson(parseJsonMachine(JSON.stringify(out)).machine!)).toEqual(out);
      }),
      { seed: 42, numRuns: 200 },
    );
  });

  it('never throws: any JSON value, any value at all, any text (property)', () => {
    const check = (r: ReturnType<typeof machineFromJson>): void => {
      expect(r.machine !== undefined || r.diagnostics.some((d) => d.severity === 'error')).toBe(true);
      for (const d of r.diagnostics) expect(d.location.path ?? d.location.line).toBeDefined();
    };
    fc.assert(
      fc.property(fc.jsonValue(), (v) => check(machineFromJson(v))),
      { seed: 42, numRuns: 500 },
    );
    fc.assert(
      fc.property(fc.anything(), (v) => check(machineFromJson(v))),
      { seed: 42, numRuns: 500 },
    );
    fc.assert(
      fc.property(fc.string(), (t) => check(parseJsonMachine(t))),
      { seed: 42, numRuns: 500 },
    );
    // Near-misses: a valid machine with one field replaced by anything.
    const keys = ['name', 'inputs', 'outputs', 'start', 'unspecified', 'never', 'states', 'extra'];
    fc.assert(
      fc.property(jsonMachineArb, fc.constantFrom(...keys), fc.jsonValue(), fc.nat(), (j, k, v, pick) => {
        const m = JSON.parse(JSON.stringify(j)) as Record<string, unknown> & { states: Record<string, unknown>[] };
        if (pick % 2 === 0) m[k] = v;
        else {
          const s = m.states[pick % m.states.length];
          const ts = s.transitions as Record<string, unknown>[];
          if (pick % 3 === 0 && ts.length) ts[pick % ts.length][['when', 'to', 'outputs'][pick % 3]] = v;
          else s[['name', 'code', 'outputs', 'transitions'][pick % 4]] = v;
        }
        check(machineFromJson(m));
        check(parseJsonMachine(JSON.stringify(m).slice(0, 1 + (pick % 200))));
      }),
      { seed: 42, numRuns: 500 },
    );
  });
});

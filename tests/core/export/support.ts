/**
 * Helpers for the export tests: the examples built through the pipeline, a strict XML
 * well-formedness checker (for the SVG and the HTML, which is written as well-formed XML),
 * a small JSON Schema (2020-12) validator for the subset the netlist schema uses, a
 * machine whose names hold quotes, `<`, `&` and formula characters, and drawings held to
 * their stored digests.
 */
import { createHash } from 'node:crypto';
import { existsSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { expect } from 'vitest';
import { analyse, buildMachine, type Built } from '../../../src/core/pipeline.js';
import type { FlatMachine } from '../../../src/core/model/flat.js';

const EXAMPLES = new URL('../../../examples/', import.meta.url);

/** File names of the example machines. */
export const exampleNames = (): string[] =>
  readdirSync(EXAMPLES)
    .filter((f) => f.endsWith('.lw'))
    .sort();

const built = new Map<string, Built>();

/**
 * An example built through the whole pipeline, checks included, cached per test file. Binary
 * codes by default, because the automatic encoding search takes most of a build's time; the
 * documents test builds with the default ('auto') as the CLI does.
 */
export function example(name: string, encoding: 'binary' | 'auto' = 'binary'): Built {
  let b = built.get(`${name}/${encoding}`);
  if (!b) {
    const a = analyse(readFileSync(new URL(name, EXAMPLES), 'utf8'), name);
    if (!a.ok) throw new Error(`${name}: ${a.diagnostics.map((d) => d.message).join('; ')}`);
    const r = buildMachine(a, { encoding });
    if (!r.ok) throw new Error(`${name}: ${r.diagnostics.map((d) => d.message).join('; ')}`);
    built.set(`${name}/${encoding}`, (b = r));
  }
  return b;
}

/** An example's minimised flat machine (parse, validate and minimise only: the machine a build is made from). */
export function minimisedExample(name: string): FlatMachine {
  const a = analyse(readFileSync(new URL(name, EXAMPLES), 'utf8'), name);
  if (!a.ok) throw new Error(`${name}: ${a.diagnostics.map((d) => d.message).join('; ')}`);
  return a.minimised.machine;
}

const NAME = /^[A-Za-z_:][A-Za-z0-9_.:-]*$/;
const ENTITY = /^&(?:amp|lt|gt|quot|apos|#[0-9]+|#x[0-9a-fA-F]+);/;

/**
 * Problems with the well-formedness of an XML text (empty when well-formed), after the rules
 * of W3C XML 1.0 (5th ed.) §2.1, §3.1: one root element, every start tag closed by a matching
 * end tag in order, attribute values quoted and not repeated, `<` never and `&` only as an
 * entity reference in text and attributes. A leading `<!DOCTYPE …>` and `<?xml …?>` are allowed.
 */
export function xmlProblems(text: string): string[] {
  const out: string[] = [];
  const stack: string[] = [];
  let roots = 0;
  let i = 0;
  const textCheck = (s: string, where: number): void => {
    for (let k = s.indexOf('&'); k >= 0; k = s.indexOf('&', k + 1))
      if (!ENTITY.test(s.slice(k))) out.push(`bad & at ${where + k}`);
    if (s.includes('>') && stack.length === 0 && s.trim() !== '') out.push(`text outside the root at ${where}`);
  };
  while (i < text.length) {
    const lt = text.indexOf('<', i);
    const chunk = lt < 0 ? text.slice(i) : text.slice(i, lt);
    textCheck(chunk, i);
    if (stack.length === 0 && chunk.trim() !== '') out.push(`text outside the root at ${i}`);
    if (lt < 0) break;
    if (text.startsWith('<!--', lt)) {
      const end = text.indexOf('-->', lt + 4);
      if (end < 0) return [...out, 'unclosed comment'];
      i = end + 3;
      continue;
    }
    if (text.startsWith('<?', lt)) {
      const end = text.indexOf('?>', lt);
      if (end < 0) return [...out, 'unclosed declaration'];
      i = end + 2;
      continue;
    }
    if (text.startsWith('<!DOCTYPE', lt)) {
      if (roots > 0 || stack.length > 0) out.push('DOCTYPE after the root');
      i = text.indexOf('>', lt) + 1;
      continue;
    }
    // A tag: scan to its end, respecting quoted attribute values.
    let j = lt + 1;
    let quote = '';
    for (; j < text.length; j++) {
      const c = text[j];
      if (quote) {
        if (c === quote) quote = '';
        else if (c === '<') out.push(`< inside an attribute at ${j}`);
      } else if (c === '"' || c === "'") quote = c;
      else if (c === '>') break;
      else if (c === '<') out.push(`< inside a tag at ${j}`);
    }
    const tag = text.slice(lt + 1, j);
    i = j + 1;
    if (tag.startsWith('/')) {
      const name = tag.slice(1).trim();
      const open = stack.pop();
      if (open !== name) out.push(`</${name}> closes <${open ?? 'nothing'}> at ${lt}`);
      continue;
    }
    const selfClosing = tag.endsWith('/');
    const body = selfClosing ? tag.slice(0, -1) : tag;
    const m = /^([^\s]+)([\s\S]*)$/.exec(body);
    if (!m || !NAME.test(m[1])) {
      out.push(`bad tag <${tag.slice(0, 20)}> at ${lt}`);
      continue;
    }
    const attrs = m[2];
    const seen = new Set<string>();
    const rest = attrs.replace(
      /\s*([A-Za-z_:][A-Za-z0-9_.:-]*)\s*=\s*("[^"]*"|'[^']*')/g,
      (_all, name: string, value: string) => {
        if (seen.has(name)) out.push(`repeated attribute ${name} at ${lt}`);
        seen.add(name);
        textCheck(value, lt);
        return '';
      },
    );
    if (rest.trim() !== '') out.push(`bad attributes '${rest.trim().slice(0, 30)}' at ${lt}`);
    if (stack.length === 0) roots++;
    if (!selfClosing) stack.push(m[1]);
  }
  if (stack.length > 0) out.push(`unclosed <${stack.join('> <')}>`);
  if (roots !== 1) out.push(`${roots} root elements`);
  return out;
}

/** The subset of JSON Schema 2020-12 the netlist schema uses. */
export interface Schema {
  readonly $ref?: string;
  readonly type?: string;
  readonly const?: unknown;
  readonly enum?: readonly unknown[];
  readonly required?: readonly string[];
  readonly properties?: Readonly<Record<string, Schema>>;
  readonly additionalProperties?: boolean | Schema;
  readonly items?: Schema;
  readonly minItems?: number;
  readonly oneOf?: readonly Schema[];
  readonly minimum?: number;
  readonly minLength?: number;
  readonly pattern?: string;
  readonly $defs?: Readonly<Record<string, Schema>>;
}

/**
 * Validate `value` against `schema` (JSON Schema 2020-12 validation vocabulary, the keywords
 * listed in Schema; `$ref` to `#/$defs/…` only). Returns the problems, with JSON paths.
 */
export function schemaProblems(schema: Schema, value: unknown, root: Schema = schema, path = '$'): string[] {
  if (schema.$ref) {
    const name = schema.$ref.replace('#/$defs/', '');
    const target = root.$defs?.[name];
    if (!target) return [`${path}: unknown $ref ${schema.$ref}`];
    return schemaProblems(target, value, root, path);
  }
  const out: string[] = [];
  const t = schema.type;
  const typeOk =
    t === undefined ||
    (t === 'object' && typeof value === 'object' && value !== null && !Array.isArray(value)) ||
    (t === 'array' && Array.isArray(value)) ||
    (t === 'string' && typeof value === 'string') ||
    (t === 'integer' && Number.isInteger(value)) ||
    (t === 'number' && typeof value === 'number') ||
    (t === 'boolean' && typeof value === 'boolean');
  if (!typeOk) return [`${path}: not of type ${t}`];
  if ('const' in schema && JSON.stringify(schema.const) !== JSON.stringify(value))
    out.push(`${path}: not ${JSON.stringify(schema.const)}`);
  if (schema.enum && !schema.enum.some((e) => JSON.stringify(e) === JSON.stringify(value)))
    out.push(`${path}: ${JSON.stringify(value)} not in enum`);
  if (typeof value === 'string') {
    if (schema.minLength !== undefined && value.length < schema.minLength)
      out.push(`${path}: shorter than ${schema.minLength}`);
    if (schema.pattern !== undefined && !new RegExp(schema.pattern, 'u').test(value))
      out.push(`${path}: does not match ${schema.pattern}`);
  }
  if (typeof value === 'number' && schema.minimum !== undefined && value < schema.minimum)
    out.push(`${path}: below ${schema.minimum}`);
  if (Array.isArray(value)) {
    if (schema.minItems !== undefined && value.length < schema.minItems)
      out.push(`${path}: fewer than ${schema.minItems} items`);
    if (schema.items)
      value.forEach((v, k) => out.push(...schemaProblems(schema.items as Schema, v, root, `${path}[${k}]`)));
  }
  if (typeof value === 'object' && value !== null && !Array.isArray(value)) {
    const obj = value as Record<string, unknown>;
    for (const r of schema.required ?? []) if (!(r in obj)) out.push(`${path}: missing ${r}`);
    for (const [k, v] of Object.entries(obj)) {
      const sub = schema.properties?.[k];
      if (sub) out.push(...schemaProblems(sub, v, root, `${path}.${k}`));
      else if (schema.additionalProperties === false) out.push(`${path}: unexpected ${k}`);
      else if (typeof schema.additionalProperties === 'object')
        out.push(...schemaProblems(schema.additionalProperties, v, root, `${path}.${k}`));
    }
  }
  if (schema.oneOf) {
    const passing = schema.oneOf.filter((s) => schemaProblems(s, value, root, path).length === 0).length;
    if (passing !== 1) out.push(`${path}: matches ${passing} of the oneOf alternatives`);
  }
  return out;
}

/** Names with quotes, `<`, `&` and spreadsheet formula characters (invented for the escaping tests). */
export const EVIL = {
  machine: `bell "<&>" =cmd`,
  input: `=cmd|"x"`,
  output: `<b>&amp;'`,
  state: `+rung<script>`,
} as const;

/**
 * The marble bell build with its machine name, input, output and one state renamed to EVIL
 * names everywhere (machine, netlist ids and names, signal map, equations' variables, and the
 * placement's part ids and routes): the build and its placement are serialised, the names are
 * replaced, and they are read back, so they stay consistent.
 */
export function evilBuild(): Built {
  const b = example('marble-bell.lw');
  const json = JSON.stringify({ build: b.build, placement: b.placement })
    .replaceAll('marble_bell', '\u0001')
    .replaceAll('marble', JSON.stringify(EVIL.input).slice(1, -1))
    .replaceAll('bell', JSON.stringify(EVIL.output).slice(1, -1))
    .replaceAll('"rung"', JSON.stringify(EVIL.state))
    .replaceAll('\u0001', JSON.stringify(EVIL.machine).slice(1, -1));
  const { build, placement } = JSON.parse(json) as Pick<Built, 'build' | 'placement'>;
  return { ...b, build, placement };
}

/**
 * Each drawing's SHA-256 digest equals the one stored at `path` (a JSON object by name), so a
 * drawing that changes at all fails; `LW_UPDATE_EXPECTED=1` rewrites the file, to be reviewed.
 */
export function expectStoredDigests(path: string, drawings: Readonly<Record<string, string>>): void {
  const digests = Object.fromEntries(
    Object.entries(drawings).map(([name, svg]) => [name, createHash('sha256').update(svg).digest('hex')]),
  );
  if (process.env.LW_UPDATE_EXPECTED === '1') writeFileSync(path, JSON.stringify(digests, null, 2) + '\n');
  expect(existsSync(path), `${path} is missing`).toBe(true);
  expect(digests).toEqual(JSON.parse(readFileSync(path, 'utf8')));
}

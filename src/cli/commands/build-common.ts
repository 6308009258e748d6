/** Loading a machine and a profile, and building it, for the commands that build. */
import {
  analyse,
  buildMachine,
  type BuildOptions,
  type Built,
  DEFAULT_ENCODING,
  DEFAULT_PROFILE,
  diag,
  DOCUMENT_UNITS,
  documentUnitsGuess,
  type DocumentUnits,
  type Diagnostic,
  didYouMean,
  encodingEntry,
  ENCODINGS,
  type EncodeStrategy,
  hasErrors,
  loadProfile,
  type Pin,
  type Profile,
} from '../../core/index.js';
import type { ParsedArgs } from '../args.js';
import { loadSource, readJsonArg, type RunContext } from './common.js';
import { progressLine } from '../progress.js';
import { searchOnThreads } from '../search-pool.js';

/**
 * The profile named by --profile, over the defaults, with --shop-units over its `documentUnits`
 * for this one run; or the diagnostics of why it cannot be used.
 */
export function profileFrom(
  args: ParsedArgs,
  ctx: RunContext,
): { profile: Profile; diagnostics: Diagnostic[] } | { error: readonly Diagnostic[] } {
  const units = shopUnitsFrom(args);
  if (typeof units === 'object') return { error: [units] };
  const file = args.flags.profile;
  const read = typeof file === 'string' ? profileFile(file, ctx) : { profile: DEFAULT_PROFILE, diagnostics: [] };
  if ('error' in read || units === undefined) return read;
  return { profile: { ...read.profile, documentUnits: units }, diagnostics: read.diagnostics };
}

function profileFile(
  file: string,
  ctx: RunContext,
): { profile: Profile; diagnostics: Diagnostic[] } | { error: readonly Diagnostic[] } {
  const r = readJsonArg(file, ctx, 'the profile');
  if (!r.ok) return { error: r.diagnostics };
  const p = loadProfile(r.value, file);
  if (!p.profile || hasErrors(p.diagnostics)) return { error: p.diagnostics };
  return { profile: p.profile, diagnostics: p.diagnostics };
}

/** The --shop-units option: undefined when absent, else one of DOCUMENT_UNITS, or LW700 with a did-you-mean hint. */
export function shopUnitsFrom(args: ParsedArgs): DocumentUnits | undefined | Diagnostic {
  const raw = args.flags['shop-units'];
  if (raw === undefined) return undefined;
  const name = String(raw);
  const known = DOCUMENT_UNITS.find((u) => u === name);
  if (known) return known;
  const guess = didYouMean(name, DOCUMENT_UNITS) ?? documentUnitsGuess(name);
  return diag(
    'LW700',
    `--shop-units ${name} is not a system of units the documents know${guess ? ` — did you mean '${guess}'?` : ''}`,
    { path: '--shop-units' },
    `choose ${DOCUMENT_UNITS.join(' or ')}: the units the documents and the report show lengths, masses and torques in (the profile's documentUnits)`,
  );
}

export type BuildAttempt =
  | { readonly ok: true; readonly built: Built; readonly file: string; readonly diagnostics: readonly Diagnostic[] }
  | { readonly ok: false; readonly diagnostics: readonly Diagnostic[]; readonly file?: string };

/**
 * Read, analyse and build the machine the command line names. The encoding search runs on the
 * io's threads (search-pool.ts); long phases show on the io's progress line.
 */
export async function buildFromArgs(
  args: ParsedArgs,
  ctx: RunContext,
  extra: Partial<BuildOptions> = {},
): Promise<BuildAttempt> {
  const io = ctx.io;
  const src = loadSource(args, ctx);
  if (!src.ok) return { ok: false, diagnostics: src.diagnostics };
  const prof = profileFrom(args, ctx);
  if ('error' in prof) return { ok: false, diagnostics: prof.error, file: src.file };
  const seed = seedFrom(args);
  if (typeof seed === 'object') return { ok: false, file: src.file, diagnostics: [seed] };
  const encoding = encodingFrom(args);
  if (typeof encoding === 'object') return { ok: false, file: src.file, diagnostics: [encoding] };
  const pinned = pinsFrom(args);
  if ('error' in pinned) return { ok: false, file: src.file, diagnostics: [pinned.error] };
  const line = io.progress ? progressLine(io.progress) : undefined;
  const onPhaseStart = line?.phase;
  const a = analyse(src.text, src.file, onPhaseStart ? { onPhaseStart } : {});
  if (!a.ok) {
    line?.done();
    return { ok: false, diagnostics: a.diagnostics, file: src.file };
  }
  const opts: BuildOptions = {
    encoding,
    profile: prof.profile,
    seed,
    unusedCodes: typeof args.flags.unused === 'string' ? args.flags.unused : undefined,
    pins: pinned.pins,
    ...extra,
  };
  let b;
  try {
    line?.phase('encode');
    const searched = await searchOnThreads(a, opts, io.threads ?? 1, line?.search);
    b = buildMachine(a, { ...opts, ...(searched ? { searched } : {}), ...(onPhaseStart ? { onPhaseStart } : {}) });
  } finally {
    line?.done();
  }
  if (!b.ok) return { ok: false, diagnostics: [...prof.diagnostics, ...b.diagnostics], file: src.file };
  return { ok: true, built: b, file: src.file, diagnostics: [...prof.diagnostics, ...b.diagnostics] };
}

/**
 * The --pin options: `PART=BAY` or `PART=BAY@DRUM`, repeated or joined with commas, as pins by
 * part id; LW700 for one that is not written so. Whether the part and bay exist is the place
 * phase's to say (LW707, LW708).
 */
export function pinsFrom(args: ParsedArgs): { pins: Record<string, Pin> } | { error: Diagnostic } {
  // Entries, then Object.fromEntries: a part named like an Object property stays a plain key.
  const pins: [string, Pin][] = [];
  for (const raw of (args.lists.pin ?? []).flatMap((v) => v.split(','))) {
    const text = raw.trim();
    if (text === '') continue;
    const m = /^(.+?)=(\d+)(?:@(\d+))?$/.exec(text);
    if (!m)
      return {
        error: diag(
          'LW700',
          `--pin ${text} is not PART=BAY or PART=BAY@DRUM`,
          { path: '--pin' },
          'write the part id, =, and the bay counted from 1 at the visitor end, e.g. --pin rst=22 or --pin m0=5@2',
        ),
      };
    pins.push([m[1].trim(), m[3] === undefined ? { bay: Number(m[2]) } : { bay: Number(m[2]), drum: Number(m[3]) }]);
  }
  return { pins: Object.fromEntries(pins) };
}

/** The --seed option: undefined when absent, else a whole number ≥ 0, or LW700. */
export function seedFrom(args: ParsedArgs): number | undefined | Diagnostic {
  const raw = args.flags.seed;
  if (raw === undefined) return undefined;
  const seed = typeof raw === 'string' && /^\s*\d+\s*$/.test(raw) ? Number(raw) : NaN;
  if (Number.isSafeInteger(seed)) return seed;
  return diag(
    'LW700',
    `--seed ${String(raw)} is not a whole number ≥ 0`,
    { path: '--seed' },
    'give a seed such as 1 or 42',
  );
}

/** The --encoding option (default DEFAULT_ENCODING), or LW700 naming the encodings of the registry. */
export function encodingFrom(args: ParsedArgs): EncodeStrategy | Diagnostic {
  const raw = args.flags.encoding;
  if (raw === undefined) return DEFAULT_ENCODING;
  const name = String(raw);
  const known = encodingEntry(name);
  if (known) return known.name;
  const guess = didYouMean(name, ENCODINGS);
  return diag(
    'LW700',
    `unknown encoding '${name}'${guess ? ` — did you mean '${guess}'?` : ''}`,
    { path: '--encoding' },
    `choose one of ${ENCODINGS.join(', ')}`,
  );
}

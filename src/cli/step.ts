/**
 * The terminal stepper behind `latchwright step`: scripted (one row per clock, as a table or
 * JSON) or interactive (one keypress per hand action, the screen redrawn after each). The
 * behaviour lives in src/core/sim (runner, script); this file only reads keys and draws.
 */
import {
  assignmentOf,
  type Build,
  createRunner,
  DEFAULT_PROFILE,
  diag,
  type Diagnostic,
  formatDiagnostic,
  type HandAction,
  type PartRunner,
  type Profile,
  runAbstractScript,
  runPartScript,
  type SeqArray,
  type SpecInfo,
  stepAbstract,
  type StepRow,
  timingOf,
  validateSequence,
} from '../core/index.js';
import { EXIT } from './exit.js';

export type { SeqArray, ShownValue, StepRow } from '../core/index.js';

export interface StepOptions {
  /** The parsed sequence file (scripted mode); absent: interactive. */
  readonly inputsFile?: SeqArray;
  /** Its path, for the location of problems in it. */
  readonly inputsPath?: string;
  readonly json: boolean;
  /** Step the minimised machine itself instead of the parts. */
  readonly abstract: boolean;
  /** Stage delays come from here (default: the shipped profile). */
  readonly profile?: Pick<Profile, 'stageDelayS'>;
}

export interface StepIo {
  readonly write: (s: string) => void;
  /** Where problems go as text (default: write), when there is no `fail`. */
  readonly error?: (s: string) => void;
  /** Stop with these diagnostics (the command reports them, as text or JSON). */
  readonly fail?: (ds: readonly Diagnostic[]) => void;
  /** Keypresses, one string per key (interactive mode only). */
  readKeys?: () => AsyncIterable<string>;
}

/** Step a build; returns the exit status (EXIT.ok; EXIT.checkFailed when an alarm was raised; EXIT.badInput). */
export async function runStep(build: Build, spec: SpecInfo, opts: StepOptions, io: StepIo): Promise<number> {
  const fail = (ds: readonly Diagnostic[]): void => {
    if (io.fail) io.fail(ds);
    else for (const d of ds) (io.error ?? io.write)(formatDiagnostic(d) + '\n');
  };
  if (opts.inputsFile !== undefined) {
    const problems = validateSequence(build, opts.inputsFile, opts.inputsPath);
    if (problems.length > 0) {
      fail(problems);
      return EXIT.badInput;
    }
    const rows = opts.abstract
      ? runAbstractScript(build, opts.inputsFile)
      : runPartScript(build, opts.inputsFile, timingOf(opts.profile ?? DEFAULT_PROFILE));
    io.write(opts.json ? JSON.stringify(rows, null, 2) + '\n' : formatRows(build, rows));
    // The same rule in both modes: a clock that raised an alarm (inputs declared impossible,
    // an upset latch) fails the run, whether the parts or the machine itself were stepped.
    return rows.some((r) => r.alarms.length > 0) ? EXIT.checkFailed : EXIT.ok;
  }
  if (!io.readKeys) {
    fail([
      diag(
        'LW700',
        'not at a terminal; give the clocks with --inputs FILE',
        { path: '--inputs' },
        'a JSON array with one object of input settings per clock, e.g. [{"marble": 1}, {}]',
      ),
    ]);
    return EXIT.badInput;
  }
  return interactive(build, spec, opts, io.readKeys(), (s) => io.write(s));
}

/** The scripted table: one line per clock. */
export function formatRows(build: Build, rows: readonly StepRow[]): string {
  const m = build.machine;
  const head = ['clock', 'state', 'code', 'inputs', 'outputs', 'next', 'alarms'];
  const body = rows.map((r) => [
    String(r.clock),
    r.state ?? 'unused',
    r.code || '-',
    m.inputs.map((n) => `${n}=${r.inputs[n]}`).join(' ') || '-',
    m.outputs.map((o) => `${o}=${r.outputs[o]}`).join(' ') || '-',
    r.next ?? `unused ${r.nextCode}`,
    r.alarms.join('; ') || '-',
  ]);
  // A loop, not Math.max(...cells): a spread of 130,000 rows exceeds the engine's argument limit.
  const widths = head.map((h, i) => body.reduce((w, b) => Math.max(w, b[i].length), h.length));
  const line = (cells: string[]): string =>
    cells.map((c, i) => (i === cells.length - 1 ? c : c.padEnd(widths[i]))).join('  ') + '\n';
  return line(head) + body.map(line).join('');
}

/** Keys of the input levers: 1–9, then letters not used by the other keys. */
export function inputKeys(count: number): string[] {
  const pool = '123456789abcdefghijklmnopstvwxyz';
  return [...pool].slice(0, count);
}

/** Keys of the other actions. */
export const KEYS = { phi1: ',', phi2: '.', clock: ' ', reset: 'r', undo: 'u', quit: 'q' } as const;

const QUIT_KEYS = new Set([KEYS.quit, '\u0003', '\u001b']);

/** One redraw of the screen. */
export interface Screen {
  readonly title: string;
  readonly lines: readonly string[];
}

export function drawScreen(s: Screen): string {
  return `\u001b[2J\u001b[H${s.title}\n\n${s.lines.join('\n')}\n`;
}

async function interactive(
  build: Build,
  spec: SpecInfo,
  opts: StepOptions,
  keys: AsyncIterable<string>,
  write: (s: string) => void,
): Promise<number> {
  const m = build.machine;
  const ik = inputKeys(m.inputs.length);
  const merged = (state: string | null): string => {
    if (state === null || !spec.merged) return '';
    const from = Object.entries(spec.merged)
      .filter(([o, to]) => to === state && o !== state)
      .map(([o]) => o);
    return from.length > 0 ? ` (stands for ${[state, ...from].join(', ')})` : '';
  };
  const keyHelp = [
    ...m.inputs.map((n, i) => `${ik[i]} input lever '${n}'`),
    ...(opts.abstract ? [] : [`${KEYS.phi1} φ1`, `${KEYS.phi2} φ2`]),
    'space whole clock',
    `${KEYS.reset} reset`,
    `${KEYS.undo} undo`,
    `${KEYS.quit} quit`,
  ].join(' · ');
  const stepper = opts.abstract
    ? abstractStepper(build)
    : partStepper(createRunner(build, timingOf(opts.profile ?? DEFAULT_PROFILE)));
  const it = keys[Symbol.asyncIterator]();
  let message = stepper.apply('reset');
  for (;;) {
    const view = stepper.view();
    write(
      drawScreen({
        title: `${m.name} — ${opts.abstract ? 'the machine itself (abstract)' : 'the built machine, part by part'}`,
        lines: [
          `state:   ${view.state ?? 'unused code'}${merged(view.state)}   code ${view.code || '-'}`,
          `inputs:  ${m.inputs.map((n, i) => `[${ik[i]}] ${n}=${view.inputs[n] ?? 0}`).join('  ') || '(none)'}`,
          ...view.extra,
          `outputs: ${m.outputs.map((o) => `${o}=${view.outputs[o]}`).join('  ') || '(none)'}`,
          `alarms:  ${message.length > 0 ? message.join('; ') : 'none'}`,
          '',
          `keys: ${keyHelp}`,
        ],
      }),
    );
    const next = await it.next();
    if (next.done === true || QUIT_KEYS.has(next.value)) return EXIT.ok;
    const key = next.value;
    const i = ik.indexOf(key);
    if (i >= 0 && i < m.inputs.length) message = stepper.apply({ toggle: m.inputs[i] });
    else if (key === KEYS.phi1 || key === KEYS.phi2) message = stepper.apply(key === KEYS.phi1 ? 'phi1' : 'phi2');
    else if (key === KEYS.clock || key === '\r') message = stepper.apply('clock');
    else if (key === KEYS.reset) message = stepper.apply('reset');
    else if (key === KEYS.undo) message = stepper.apply('undo');
    else message = [`key '${printable(key)}' does nothing here`];
  }
}

function printable(key: string): string {
  return [...key].map((c) => (c < ' ' ? `^${String.fromCharCode(c.charCodeAt(0) + 64)}` : c)).join('');
}

type Command = 'phi1' | 'phi2' | 'clock' | 'reset' | 'undo' | { toggle: string };

interface View {
  readonly state: string | null;
  readonly code: string;
  readonly inputs: Readonly<Record<string, 0 | 1>>;
  readonly outputs: Readonly<Record<string, string>>;
  /** Lines between inputs and outputs (clock levers, latches). */
  readonly extra: readonly string[];
}

interface Stepper {
  view(): View;
  /** Do a command; returns alarms or notes in words. */
  apply(c: Command): string[];
}

function partStepper(runner: PartRunner): Stepper {
  const words = (es: readonly { words: string }[]): string[] => es.map((e) => e.words);
  return {
    view() {
      const r = runner.reading();
      const latch = (role: 'master' | 'slave'): string =>
        r.latches
          .filter((l) => l.role === role)
          .map((l) => `${l.name}: Q=${l.q} Q̄=${l.qBar}`)
          .join('  ') || '(none)';
      return {
        state: r.state,
        code: r.code,
        inputs: r.inputs,
        outputs: r.outputs,
        extra: [
          `levers:  [${KEYS.phi1}] φ1 ${r.phi1 ? 'PULLED' : 'released'}   [${KEYS.phi2}] φ2 ${r.phi2 ? 'PULLED' : 'released'}   reset ${r.reset ? 'PULLED' : 'released'}`,
          `masters: ${latch('master')}`,
          `slaves:  ${latch('slave')}`,
          `time:    ${r.timeS.toFixed(2)} s`,
        ],
      };
    },
    apply(c) {
      if (c === 'undo') return runner.undo() ? ['undone'] : ['nothing to undo'];
      if (c === 'reset') return words(runner.reset());
      const r = runner.reading();
      if (c === 'clock') {
        if (r.phi1 || r.phi2 || r.reset) return ['release the clock and reset levers before a whole clock'];
        return words(runner.clock(r.inputs).alarms);
      }
      const action: HandAction =
        typeof c === 'object'
          ? { kind: 'input', input: c.toggle, value: r.inputs[c.toggle] === 1 ? 0 : 1 }
          : { kind: (c === 'phi1' ? r.phi1 : r.phi2) ? 'release' : 'pull', lever: c };
      return words(runner.act(action));
    },
  };
}

function abstractStepper(build: Build): Stepper {
  const f = build.machine;
  let state = f.start;
  let inputs: Record<string, 0 | 1> = Object.fromEntries(f.inputs.map((n) => [n, 0 as const]));
  const past: { state: number; inputs: Record<string, 0 | 1> }[] = [];
  const outputsNow = (): Record<string, string> => {
    const { outputs } = stepAbstract(f, state, assignmentOf(f.inputs, inputs));
    return Object.fromEntries(f.outputs.map((o, k) => [o, String(outputs[k])]));
  };
  return {
    view: () => ({
      state: f.states[state],
      code: build.encoding.codes[state] ?? '',
      inputs,
      outputs: outputsNow(),
      extra: [],
    }),
    apply(c) {
      if (c === 'undo') {
        const last = past.pop();
        if (!last) return ['nothing to undo'];
        ({ state, inputs } = last);
        return ['undone'];
      }
      if (c === 'phi1' || c === 'phi2') return ['the abstract machine has no clock levers: space steps a whole clock'];
      past.push({ state, inputs });
      if (c === 'reset') state = f.start;
      else if (c === 'clock') state = stepAbstract(f, state, assignmentOf(f.inputs, inputs)).next;
      else inputs = { ...inputs, [c.toggle]: inputs[c.toggle] === 1 ? 0 : 1 };
      return [];
    },
  };
}

/** Keypresses from a terminal's standard input in raw mode, until it closes (Node only). */
export async function* terminalKeys(): AsyncGenerator<string> {
  const stdin = process.stdin;
  stdin.setRawMode?.(true);
  stdin.setEncoding('utf8');
  try {
    for await (const chunk of stdin) {
      const text = String(chunk);
      // An escape sequence (an arrow key) is one key; typed-ahead or pasted text is one key per character.
      if (text.startsWith('\u001b')) yield text;
      else yield* text;
    }
  } finally {
    stdin.setRawMode?.(false);
    stdin.pause();
  }
}

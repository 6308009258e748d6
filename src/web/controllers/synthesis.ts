/**
 * Synthesis off the page's thread, in four lanes (worker.ts): the reader reads and lays out
 * every revision of the text, so the sketch follows the keyboard; the builder encodes and
 * synthesises; the checker runs every check, draws the schematic and makes the documents; the
 * searcher prices every encoding. A lane busy on a revision the page has moved past is
 * restarted when waiting for it would cost more than starting afresh: the checker and the
 * searcher at once, the builder once it has been silent for BUILD_PATIENCE_MS on stale work (a
 * searching builder reports progress and gives stale searches up by itself); the reader
 * never, its jobs being short.
 *
 * The codes of a build that searches: the page remembers the outcomes of the latest searches
 * (search-memory.ts) and sends them with every build, so a keystroke that leaves the search's
 * setup as it was builds with the remembered codes at once. A setup never searched gets a
 * draft first — the build with stand-in codes, shown as such (Work.drafted) and neither checked
 * nor exported — and the final build when the search ends.
 */
import type { ReactiveController, ReactiveControllerHost } from 'lit';
import { encodingEntry, type Diagnostic, type Pin, type StepSight } from '../../core/index.js';
import {
  DEFAULT_SETTINGS,
  type BuildSettings,
  type BuildView,
  type ChecksView,
  type CodeRow,
  type DroppedSetting,
  type EncodingChoice,
  type ExportFile,
  type WalkView,
  type FromWorker,
  type ProfileSetting,
  type Reading,
} from '../worker/protocol.js';
import { keepDrop, keepRead, keepSet, parseJson } from './keep.js';
import { parseStoredPins, pinOptions, storedPins, withoutPin, withPin, type Pins } from './pins.js';
import { Lane } from './lane.js';
import { SearchMemory } from './search-memory.js';
import { parseStoredProfile } from './workshop.js';

/** Where the live work on the latest text stands. */
export const Work = {
  reading: 'reading',
  building: 'building',
  /** A draft build (stand-in codes) is shown while the search for this revision's codes runs. */
  drafted: 'drafted',
  checking: 'checking',
  done: 'done',
  refused: 'refused',
  stopped: 'stopped',
  failed: 'failed',
} as const;
export type Work = (typeof Work)[keyof typeof Work];

/** Where the encoding comparison stands. */
export const Search = {
  none: 'none',
  running: 'running',
  done: 'done',
  cancelled: 'cancelled',
  failed: 'failed',
} as const;
export type Search = (typeof Search)[keyof typeof Search];

export interface SearchProgress {
  readonly done: number;
  readonly total: number | null;
  readonly best: number;
}

/** Restart a builder that has spent this long on a stale revision. */
const BUILD_PATIENCE_MS = 400;

const isCode = (c: unknown, bits: number): boolean => typeof c === 'string' && c.length === bits && /^[01]*$/.test(c);

/** A stored encoding choice, if it has the shape of one (keep.ts sets anything else aside). */
export function parseChoice(raw: string): EncodingChoice | undefined {
  const v = parseJson(raw);
  if (typeof v !== 'object' || v === null) return undefined;
  const o = v as Record<string, unknown>;
  if (typeof o.strategy === 'string') {
    const e = encodingEntry(o.strategy);
    return e && !e.needsPins ? { strategy: e.name } : undefined;
  }
  const kept = o.kept as Record<string, unknown> | null | undefined;
  const named: unknown = o.states;
  if (typeof kept !== 'object' || kept === null || !Array.isArray(named)) return undefined;
  const { strategy, bits, codes: rawCodes } = kept;
  if (typeof strategy !== 'string' || typeof bits !== 'number' || !Number.isInteger(bits) || bits < 0) return undefined;
  const list: unknown[] = named;
  const states = list.filter((x): x is string => typeof x === 'string');
  const codes = Array.isArray(rawCodes) ? (rawCodes as unknown[]).filter((c): c is string => isCode(c, bits)) : [];
  if (states.length !== list.length || codes.length !== states.length || new Set(codes).size !== codes.length)
    return undefined;
  return { kept: { strategy, bits, codes }, states };
}

/** A stored unused-codes choice: 'dont-care' or a state's name. */
export function parseUnused(raw: string): string | undefined {
  return /^[A-Za-z0-9_]{1,200}$/.test(raw) || raw === 'dont-care' ? raw : undefined;
}

/** The `latchwright build` command that builds what these settings build (the defaults left out). */
export function commandLine(file: string, s: BuildSettings): string {
  const quote = (w: string): string => (/^[A-Za-z0-9_./=@-]+$/.test(w) ? w : `'${w.replace(/'/g, `'\\''`)}'`);
  const words = ['latchwright', 'build', quote(file)];
  const d = DEFAULT_SETTINGS;
  if ('strategy' in s.encoding && !('strategy' in d.encoding && d.encoding.strategy === s.encoding.strategy))
    words.push('--encoding', s.encoding.strategy);
  if (s.unusedCodes !== undefined) words.push('--unused', quote(s.unusedCodes));
  if (s.seed !== d.seed) words.push('--seed', String(s.seed));
  if (s.profile) words.push('--profile', quote(s.profile.name));
  words.push(...pinOptions(s.pins).map(quote));
  return words.join(' ');
}

/** True when the settings are the command line's defaults. */
export function isDefault(s: BuildSettings): boolean {
  return (
    'strategy' in s.encoding &&
    'strategy' in DEFAULT_SETTINGS.encoding &&
    s.encoding.strategy === DEFAULT_SETTINGS.encoding.strategy &&
    s.seed === DEFAULT_SETTINGS.seed &&
    s.unusedCodes === undefined &&
    s.profile === undefined &&
    s.pins === undefined
  );
}

/**
 * The settings with the codes back at the command line's defaults (the searched codes, unused
 * codes chosen automatically), and what describes the workshop and its frame kept: the
 * profile and the parts kept in bays, each of which has its own way back.
 */
export function codesToDefaults(s: BuildSettings): BuildSettings {
  const { profile, pins } = s;
  return { ...DEFAULT_SETTINGS, ...(profile ? { profile } : {}), ...(pins ? { pins } : {}) };
}

/** The codes are the command line's defaults, whatever the profile and the parts kept in bays. */
export function codesAreDefault(s: BuildSettings): boolean {
  const { profile: _profile, pins: _pins, ...codes } = s;
  return isDefault(codes);
}

export class SynthesisController implements ReactiveController {
  search: Search = Search.none;
  reading: Reading | undefined;
  /** The last reading without errors (views keep showing it while the text has errors). */
  good: Reading | undefined;
  built: BuildView | undefined;
  checks: ChecksView | undefined;
  buildProblems: readonly Diagnostic[] = [];
  fault: string | undefined;
  /** Progress of the encoding search of the build (strategy 'auto'), and of the comparison. */
  buildProgress: SearchProgress | undefined;
  progress: SearchProgress | undefined;
  rows: readonly CodeRow[] = [];
  /** The build's schematic (SVG text), or why there is none. */
  schematic: { readonly svg?: string; readonly problem?: string } | undefined;
  /** Revision of each result shown (the page marks stale views); `draft`: of the latest draft build. */
  readonly shown = {
    reading: -1,
    built: -1,
    draft: -1,
    unbuilt: -1,
    checks: -1,
    rows: -1,
    schematic: -1,
    stopped: -1,
  };
  settings: BuildSettings;
  /** Encoding searches finished for this page (a build with remembered codes does not count). */
  searches = 0;
  private readonly memory = new SearchMemory();

  private readonly reader = new Lane((m) => this.fromReader(m));
  private readonly builder = new Lane((m) => this.fromBuilder(m));
  private readonly checker = new Lane((m) => this.fromChecker(m));
  private readonly searcher = new Lane((m) => this.fromSearcher(m));
  /** Job number of the latest text (answers for older jobs are dropped). */
  private rev = 0;
  private text = '';
  private file = '';
  private pricedText: string | undefined;
  /** The profile the comparison was priced with (its rows are for that workshop only). */
  private pricedProfile: ProfileSetting | undefined;
  /** The text and settings of the latest build job. */
  private sentBuild: { readonly text: string; readonly settings: BuildSettings } | undefined;
  private drawn = -1;
  private readonly exports = new Map<string, (f: ExportFile | string) => void>();
  /** Walks asked of the checker and not yet answered, by ask number. */
  private readonly walks = new Map<number, (w: WalkView | string) => void>();
  private asks = 0;

  constructor(
    private readonly host: ReactiveControllerHost,
    private readonly told: {
      /** Every new build (the stepper follows it). */
      readonly built?: (view: BuildView) => void;
      /** Every reading of the latest text. */
      readonly read?: (reading: Reading) => void;
      /** Settings the build dropped because they were made for another machine. */
      readonly dropped?: (dropped: readonly DroppedSetting[]) => void;
    } = {},
  ) {
    host.addController(this);
    const encoding = keepRead('encoding', parseChoice);
    const unused = keepRead('unused', parseUnused);
    const profile = keepRead('profile', parseStoredProfile);
    const pins = keepRead('pins', parseStoredPins);
    this.settings = {
      ...DEFAULT_SETTINGS,
      ...(encoding ? { encoding } : {}),
      ...(unused !== undefined ? { unusedCodes: unused } : {}),
      ...(profile ? { profile } : {}),
      ...(pins ? { pins } : {}),
    };
  }

  hostConnected(): void {
    this.reader.warm();
    this.builder.warm();
  }

  hostDisconnected(): void {
    for (const l of [this.reader, this.builder, this.checker, this.searcher]) l.restart();
  }

  /** The job number of the latest text. */
  get job(): number {
    return this.rev;
  }

  /** Where the work on the latest text stands. */
  get work(): Work {
    const s = this.shown;
    if (this.fault !== undefined) return Work.failed;
    if (s.reading < this.rev) return Work.reading;
    if (!this.reading?.ok || s.unbuilt === this.rev) return Work.refused;
    if (s.stopped === this.rev) return Work.stopped;
    if (s.built < this.rev) return s.draft === this.rev ? Work.drafted : Work.building;
    if (s.checks < this.rev) return Work.checking;
    return Work.done;
  }

  /** The build shown is a draft: stand-in codes while the search for the final ones runs (or was stopped). */
  get provisional(): boolean {
    return this.built?.codesFrom === 'stand-in';
  }

  /** A new revision of the text. */
  submit(text: string, file: string): void {
    this.text = text;
    this.file = file;
    const rev = ++this.rev;
    this.fault = undefined;
    this.buildProgress = undefined;
    this.reader.send({ kind: 'read', rev, text, file });
    // Checks of an older build are no use now; stopping them frees the processor.
    if (!this.checker.idle) this.checker.restart();
    // A build of the same text and settings is no stale work (the file name following the
    // machine's name after a paste): the builder's draft and search serve the new job too.
    const same = this.sentBuild?.text === text && this.sentBuild.settings === this.settings;
    if (!same && this.builder.staleFor(rev) > BUILD_PATIENCE_MS) this.builder.restart();
    this.sentBuild = { text, settings: this.settings };
    const b = this.built?.build;
    this.builder.send({
      kind: 'build',
      rev,
      text,
      file,
      settings: this.settings,
      known: this.memory.entries(),
      ...(b ? { previous: { encoding: b.encoding, states: b.machine.states } } : {}),
    });
    if (this.search === Search.running && !this.pricedNow) this.cancelSearch();
    this.host.requestUpdate();
  }

  /** Build with other codes. */
  choose(choice: EncodingChoice): void {
    this.settings = { ...this.settings, encoding: choice };
    if (
      'strategy' in choice &&
      'strategy' in DEFAULT_SETTINGS.encoding &&
      choice.strategy === DEFAULT_SETTINGS.encoding.strategy
    )
      keepDrop('encoding');
    else keepSet('encoding', JSON.stringify(choice));
    this.submit(this.text, this.file);
  }

  /**
   * Back to the command line's defaults for the codes (the searched codes, unused codes chosen
   * automatically). The workshop's profile and the parts it keeps in bays stay: they describe
   * the workshop and its frame, not the codes, and each has its own way back (the Shop view's
   * defaults, **Let every part go**).
   */
  useDefaults(): void {
    this.settings = codesToDefaults(this.settings);
    keepDrop('encoding');
    keepDrop('unused');
    this.submit(this.text, this.file);
  }

  /** Keep a part in a bay (`--pin PART=BAY@DRUM`): the build places it there, or says why it cannot. */
  keepPart(part: string, pin: Pin): void {
    this.setPins(withPin(this.settings.pins, part, pin));
  }

  /** Let one part go (placed freely again), or every part when none is named. */
  release(part?: string): void {
    this.setPins(part === undefined ? undefined : withoutPin(this.settings.pins, part));
  }

  private setPins(pins: Pins | undefined): void {
    const { pins: _, ...rest } = this.settings;
    this.settings = pins ? { ...rest, pins } : rest;
    if (pins) keepSet('pins', storedPins(pins));
    else keepDrop('pins');
    this.submit(this.text, this.file);
  }

  /** Where unused codes go: 'dont-care', a state's name, or undefined for the automatic choice. */
  setUnused(to: string | undefined): void {
    const { unusedCodes: _, ...rest } = this.settings;
    this.settings = to === undefined ? rest : { ...rest, unusedCodes: to };
    if (to === undefined) keepDrop('unused');
    else keepSet('unused', to);
    this.submit(this.text, this.file);
  }

  /** Build with the workshop's own technology profile (one that loads without errors), or the shipped defaults. */
  setProfile(p: ProfileSetting | undefined): void {
    const { profile: _, ...rest } = this.settings;
    this.settings = p ? { ...rest, profile: p } : rest;
    if (p) keepSet('profile', JSON.stringify(p));
    else keepDrop('profile');
    this.submit(this.text, this.file);
  }

  /** Stop the build's encoding search; the views keep the last build. */
  stopBuild(): void {
    this.builder.restart();
    this.shown.stopped = this.rev;
    this.buildProgress = undefined;
    this.host.requestUpdate();
  }

  /** The comparison shown was priced for the text as it is now. */
  get rowsCurrent(): boolean {
    return this.search === Search.done && this.pricedNow;
  }

  /** The comparison is for the text and the profile as they are now. */
  private get pricedNow(): boolean {
    return this.pricedText === this.text && this.pricedProfile === this.settings.profile;
  }

  /** Price every encoding of the latest text. */
  compare(): void {
    this.searcher.restart();
    this.pricedText = this.text;
    this.pricedProfile = this.settings.profile;
    this.search = Search.running;
    this.progress = undefined;
    this.searcher.send({ kind: 'compare', rev: this.rev, text: this.text, file: this.file, settings: this.settings });
    this.host.requestUpdate();
  }

  cancelSearch(): void {
    this.searcher.restart();
    this.search = Search.cancelled;
    this.host.requestUpdate();
  }

  /** Ask for the schematic of the latest checked build (once per build). */
  drawSchematic(): void {
    if (this.work !== Work.done || this.drawn === this.rev) return;
    this.drawn = this.rev;
    this.checker.send({ kind: 'draw', rev: this.rev });
  }

  /** One build document of the latest, checked build. */
  exportDoc(doc: string): Promise<ExportFile> {
    return new Promise((resolve, reject) => {
      if (this.work !== Work.done) {
        reject(
          new Error(
            this.provisional
              ? 'the build shown is a draft with stand-in codes; documents come from the final build once it is checked'
              : 'the build and its checks are not finished yet',
          ),
        );
        return;
      }
      this.exports.set(`${this.rev}:${doc}`, (f) => (typeof f === 'string' ? reject(new Error(f)) : resolve(f)));
      this.checker.send({ kind: 'export', rev: this.rev, doc });
    });
  }

  /**
   * The shakedown walk on the latest checked build (the checker holds it): steps 1 … `reached`
   * ticked with `sights` seen differ; `sheet` asks for the commissioning sheet too. Rejected when
   * there is no checked build, or a newer build replaced it before the answer.
   */
  walk(reached: number, sights: readonly StepSight[], sheet: boolean): Promise<WalkView> {
    return new Promise((resolve, reject) => {
      if (this.work !== Work.done || this.provisional) {
        reject(new Error('the build and its checks are not finished yet'));
        return;
      }
      const ask = ++this.asks;
      this.walks.set(ask, (w) => (typeof w === 'string' ? reject(new Error(w)) : resolve(w)));
      this.checker.send({ kind: 'walk', rev: this.rev, ask, reached, sights: [...sights], sheet });
    });
  }

  /** The build the walk is of: its revision, while it is checked and final (undefined otherwise). */
  get walkable(): number | undefined {
    return this.work === Work.done && !this.provisional ? this.rev : undefined;
  }

  private fromReader(m: FromWorker): void {
    if (m.rev !== this.rev) return;
    if (m.kind === 'reading') {
      this.reading = m.reading;
      if (m.reading.ok) this.good = m.reading;
      this.shown.reading = m.rev;
      this.told.read?.(m.reading);
    } else if (m.kind === 'fault') this.fault = m.message;
    this.host.requestUpdate();
  }

  private fromBuilder(m: FromWorker): void {
    if (m.rev !== this.rev) return;
    switch (m.kind) {
      case 'progress':
        this.buildProgress = { done: m.done, total: m.total, best: m.best };
        break;
      case 'draft':
        this.built = m.view;
        this.buildProblems = [];
        this.shown.draft = m.rev;
        this.told.built?.(m.view);
        // The checks wait for the final build; the ones shown are for an older build.
        if (!this.checker.idle) this.checker.restart();
        break;
      case 'built':
        if (m.searched) this.memory.remember(m.searched);
        if (m.view.codesFrom === 'searched') this.searches++;
        this.built = m.view;
        this.buildProblems = [];
        this.buildProgress = undefined;
        this.shown.built = m.rev;
        if (m.view.dropped) this.forget(m.view.dropped);
        this.told.built?.(m.view);
        // The checker's current work, if any, is for an older build.
        if (!this.checker.idle) this.checker.restart();
        // The checker checks this build (no second build); its key names the codes the builder chose.
        this.checker.send({
          kind: 'check',
          rev: m.rev,
          text: this.text,
          file: this.file,
          settings: {
            ...this.settings,
            encoding: { kept: m.view.build.encoding, states: m.view.build.machine.states },
          },
          made: {
            build: m.view.build,
            placement: m.view.placement,
            profile: m.view.profile,
            diagnostics: m.view.diagnostics,
          },
        });
        break;
      case 'unbuilt':
        this.buildProblems = m.diagnostics;
        this.shown.unbuilt = m.rev;
        break;
      case 'fault':
        this.fault = m.message;
        break;
      default:
        return;
    }
    this.host.requestUpdate();
  }

  /** Settings the builder dropped for this machine: forget them (it built without them already). */
  private forget(dropped: readonly DroppedSetting[]): void {
    let s = this.settings;
    for (const d of dropped) {
      if (d.setting === 'encoding') {
        s = { ...s, encoding: DEFAULT_SETTINGS.encoding };
        keepDrop('encoding');
      } else {
        const { unusedCodes: _, ...rest } = s;
        s = rest;
        keepDrop('unused');
      }
    }
    this.settings = s;
    this.told.dropped?.(dropped);
  }

  private fromChecker(m: FromWorker): void {
    if (m.kind === 'walked') {
      this.walks.get(m.ask)?.(m.walk ?? m.problem ?? 'no answer');
      this.walks.delete(m.ask);
      return;
    }
    if (m.kind === 'exported') {
      const key = `${m.rev}:${m.doc}`;
      this.exports.get(key)?.(m.file ?? m.problem ?? 'no document');
      this.exports.delete(key);
      return;
    }
    if (m.rev !== this.rev) return;
    if (m.kind === 'checked') {
      this.checks = m.view;
      this.shown.checks = m.rev;
    } else if (m.kind === 'schematic') {
      this.schematic = m.svg !== undefined ? { svg: m.svg } : { problem: m.problem ?? 'no schematic' };
      this.shown.schematic = m.rev;
    } else if (m.kind === 'fault') this.fault = m.message;
    this.host.requestUpdate();
  }

  private fromSearcher(m: FromWorker): void {
    if (this.search !== Search.running) return;
    if (m.kind === 'progress') this.progress = { done: m.done, total: m.total, best: m.best };
    else if (m.kind === 'compared') {
      if (!this.pricedNow) return;
      this.rows = m.rows;
      this.shown.rows = m.rev;
      this.search = Search.done;
    } else if (m.kind === 'fault') {
      this.fault = m.message;
      this.search = Search.failed;
    }
    this.host.requestUpdate();
  }
}

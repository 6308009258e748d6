/**
 * The synthesis worker. The page runs several, each for one kind of job, so that slow work
 * never stands in front of fast work: a reader (read + sketch layout, every keystroke), a
 * builder (encode + synthesise), a checker (every check of the builder's build, which the page
 * hands over; on request the schematic and the build documents) and a searcher (every encoding
 * priced). Jobs go stage by stage, yielding between stages so a newer job of the same kind can
 * overtake; every answer carries the page revision it is for.
 * A worker busy on stale work is cancelled by the page, which terminates it and starts another.
 */
import {
  analyse,
  type Analysed,
  type Built,
  type EncodeResult,
  type Progress,
  schematicSvg,
  type SearchSetup,
} from '../core/index.js';
import {
  againFor,
  buildJob,
  buildKey,
  buildOptions,
  builtForChecks,
  checkedAgain,
  checkJob,
  checkKey,
  codesPlan,
  compareJob,
  readJob,
  settle,
  standInSettings,
  toRemember,
} from './worker/jobs.js';
import { searchOnTwoCores } from './worker/search.js';
import { exportFile } from './worker/exports.js';
import { walkJob } from './worker/walk.js';
import { profileFileText } from './worker/profile-file.js';
import type {
  BuildView,
  ChecksView,
  FromWorker,
  ProfileSetting,
  RememberedSearch,
  ToWorker,
} from './worker/protocol.js';

const scope = self as unknown as {
  postMessage(m: FromWorker): void;
  onmessage: ((e: MessageEvent<ToWorker>) => void) | null;
};

/** The newest revision asked for, per kind of job. */
const latest: Record<string, number> = {};
/**
 * The build checked last: its revision, the checked build, its check key (jobs.ts `checkKey`),
 * how many of its diagnostics were its reading's, the page's view of it, and the workshop's
 * profile it was built with (the archive of its documents carries the file).
 */
let checked:
  | {
      rev: number;
      built: Built;
      key: string | undefined;
      read: number;
      view: ChecksView;
      profile: ProfileSetting | undefined;
    }
  | undefined;

/** The files besides the documents that the archive of a build carries: its profile file, when it has its own. */
const extraFiles = (p: ProfileSetting | undefined): Record<string, string> =>
  p ? { [p.name]: profileFileText(p) } : {};
/** The encoding search under way: its setup's key, the newest build job waiting on it and that job's draft. */
interface Running {
  readonly key: string;
  wanted: number;
  draft: Draft | undefined;
  done: Promise<EncodeResult | undefined>;
}
let running: Running | undefined;
/**
 * The latest draft made, under its search setup's key: a newer job of the same setup that
 * arrives before the search starts (the file name following the machine's name after a paste,
 * a comment typed) takes it again rather than build it twice.
 */
let drafted: { readonly key: string; readonly draft: Draft | undefined } | undefined;
/** The last final build posted, under its build key (jobs.ts `buildKey`), and how many of its diagnostics were its reading's. */
let last: { key: string; view: BuildView; read: number } | undefined;

const post = (m: FromWorker): void => scope.postMessage(m);
const turn = (): Promise<void> => new Promise((r) => setTimeout(r, 0));
const stale = (kind: string, rev: number): boolean => rev !== latest[kind];
const message = (e: unknown): string => (e instanceof Error ? e.message : String(e));

/** Progress reports, at most one per 80 ms. */
function reporter(rev: number, stage: string): (p: Progress) => void {
  let last = 0;
  return (p) => {
    const t = performance.now();
    if (t - last < 80 && p.done !== p.total) return;
    last = t;
    post({ kind: 'progress', rev, done: p.done, total: p.total, best: p.best, stage });
  };
}

/**
 * A build job. Codes named by the settings, or remembered by the page for an equal search
 * setup, build at once. Otherwise a draft with stand-in codes is posted first (the views follow
 * the keyboard), then the search runs on two cores and the final build follows.
 */
async function build(m: Extract<ToWorker, { kind: 'build' }>): Promise<void> {
  const a = analyse(m.text, m.file);
  if (!a.ok) {
    post({ kind: 'unbuilt', rev: m.rev, diagnostics: [] }); // the reader reports the problems
    return;
  }
  const plan = codesPlan(a, m.settings, m.known);
  const key = buildKey(a, m.settings);
  if (plan.kind !== 'search') {
    const searched = plan.kind === 'remembered' ? { key: plan.key, outcome: plan.outcome } : undefined;
    // The machine as built last (a comment or spacing typed): the same build, no work but the reading.
    if (key !== undefined && last?.key === key) {
      const view = againFor(last.view, last.read, a, m.settings, plan.kind === 'remembered' ? 'remembered' : 'named');
      return finish(m.rev, a, key, { view, diagnostics: view.diagnostics }, searched);
    }
    if (plan.kind === 'named') return finish(m.rev, a, key, buildJob(a, m.settings));
    return finish(m.rev, a, key, buildJob(a, m.settings, undefined, plan.outcome, 'remembered'), searched);
  }
  const made = running?.key === plan.key ? running : drafted?.key === plan.key ? drafted : undefined;
  const draft = made ? redraft(made.draft, a) : makeDraft(a, m, plan.setup);
  drafted = { key: plan.key, draft };
  if (draft) post({ kind: 'draft', rev: m.rev, view: draft.view });
  await turn();
  if (stale(m.kind, m.rev)) return;
  const searched = await search(a, m, plan.key, draft);
  if (stale(m.kind, m.rev)) return;
  if (drafted?.key === plan.key) drafted = undefined; // the final build replaces it
  // The outcome with what the search kept of pricing these codes; the page keeps it without.
  const b = buildJob(a, m.settings, undefined, searched);
  finish(m.rev, a, key, b, searched ? toRemember(plan.key, searched) : undefined);
}

/** A draft: the build with stand-in codes, and how many of its diagnostics are the reading's. */
interface Draft {
  readonly view: BuildView;
  readonly read: number;
}

function makeDraft(a: Analysed, m: Extract<ToWorker, { kind: 'build' }>, setup: SearchSetup): Draft | undefined {
  const standIn = standInSettings(a, m.settings, setup, m.previous);
  const b = buildJob(a, standIn.settings, undefined, undefined, 'stand-in');
  return b.view ? { view: { ...b.view, standIn: standIn.standIn }, read: a.diagnostics.length } : undefined;
}

/**
 * The draft made for the same setup (the search under way, or the latest draft), for a newer
 * text (a comment typed, the file name following the machine's name): the same build, with the
 * new reading's diagnostics (their lines may have moved). Building it again would only hold the
 * search up.
 */
function redraft(d: Draft | undefined, a: Analysed): Draft | undefined {
  if (!d) return undefined;
  const diagnostics = [...a.diagnostics, ...d.view.diagnostics.slice(d.read)];
  return { view: { ...d.view, diagnostics }, read: a.diagnostics.length };
}

/**
 * Post a build job's final answer, and keep it as the last build under its key; `searched`:
 * the search outcome it used, for the page to keep.
 */
function finish(
  rev: number,
  a: Analysed,
  key: string | undefined,
  b: Pick<ReturnType<typeof buildJob>, 'view' | 'diagnostics'>,
  searched?: RememberedSearch,
): void {
  if (!b.view) {
    post({ kind: 'unbuilt', rev, diagnostics: b.diagnostics });
    return;
  }
  last = key !== undefined ? { key, view: b.view, read: a.diagnostics.length } : undefined;
  post({ kind: 'built', rev, view: b.view, ...(searched ? { searched } : {}) });
}

/**
 * The search of a build job's setup. A newer job with the same setup (a comment typed while it
 * runs) takes the running search over instead of starting again; the search gives up, between
 * tasks, once the newest job wants another one.
 */
function search(
  a: Analysed,
  m: Extract<ToWorker, { kind: 'build' }>,
  key: string,
  draft: Draft | undefined,
): Promise<EncodeResult | undefined> {
  if (running?.key === key) {
    running.wanted = m.rev;
    running.draft = draft;
    return running.done;
  }
  const r: Running = { key, wanted: m.rev, draft, done: Promise.resolve(undefined) };
  // Progress is posted for the newest job that waits on this search.
  let reportFor = r.wanted;
  let report = reporter(reportFor, 'search');
  const progress = (p: Progress): void => {
    if (reportFor !== r.wanted) report = reporter((reportFor = r.wanted), 'search');
    report(p);
  };
  // The search sees the settings as the build will use them (settle drops those this machine cannot use).
  r.done = searchOnTwoCores(a, buildOptions(settle(a, m.settings).settings), progress, () => stale('build', r.wanted));
  running = r;
  void r.done.finally(() => {
    if (running === r) running = undefined;
  });
  return r.done;
}

/** A document of the build checked last (with its profile file in the archive), or why not. */
function exportDocument(m: Extract<ToWorker, { kind: 'export' }>): void {
  if (!checked || checked.rev !== m.rev)
    post({
      kind: 'exported',
      rev: m.rev,
      doc: m.doc,
      problem: 'the build is not checked yet; try again when the checks are done',
    });
  else
    post({
      kind: 'exported',
      rev: m.rev,
      doc: m.doc,
      file: exportFile(checked.built, m.doc, extraFiles(checked.profile)),
    });
}

/** The shakedown walk on the build checked last, or why not. */
function walk(m: Extract<ToWorker, { kind: 'walk' }>): void {
  if (!checked || checked.rev !== m.rev)
    post({ kind: 'walked', rev: m.rev, ask: m.ask, problem: 'the build is not checked yet' });
  else post({ kind: 'walked', rev: m.rev, ask: m.ask, walk: walkJob(checked.built, m.reached, m.sights, m.sheet) });
}

async function run(m: ToWorker): Promise<void> {
  if (m.kind === 'export') {
    exportDocument(m);
    return;
  }
  if (m.kind === 'walk') {
    walk(m);
    return;
  }
  latest[m.kind] = m.rev;
  await turn();
  if (stale(m.kind, m.rev)) return;
  switch (m.kind) {
    case 'read':
      post({ kind: 'reading', rev: m.rev, reading: readJob(m.text, m.file).reading });
      return;
    case 'build':
      await build(m);
      return;
    case 'check': {
      const a = analyse(m.text, m.file);
      const key = a.ok ? checkKey(a, m.settings) : undefined;
      // The build checked last, for a text that only changed where the checks do not look.
      if (a.ok && key !== undefined && checked?.key === key) {
        checked = {
          ...checked,
          rev: m.rev,
          built: checkedAgain(checked.built, checked.read, a),
          read: a.diagnostics.length,
        };
        post({ kind: 'checked', rev: m.rev, view: checked.view });
        return;
      }
      if (!a.ok) {
        post({
          kind: 'fault',
          rev: m.rev,
          message: 'the machine built for the page did not read again for its checks',
        });
        return;
      }
      const c = checkJob(builtForChecks(a, m.made), m.settings.seed);
      checked = {
        rev: m.rev,
        built: c.built,
        key,
        read: a.diagnostics.length,
        view: c.view,
        profile: m.settings.profile,
      };
      post({ kind: 'checked', rev: m.rev, view: c.view });
      return;
    }
    case 'draw':
      if (!checked || checked.rev !== m.rev) {
        post({ kind: 'schematic', rev: m.rev, problem: 'the build is not checked yet' });
        return;
      }
      try {
        post({
          kind: 'schematic',
          rev: m.rev,
          svg: schematicSvg(checked.built.build, undefined, {
            palette: 'screen',
            units: checked.built.profile.documentUnits,
          }),
        });
      } catch (e) {
        post({ kind: 'schematic', rev: m.rev, problem: message(e) });
      }
      return;
    case 'compare': {
      const r = readJob(m.text, m.file);
      post({
        kind: 'compared',
        rev: m.rev,
        rows: r.analysed ? compareJob(r.analysed, m.settings, reporter(m.rev, 'compare')) : [],
      });
    }
  }
}

scope.onmessage = (e) => {
  const m = e.data;
  run(m).catch((err: unknown) => {
    if (m.kind === 'export') post({ kind: 'exported', rev: m.rev, doc: m.doc, problem: message(err) });
    else if (m.kind === 'walk') post({ kind: 'walked', rev: m.rev, ask: m.ask, problem: message(err) });
    else post({ kind: 'fault', rev: m.rev, message: message(err) });
  });
};

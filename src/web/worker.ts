/**
 * The synthesis worker. The page runs several, each for one kind of job, so that slow work
 * never stands in front of fast work: a reader (read + sketch layout, every keystroke), a
 * builder (encode + synthesise), a checker (every check; on request the schematic and the
 * build documents)
 * and a searcher (every encoding priced). Jobs go stage by stage, yielding between stages so
 * a newer job of the same kind can overtake; every answer carries the page revision it is for.
 * A worker busy on stale work is cancelled by the page, which terminates it and starts another.
 */
import { analyse, type Built, type Progress, schematicSvg } from '../core/index.js';
import { buildJob, buildOptions, checkJob, compareJob, readJob, settle } from './worker/jobs.js';
import { searchOnTwoCores } from './worker/search.js';
import { exportFile } from './worker/exports.js';
import type { FromWorker, ToWorker } from './worker/protocol.js';

const scope = self as unknown as {
  postMessage(m: FromWorker): void;
  onmessage: ((e: MessageEvent<ToWorker>) => void) | null;
};

/** The newest revision asked for, per kind of job. */
const latest: Record<string, number> = {};
let checked: { rev: number; built: Built } | undefined;

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

async function run(m: ToWorker): Promise<void> {
  if (m.kind === 'export') {
    if (!checked || checked.rev !== m.rev)
      post({
        kind: 'exported',
        rev: m.rev,
        doc: m.doc,
        problem: 'the build is not checked yet; try again when the checks are done',
      });
    else post({ kind: 'exported', rev: m.rev, doc: m.doc, file: exportFile(checked.built, m.doc) });
    return;
  }
  latest[m.kind] = m.rev;
  await turn();
  if (stale(m.kind, m.rev)) return;
  switch (m.kind) {
    case 'read':
      post({ kind: 'reading', rev: m.rev, reading: readJob(m.text, m.file).reading });
      return;
    case 'build': {
      const a = analyse(m.text, m.file);
      if (!a.ok) {
        post({ kind: 'unbuilt', rev: m.rev, diagnostics: [] }); // the reader reports the problems
        return;
      }
      const onProgress = reporter(m.rev, 'search');
      // The search sees the settings as the build will use them (settle drops those this machine cannot use).
      const searched = await searchOnTwoCores(a, buildOptions(settle(a, m.settings).settings), onProgress);
      if (stale(m.kind, m.rev)) return;
      const b = buildJob(a, m.settings, onProgress, searched);
      if (b.view) post({ kind: 'built', rev: m.rev, view: b.view });
      else post({ kind: 'unbuilt', rev: m.rev, diagnostics: b.diagnostics });
      return;
    }
    case 'check': {
      const a = analyse(m.text, m.file);
      const b = a.ok ? buildJob(a, m.settings) : undefined;
      if (!b?.built) {
        post({
          kind: 'fault',
          rev: m.rev,
          message: 'the machine built for the page did not build again for its checks',
        });
        return;
      }
      const c = checkJob(b.built, m.settings.seed);
      checked = { rev: m.rev, built: c.built };
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
          svg: schematicSvg(checked.built.build, undefined, { palette: 'screen' }),
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
    else post({ kind: 'fault', rev: m.rev, message: message(err) });
  });
};

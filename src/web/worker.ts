/**
 * The synthesis worker. The page runs two of these: one for live work (read → build → check,
 * then exports of that build) and one for the encoding comparison, which may search for
 * seconds and is cancelled by terminating it. Jobs go stage by stage, yielding between stages
 * so a newer job can overtake; answers carry the page revision they belong to.
 */
import type { Analysed, Built } from '../core/pipeline.js';
import type { Progress } from '../core/phases/encode/cost.js';
import { buildJob, checkJob, compareJob, readJob } from './worker/jobs.js';
import { exportFile } from './worker/exports.js';
import { schematicSvg } from '../core/export/schematic-svg.js';
import type { BuildSettings, FromWorker, ToWorker } from './worker/protocol.js';

const scope = self as unknown as { postMessage(m: FromWorker): void; onmessage: ((e: MessageEvent<ToWorker>) => void) | null };

let latest = -1;
let checked: { rev: number; built: Built } | undefined;

const post = (m: FromWorker): void => scope.postMessage(m);
const turn = (): Promise<void> => new Promise((r) => setTimeout(r, 0));
const stale = (rev: number): boolean => rev !== latest;

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

async function work(rev: number, text: string, file: string, settings: BuildSettings): Promise<void> {
  await turn();
  if (stale(rev)) return;
  const r = readJob(text, file);
  post({ kind: 'reading', rev, reading: r.reading });
  if (!r.analysed) return;
  await turn();
  if (stale(rev)) return;
  const b = buildJob(r.analysed, settings, reporter(rev, 'search'));
  if (!b.view || !b.built) {
    post({ kind: 'unbuilt', rev, diagnostics: b.diagnostics });
    return;
  }
  post({ kind: 'built', rev, view: b.view });
  await turn();
  if (stale(rev)) return;
  const c = checkJob(b.built, settings.seed);
  checked = { rev, built: c.built };
  post({ kind: 'checked', rev, view: c.view });
  await turn();
  if (stale(rev)) return;
  try {
    post({ kind: 'schematic', rev, svg: schematicSvg(b.built.build) });
  } catch (e) {
    post({ kind: 'schematic', rev, problem: e instanceof Error ? e.message : String(e) });
  }
}

async function compare(rev: number, text: string, file: string, settings: BuildSettings): Promise<void> {
  await turn();
  if (stale(rev)) return;
  const r = readJob(text, file);
  const analysed: Analysed | undefined = r.analysed;
  if (!analysed) {
    post({ kind: 'compared', rev, rows: [] });
    return;
  }
  post({ kind: 'compared', rev, rows: compareJob(analysed, settings, reporter(rev, 'compare')) });
}

function guarded(rev: number, run: () => Promise<void> | void): void {
  Promise.resolve()
    .then(run)
    .catch((e: unknown) => post({ kind: 'fault', rev, message: e instanceof Error ? e.message : String(e) }));
}

scope.onmessage = (e) => {
  const m = e.data;
  switch (m.kind) {
    case 'work':
      latest = m.rev;
      guarded(m.rev, () => work(m.rev, m.text, m.file, m.settings));
      return;
    case 'compare':
      latest = m.rev;
      guarded(m.rev, () => compare(m.rev, m.text, m.file, m.settings));
      return;
    case 'export':
      try {
        if (!checked || checked.rev !== m.rev) post({ kind: 'exported', rev: m.rev, doc: m.doc, problem: 'the build is not finished yet; try again when the checks are done' });
        else post({ kind: 'exported', rev: m.rev, doc: m.doc, file: exportFile(checked.built, m.doc) });
      } catch (e) {
        post({ kind: 'exported', rev: m.rev, doc: m.doc, problem: e instanceof Error ? e.message : String(e) });
      }
  }
};

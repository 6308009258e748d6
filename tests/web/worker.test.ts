/**
 * The synthesis worker's script (src/web/worker.ts) run in Node with a stand-in for the
 * worker's global scope: messages in through `onmessage`, answers collected from `postMessage`
 * (uncloned, so what is reused shows as the same object). With no Worker in Node the encoding
 * search runs in the same thread, as the worker does without Worker support.
 */
import { readFileSync } from 'node:fs';
import { beforeAll, describe, expect, it } from 'vitest';
import { netlistJson } from '../../src/core/index.js';
import { buildJob, readJob } from '../../src/web/worker/jobs.js';
import { DEFAULT_SETTINGS, type BuildView, type FromWorker, type ToWorker } from '../../src/web/worker/protocol.js';
import { examplePath } from '../cli/support.js';

interface Scope {
  postMessage(m: FromWorker): void;
  onmessage: ((e: { data: ToWorker }) => void) | null;
}

const answers: FromWorker[] = [];
/** Called with every answer, after it is collected. */
let told: (m: FromWorker) => void = () => undefined;
const scope: Scope = {
  postMessage: (m) => {
    answers.push(m);
    told(m);
  },
  onmessage: null,
};

beforeAll(async () => {
  (globalThis as unknown as { self: Scope }).self = scope;
  await import('../../src/web/worker.js');
});

const send = (m: ToWorker): void => scope.onmessage?.({ data: m });
const netlist = (v: BuildView): string => netlistJson(v.build, { placement: v.placement, profile: v.profile });

describe('src/web/worker', () => {
  it('a newer job of the same text (the file name following the machine’s name) takes the draft made again, then builds what the jobs build', async () => {
    const text = readFileSync(examplePath('marble-bell'), 'utf8');
    const job = (rev: number, file: string): ToWorker => ({
      kind: 'build',
      rev,
      text,
      file,
      settings: DEFAULT_SETTINGS,
    });
    const built = new Promise<FromWorker>((resolve) => {
      told = (m) => {
        // The page renames the file once the first reading is in; here, as the first draft leaves.
        if (m.kind === 'draft' && m.rev === 1) send(job(2, 'marble_bell.lw'));
        if (m.kind === 'built' || m.kind === 'fault' || m.kind === 'unbuilt') resolve(m);
      };
    });
    send(job(1, 'untitled.lw'));
    const last = await built;
    const drafts = answers.filter((m) => m.kind === 'draft');
    expect(drafts.map((d) => d.rev)).toEqual([1, 2]);
    const [first, second] = drafts.map((d) => (d.kind === 'draft' ? d.view : undefined));
    // The same build object: drafted once, with the newer reading's diagnostics.
    expect(second?.build).toBe(first?.build);
    expect(second?.codesFrom).toBe('stand-in');
    // Job 1 gave way to job 2, whose final build is the jobs' own build with the searched codes.
    expect(answers.filter((m) => m.kind === 'built').map((m) => m.rev)).toEqual([2]);
    if (last.kind !== 'built') throw new Error(`expected a build, got ${last.kind}`);
    const a = readJob(text, 'marble_bell.lw').analysed;
    const direct = a && buildJob(a, DEFAULT_SETTINGS).view;
    if (!direct) throw new Error('marble-bell must build');
    expect(netlist(last.view)).toBe(netlist(direct));
    expect(last.searched?.outcome && 'kept' in last.searched.outcome).toBe(false);
  });
});

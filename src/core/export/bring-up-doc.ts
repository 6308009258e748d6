/**
 * The bring-up sheet (bring-up.md, bring-up.html): the staged bring-up of bring-up.ts as a
 * printable page. The safety cautions first (those of every sheet, and the ones that come with
 * reaching into a frame whose drum turns), how to use the sheet, then one section per stage:
 * the parts to mount (where each goes, in the commissioning sheet's words: bay and drum, what
 * it does), the cord branches to tie (with their rows in the wiring list and the trial that
 * would show each come loose), and the check —
 * each hand sequence from every lever released, what the Z levers show after it, and per gate
 * where its Z up and its Z down are seen, or plainly why not. Tick boxes on every table a
 * person works through. Rendered by the shared Doc renderer (every name escaped there).
 */
import type { Build } from '../model/build.js';
import { quantitiesFor } from '../model/units.js';
import { counted } from '../model/words.js';
import type { Placement } from '../phases/place/index.js';
import type { Profile } from '../physics/profile.js';
import { describeAction } from '../sim/hand.js';
import { renderDocHtml } from './build-sheet-html.js';
import { renderDocMd } from './build-sheet-md.js';
import { CAUTIONS } from './build-sheet.js';
import { branchId, GATES_PER_STAGE, type BringUpPlan, type BringUpStage } from './bring-up.js';
import { SEARCH_ACTIONS, SEARCH_POSITIONS, type GateCheck, type Sighting, type Trial } from './bring-up-search.js';
import { bayWords } from './commissioning.js';
import { p, table, type Block, type Doc, type Section } from './doc.js';
import { partWords } from './part-words.js';
import type { WiringRow } from './wiring.js';

/** The cautions of reaching into the frame while it is built, before those of every sheet. */
export const BRING_UP_CAUTIONS: readonly string[] = [
  'Stop the drum before reaching in to mount a part or tie a cord, and start it again only with hands clear and the guards on.',
  'Hang a weight only once its lever is mounted, keep weights low or caught while you work beneath them, and never stand under one.',
  'A lever pulled in a check swings through a pinch point: keep fingers clear of its travel and of the levers beside it.',
  ...CAUTIONS,
];

/** What the sheet is made from. */
export interface BringUpSheetInput {
  readonly build: Build;
  readonly plan: BringUpPlan;
  readonly placement: Placement;
  readonly profile: Pick<Profile, 'documentUnits'>;
  /** The wiring list, for each branch's row there. */
  readonly wiring: readonly WiringRow[];
}

/**
 * A trial's name on the sheet: `3.1` (stage 3, its first trial), numbered as a procedure's
 * steps are. Not `3a`: a letter after a number reads as a unit (`3g`, three grams).
 */
export const trialName = (s: Sighting): string => `${s.stage}.${s.trial + 1}`;

/** A hand sequence in words. */
export function sequenceWords(t: Trial): string {
  return t.actions.length === 0
    ? 'nothing: look at it as it stands'
    : t.actions.map((a, i) => `${i + 1}. ${describeAction(a)}`).join('; ');
}

/** Z levers by position, in words: `down: a, b; up: c; undetermined: d`. */
function positionsWords(ps: readonly { readonly gate: string; readonly z: string }[]): string {
  const of = (z: string): string[] => ps.filter((x) => x.z === z).map((x) => x.gate);
  const parts = [
    ['down', of('down')],
    ['up', of('up')],
    ['undetermined', of('?')],
  ] as const;
  return (
    parts
      .filter(([, gs]) => gs.length > 0)
      .map(([w, gs]) => `${w}: ${gs.join(', ')}`)
      .join('; ') || '—'
  );
}

/** Where a gate's Z position is seen, in words. */
function sightingWords(stage: BringUpStage, s: Sighting | null): string {
  if (s && s.stage === stage.number) return `after ${trialName(s)}`;
  const search = stage.search;
  const here =
    search && !search.complete
      ? `not found among the ${search.positions} machine positions searched here`
      : `not seen within ${SEARCH_ACTIONS} hand actions here`;
  if (s) return `${here}; seen only once stage ${s.stage} is mounted (after ${trialName(s)})`;
  return `${here}, nor at any later stage: check it on the commissioning sheet`;
}

function mountBlock(input: BringUpSheetInput, stage: BringUpStage, words: ReadonlyMap<string, string>): Block[] {
  const where = bayWords(input.placement);
  const latchBays = new Map(
    input.placement.latches.map((l) => [l.latch, `bays ${l.bays[0]} and ${l.bays[1]}, drum ${l.drum}`]),
  );
  const flagOn = new Map(input.placement.flags.map((f) => [f.flag, `on the Z lever in bay ${f.bay}, drum ${f.drum}`]));
  const place = (id: string): string => where(id) || latchBays.get(id) || flagOn.get(id) || 'on the frame';
  if (stage.parts.length === 0) return [];
  return [
    p('Mount:'),
    table(
      ['where', 'part', 'what it does'],
      stage.parts.map((id) => [place(id), id, words.get(id) ?? '']),
      { tick: true, mono: [1] },
    ),
  ];
}

/** The frame, drums and drive of stage 1, with the drums' lengths. */
function frameBlock(input: BringUpSheetInput): Block {
  const q = quantitiesFor(input.profile.documentUnits);
  const drums = input.placement.drums.map((d) => `drum ${d.drum}, ${q.length(d.lengthM)} long`);
  return p(
    `Mount the frame, the drive and ${counted(drums.length, 'drum')} (${drums.join('; ')}), and fit the guards.`,
  );
}

function tieBlock(input: BringUpSheetInput, stage: BringUpStage): Block[] {
  if (stage.ties.length === 0) return stage.kind === 'gates' ? [] : [p('Tie nothing yet.')];
  const actuators = new Set(input.build.netlist.parts.filter((x) => x.kind === 'actuator').map((x) => x.id));
  // The wiring list writes an actuator's load where a gate's port goes; a branch to an actuator has no port.
  const rows = new Map(
    input.wiring.map((w) => [
      branchId({ cord: w.cord, driver: '', target: w.target, port: actuators.has(w.target) ? '' : w.port }),
      w,
    ]),
  );
  const loose = (i: number): string => {
    const l = stage.loose[i];
    if (!l?.simulated) return 'not simulated';
    return l.shownBy === null ? 'no trial here' : trialName({ stage: stage.number, trial: l.shownBy });
  };
  return [
    p(`Tie (${counted(stage.ties.length, 'cord branch', 'cord branches')}, each now mounted at both ends):`),
    table(
      ['wiring row', 'cord', 'from', 'to', 'bays', 'if it came loose, seen in'],
      stage.ties.map((b, i) => {
        const w = rows.get(branchId({ ...b, driver: '' }));
        return [
          w ? String(w.step) : '',
          b.cord,
          w ? `${w.driver} ${w.driverSide}` : b.driver,
          b.port === '' ? `${b.target} (actuator)` : `${b.target} port ${b.port}`,
          w && w.fromBay !== '' ? `${w.fromBay} → ${w.toBay}` : '',
          loose(i),
        ];
      }),
      { tick: true, mono: [1, 2, 3] },
    ),
    ...(stage.kind === 'gates' ? [p(looseWords(stage))] : []),
  ];
}

/** How many of the stage's ties its check shows come loose, in words. */
function looseWords(stage: BringUpStage): string {
  const shown = stage.loose.filter((l) => l.shownBy !== null).length;
  const unsimulated = stage.loose.filter((l) => !l.simulated).length;
  return `The check below shows ${shown} of these ${counted(stage.ties.length, 'tie')} come loose: with that branch untied, some Z lever stands otherwise after the trial named.${
    unsimulated > 0 ? ` ${counted(unsimulated, 'tie')} not simulated (the bound on the work was reached).` : ''
  } A tie no trial here shows is shown by a later stage's check or the commissioning sheet, or only by eye.`;
}

function gateCheckBlock(stage: BringUpStage): Block[] {
  const own = new Set(stage.gates);
  const rows = stage.trials.map((t, i) => [
    trialName({ stage: stage.number, trial: i }),
    sequenceWords(t),
    positionsWords(t.positions.filter((x) => own.has(x.gate))),
    positionsWords(t.positions.filter((x) => !own.has(x.gate))),
  ]);
  const gateRow = (c: GateCheck): string[] => [c.gate, sightingWords(stage, c.up), sightingWords(stage, c.down)];
  return [
    p(
      'Check: for each row, start with every lever released, do what it says, wait for the levers to come to rest, and compare every Z lever with the row. A Z lever that differs points at the cords just tied into its gate and the gates before it.',
    ),
    table(['trial', 'do this, from every lever released', 'Z levers of this stage', 'Z levers mounted before'], rows, {
      tick: true,
      mono: [0],
    }),
    table(['gate', 'its Z lever up', 'its Z lever down'], stage.checks.map(gateRow), { mono: [0] }),
  ];
}

function checkBlock(input: BringUpSheetInput, stage: BringUpStage): Block[] {
  if (stage.kind === 'frame')
    return [
      p(
        'Check: with nothing tied, turn the drum empty, guards on: it turns freely and evenly, the stop within reach stops it, and nothing rubs or catches.',
      ),
    ];
  if (stage.kind === 'levers')
    return [
      p(
        'Check: pull each lever and release it: it swings freely through its travel and comes back up under its own weight. Its cord is not tied yet: keep the free end clear of the turning drum.',
      ),
    ];
  return gateCheckBlock(stage);
}

function stageTitle(stage: BringUpStage): string {
  if (stage.kind === 'frame') return `Stage ${stage.number}: frame, drums and drive`;
  if (stage.kind === 'levers') return `Stage ${stage.number}: the levers`;
  return `Stage ${stage.number}: ${stage.gates.join(', ')}`;
}

function useSection(plan: BringUpPlan): Section {
  return {
    id: 'use',
    title: 'How to use this sheet',
    blocks: [
      p(
        'Bring the machine up in stages rather than all at once: in each stage, mount the parts listed, tie the cords listed (every cord whose two ends are now both mounted, and no other), then do the stage’s check before going on. A wrong tie then shows in the stage that made it, among a handful of cords. The commissioning sheet tests the finished machine afterwards.',
      ),
      p(
        'A gate has a summing lever Z: it stands down while any port of the gate is pulled, up otherwise. A port whose cords are not all tied yet sees only the tied ones, and rests up when none of them pulls. "Undetermined" is a Z lever that hangs on a latch no step of the sequence has set (it may stand either way: do not judge it).',
      ),
      p(
        `Each check was found by simulating the partly built machine: a search of every sequence of up to ${SEARCH_ACTIONS} hand actions from every lever released, keeping the operating rules and never giving a latch both of its ports at once, with the machine of each tie of the stage come loose stepped beside it, so that some trial shows each tie that can be shown (at most ${SEARCH_POSITIONS} machine positions a stage, and a bound on the whole work). A gate position the search does not reach at its own stage is looked for at the later ones and is said so. A stage mounts at most ${GATES_PER_STAGE} gates (a latch is never split; a slave latch comes with its two transfer gates).`,
      ),
      p(
        `${counted(plan.stages.length, 'stage')}, ${counted(
          plan.stages.reduce((n, s) => n + s.ties.length, 0),
          'cord branch',
          'cord branches',
        )}.`,
      ),
    ],
  };
}

/** The bring-up sheet as a Doc. */
export function bringUpDoc(input: BringUpSheetInput): Doc {
  const words = partWords(input.build, input.profile.documentUnits);
  return {
    title: `Bring-up in stages — ${input.build.machine.name}`,
    subtitle: `${counted(input.plan.stages.length, 'stage')}: mount, tie, check`,
    landscape: true,
    sections: [
      {
        id: 'safety',
        title: 'Safety',
        blocks: [{ kind: 'note', tone: 'caution', title: 'Cautions', items: BRING_UP_CAUTIONS }],
      },
      useSection(input.plan),
      ...input.plan.stages.map((stage): Section => ({
        id: `stage-${stage.number}`,
        title: stageTitle(stage),
        blocks: [
          ...(stage.kind === 'frame' ? [frameBlock(input)] : []),
          ...mountBlock(input, stage, words),
          ...tieBlock(input, stage),
          ...checkBlock(input, stage),
        ],
      })),
    ],
  };
}

/** The bring-up sheet as a printable, self-contained HTML page. */
export const bringUpHtml = (input: BringUpSheetInput): string => renderDocHtml(bringUpDoc(input));

/** The bring-up sheet in Markdown. */
export const bringUpMd = (input: BringUpSheetInput): string => renderDocMd(bringUpDoc(input));

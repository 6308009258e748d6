/**
 * The build sheet's content: what goes to the workshop, as a Doc rendered to HTML and
 * Markdown by build-sheet-html.ts and build-sheet-md.ts.
 *
 * Sections: the machine and its checks; safety cautions (DESIGN §9, in full); the technology
 * profile (its file and description, and every value that differs from the shipped defaults
 * with the source the profile gives); the state table with codes; the set/reset equations per
 * latch and the output equations; the forbidden-input guard; parts and bill of materials; the
 * frame (the drawing, every bay and what it does, the cord to cut); drive margins (capstan
 * equation, each branch's routed loss), the friction headroom, what each output moves (an
 * actuator its load; a flag only its own swing), drum torque and lever force; timing, clock
 * rate and cams; the wiring list; the operating rules with what breaking each one does (from
 * the forbidden-input check); the state diagram and the schematic. Figures come from the
 * checks the pipeline ran; a section whose check is missing says so rather than guessing.
 * Units: lengths, masses and the drum torque follow the profile's `documentUnits`
 * (model/units.ts): metres, grams and N·m, or feet, inches, ounces and lbf·in (a tension is
 * written as the weight that would pull it, so in ounces too); the check summaries it quotes are
 * written from their typed words (`summaryIn`); power stays in W.
 * Pure: no I/O; text only (renderers escape), and the drawings as SVG texts they embed.
 */
import type { Build } from '../model/build.js';
import type { Machine } from '../model/machine.js';
import type { Placement } from '../phases/place/index.js';
import { shorten } from '../model/printable.js';
import type { Profile } from '../physics/profile.js';
import { billOfMaterials } from '../physics/bom.js';
import { budgetWords, driveBudget } from '../physics/drive.js';
import { lossByBranch } from '../physics/routing.js';
import { partWords } from './part-words.js';
import { frictionHeadroom, type Headroom } from '../physics/headroom.js';
import { profileChanges } from '../physics/profile-load.js';
import { withoutCapstanWords } from '../phases/map/counts.js';
import { OPERATING_RULES, RULE_WORDS } from '../sim/hand.js';
import { momentWords, type SnapshotPlace } from '../sim/snapshots.js';
import { findCheck, type CheckResult } from '../checks/results.js';
import { p, table, type Block, type Doc, type Section } from './doc.js';
import { num } from './readable.js';
import { inMetres, quantitiesFor, trimmed, wordsIn } from '../model/units.js';
import { summaryIn } from '../model/build.js';
import { checkBarWords } from './cams-svg.js';
import { bomRowIn } from './bom-csv.js';
import { equationBlocks, stateTableBlocks } from './sheet-logic.js';
import { wiringRows } from './wiring.js';
import { stagesOf, STAGE_WORDS } from './stages.js';
import type { TourClock } from './tour.js';

/** What the build documents are made from (the pipeline's `Built` result fits this shape). */
export interface DocumentsInput {
  readonly build: Build;
  readonly checks: readonly CheckResult[];
  readonly profile: Profile;
  /** The machine as written, for its description and original states (optional). */
  readonly analysed?: { readonly machine: Machine };
  /** The commissioning input sequence; default: the transition tour of the built machine. */
  readonly tour?: readonly TourClock[];
  /** Where every part sits and how every cord runs (the pipeline's); default: placed with the profile. */
  readonly placement?: Placement;
}

/** The drawings the sheets embed, as SVG texts (each is also a file of its own). */
export interface Drawings {
  readonly frame: string;
  readonly stateDiagram: string;
  readonly schematic: string;
}

/** Each drawing as a figure, with the one caption every sheet that embeds it uses. */
export function drawingFigures(drawings: Drawings): Record<keyof Drawings, Block> {
  return {
    frame: {
      kind: 'figure',
      svg: drawings.frame,
      file: 'frame.svg',
      caption: 'The frame, front elevation to scale (the scale is on the drawing)',
    },
    stateDiagram: {
      kind: 'figure',
      svg: drawings.stateDiagram,
      file: 'state-diagram.svg',
      caption: 'The machine as written: states, codes and transitions',
    },
    schematic: {
      kind: 'figure',
      svg: drawings.schematic,
      file: 'schematic.svg',
      caption: 'The parts and cords, left to right through one clock',
    },
  };
}

/** The safety cautions every build sheet, commissioning sheet and guide carries (DESIGN §9). */
export const CAUTIONS: readonly string[] = [
  'Turning drums catch hair, cords, sleeves and fingers: guard them and fit a stop within reach.',
  'Hanging weights fall when a cord breaks: keep them low, enclosed, or caught.',
  'Levers make pinch points.',
  "An exhibit that the public operates needs a risk assessment under the local machinery and exhibit-safety rules (ISO 12100's risk-assessment method is a common starting point).",
  "The tool's figures support, and never replace, a competent person's judgement.",
  'Defer to local codes and licensed practice.',
];

/**
 * How the sheet writes its figures: the workshop's Quantities (model/units.ts) at the sheet's
 * metric precision, and the words of its tables and of the cam templates' check bar.
 */
function unitsOf(profile: Profile) {
  const q = quantitiesFor(profile.documentUnits);
  const inch = q.units === 'inch';
  return {
    q,
    /** A mass or tension in a table cell (its unit, `massUnit`, in the column's head). */
    mass: (g: number): string => q.massCell(g),
    massUnit: q.massUnit,
    /** A mass in running text: `300 g`, `10.6 oz`. */
    massText: (g: number): string => q.mass(g, trimmed(1)),
    /** A dimension in running text, to `digits` in metric: `1.22 m`, `4 ft 0 1/16 in`. */
    len: (m: number, digits = 2): string => q.length(m, inMetres(trimmed(digits))),
    /** A position along the drum in a table cell, and its column's unit. */
    along: (m: number): string => q.alongCell(m),
    alongUnit: q.alongUnit,
    /** A length to cut in a table cell (feet and inches in inch), and its column's head. */
    cut: (m: number): string => (inch ? q.cut(m) : q.cutCell(m, trimmed(3))),
    cutHead: inch ? 'length to cut' : 'length (m)',
    /** The cam template's check bar. */
    checkBar: checkBarWords(q.units),
  };
}
type SheetUnits = ReturnType<typeof unitsOf>;

/** Longest description the sheet prints in full (characters). */
const DESCRIPTION_MAX = 20_000;

function summarySection(input: DocumentsInput): Section {
  const { build, checks } = input;
  const f = build.machine;
  const source = input.analysed?.machine;
  const blocks: Block[] = [];
  // The description's paragraphs (blank-line separated, lines joined), as the author wrote them;
  // a description past DESCRIPTION_MAX characters is shortened (its middle left out).
  for (const para of shorten(source?.description ?? '', DESCRIPTION_MAX).split(/\n\s*\n/))
    if (para.trim() !== '') blocks.push(p(para.replace(/\s*\n\s*/g, ' ').trim()));
  const statesLine =
    source && source.states.length !== f.states.length
      ? `${f.states.length} (minimised from ${source.states.length})`
      : String(f.states.length);
  blocks.push(
    table(
      ['', ''],
      [
        ['machine', f.name],
        ['inputs', f.inputs.join(', ') || '(none)'],
        ['outputs', outputsLine(build, unitsOf(input.profile)) || '(none)'],
        ['states', statesLine],
        ['start state', f.states[f.start]],
        [
          'encoding',
          `${build.encoding.strategy}, ${build.encoding.bits} state ${build.encoding.bits === 1 ? 'bit' : 'bits'}`,
        ],
        ['parts', partsLine(build)],
        ['technology profile', profileName(input.profile)],
      ],
    ),
  );
  const failed = checks.filter((c) => !c.ok);
  if (failed.length > 0)
    blocks.push({
      kind: 'note',
      tone: 'fail',
      title: `${failed.length} of ${checks.length} checks failed — do not build until they pass`,
      items: failed.map((c) => `${c.name}: ${summaryIn(c, input.profile.documentUnits)}`),
    });
  else if (checks.length > 0)
    blocks.push({ kind: 'note', tone: 'ok', title: `All ${checks.length} checks passed`, items: [] });
  if (checks.length > 0)
    blocks.push(
      table(
        ['check', 'result', 'summary'],
        checks.map((c) => [c.name, c.ok ? 'passed' : 'FAILED', summaryIn(c, input.profile.documentUnits)]),
      ),
    );
  else blocks.push(p('No checks were run for this sheet.'));
  return { id: 'machine', title: 'Machine', blocks };
}

/** `fill (actuator, 300 g), bell (flag)`: every output and what shows it. */
function outputsLine(build: Build, u: SheetUnits): string {
  const parts = new Map(build.netlist.parts.map((q) => [q.id, q]));
  return build.machine.outputs
    .map((o) => {
      const part = parts.get(build.signals.outputs[o] ?? '');
      return part?.kind === 'actuator' ? `${o} (actuator, ${u.massText(part.loadG)})` : `${o} (flag)`;
    })
    .join(', ');
}

/** The part counts, with the gates and levers that have no capstan named. */
function partsLine(build: Build): string {
  const c = build.parts;
  const idle = withoutCapstanWords(build.netlist);
  return `${c.gates} gates (${c.latches} latches), ${c.levers} levers, ${c.capstans} capstans${idle ? ` (${idle})` : ''}, ${c.weights} weights, ${c.cords} cords`;
}

/** The profile in a few words: its file and description, or the shipped defaults. */
function profileName(profile: Profile): string {
  const a = profile.about;
  if (!a?.file && !a?.description) return 'the shipped defaults (profiles/default.json)';
  return [a.file, a.description].filter((x) => x !== undefined && x !== '').join(' — ');
}

/** What the sheet says of a changed value with no source: a figure needs one; the units of the papers are a choice. */
function sourceMissing(field: string): string {
  return field === 'documentUnits'
    ? 'the workshop’s choice of units (no figure to source)'
    : 'NOT GIVEN — add it under "sources"';
}

function profileSection(input: DocumentsInput): Section {
  const { profile } = input;
  const changes = profileChanges(profile);
  const blocks: Block[] = [p(`Profile: ${profileName(profile)}.`)];
  if (changes.length === 0)
    blocks.push(p('Every value is the shipped default; profiles/default.json gives the source of each.'));
  else
    blocks.push(
      p(
        'Values that differ from the shipped defaults (profiles/default.json), with the source this profile gives for each. A value without a source is one to measure or to justify before building.',
      ),
      table(
        ['field', 'value', 'default', 'source'],
        changes.map((c) => [c.field, c.value, c.fallback, c.source ?? sourceMissing(c.field)]),
        { mono: [0, 1, 2] },
      ),
    );
  return { id: 'profile', title: 'Technology profile', blocks };
}

function safetySection(): Section {
  return {
    id: 'safety',
    title: 'Safety',
    blocks: [
      {
        kind: 'note',
        tone: 'caution',
        title: 'Cautions — read before building, commissioning or showing the machine',
        items: CAUTIONS,
      },
    ],
  };
}

function guardSection(input: DocumentsInput): Section {
  const g = input.build.guard;
  const fi = findCheck(input.checks, 'forbidden-input');
  const blocks: Block[] = [
    p(
      'A latch must never see both of its active-low ports pulled at once (S̄ = R̄ = 0): both outputs go to 1, and releasing both together leaves the latch unpredictable. The guard keeps the set and reset functions of every master latch apart everywhere the machine can be — unused codes and impossible inputs included.',
    ),
    table(
      ['', ''],
      [
        ['S·R = 0 proven', g.ok ? 'yes' : 'NO'],
        ['method', g.method],
        ['extra gates for the guard', String(g.extraGates)],
        ['extra cords for the guard', String(g.extraCords)],
      ],
    ),
  ];
  if (fi) blocks.push(p(`Forbidden-input check: ${fi.ok ? 'passed' : 'FAILED'} — ${fi.summary}`));
  else blocks.push(p('The forbidden-input check was not run for this sheet.'));
  return { id: 'guard', title: 'Forbidden-input guard', blocks };
}

function partsSection(input: DocumentsInput): Section {
  const { build, profile } = input;
  const c = build.parts;
  const bom = billOfMaterials(build.netlist, profile, input.placement);
  const stages = stagesOf(build.netlist);
  const parts = [...build.netlist.parts].sort((a, b) => stages.compare(a.id, b.id));
  const idle = withoutCapstanWords(build.netlist);
  return {
    id: 'parts',
    title: 'Parts and bill of materials',
    blocks: [
      table(
        ['gates', 'latches', 'levers', 'capstans', 'weights', 'cords'],
        [[c.gates, c.latches, c.levers, c.capstans, c.weights, c.cords].map(String)],
      ),
      ...(idle
        ? [
            p(
              `Capstans: one per gate or lever whose output pulls a cord; ${idle}. The bill of materials, the drum length, the drum torque and the cost count the same ${c.capstans}.`,
            ),
          ]
        : []),
      table(
        ['item', 'kind', 'count', 'each', 'unit', 'total', 'note'],
        bom
          .map((r) => bomRowIn(r, profile.documentUnits))
          .map((r) => [r.item, r.kind, String(r.count), num(r.each, 3), r.unit, num(r.total, 3), r.note]),
        { caption: 'Bill of materials' },
      ),
      table(
        ['id', 'stage', 'kind', 'name', 'ports'],
        parts.map((q) => [
          q.id,
          STAGE_WORDS[stages.stage.get(q.id) ?? 'indicator'],
          q.kind === 'lever' || q.kind === 'gate' || q.kind === 'latch' ? `${q.kind} (${q.role})` : q.kind,
          q.name,
          q.kind === 'gate' ? q.ports.map((x) => x.name).join(', ') : '',
        ]),
        { caption: 'Every part, in stage order', mono: [0] },
      ),
    ],
  };
}

function driveSection(input: DocumentsInput): Section {
  const { build, profile } = input;
  const d = findCheck(input.checks, 'drive');
  const losses = input.placement ? lossByBranch(input.placement.routing) : undefined;
  const budgets = [...(d?.drivers ?? driveBudget(build.netlist, profile, losses))].sort((a, b) => a.margin - b.margin);
  const u = unitsOf(profile);
  const blocks: Block[] = [
    p(
      `Capstan equation: a cord wrapped ${num(profile.wraps)} turns on the drum (μ = ${num(profile.mu)}) holds up to e^(μθ) = ${num(Math.exp(profile.mu * 2 * Math.PI * profile.wraps))} times its hold tension. Each branch's load is multiplied by its routing loss as routed in the frame: 1/η for every pulley it passes, e^(μ_pin·α) for every pin. Margin = available ÷ load; the design rule asks at least ${num(profile.minMargin)}. Weakest first.`,
    ),
    table(
      [
        'driver',
        'kind',
        'cords',
        'turns',
        'branches',
        `hold (${u.massUnit})`,
        `available (${u.massUnit})`,
        `load (${u.massUnit})`,
        'margin',
        'within budget',
      ],
      budgets.map((b) => [
        b.driver,
        b.driverKind,
        b.cords.join(', '),
        num(b.wraps),
        String(b.branches.length),
        u.mass(b.holdG),
        u.mass(b.availableG),
        u.mass(b.loadG),
        num(b.margin),
        b.ok ? 'yes' : 'NO',
      ]),
      { mono: [0, 2] },
    ),
  ];
  for (const b of budgets.filter((x) => !x.ok)) {
    const w = budgetWords(b, profile);
    blocks.push({
      kind: 'note',
      tone: 'fail',
      title: wordsIn(w.message, u.q.units),
      items: w.fixes.map((f) => wordsIn(f, u.q.units)),
    });
  }
  const headroom = d ?? frictionHeadroom(build.netlist, budgets, profile);
  blocks.push(...headroomBlocks(headroom, profile), outputsTable(input, headroom.outputs));
  if (d) {
    blocks.push(
      table(
        ['', ''],
        [
          ['worst drum torque', u.q.torque(d.worstTorqueNm, trimmed(3))],
          ...(d.worstAt ? [['worst drum torque at', worstPlace(d.worstAt)]] : []),
          ['worst drum power', `${num(d.worstPowerW, 2)} W at ${num(profile.drumRpm)} rev/min`],
          ['hardest lever pull', u.massText(d.operatorForceMaxG)],
        ],
      ),
    );
  } else blocks.push(p('The drive check (drum torque and lever force) was not run for this sheet.'));
  return { id: 'drive', title: 'Drive margins', blocks };
}

/** The friction headroom: how far μ may fall before the first capstan slips, and before the design margin goes. */
function headroomBlocks(h: Pick<Headroom, 'muMin' | 'muAtMinMargin'>, profile: Profile): Block[] {
  if (h.muMin === null || h.muAtMinMargin === null) return [p('Friction headroom: no capstan carries a load.')];
  return [
    p(
      `Friction headroom: damp cord, a polished drum or wear lower μ. With μ = ${num(profile.mu)} now, every capstan still holds its load down to μ = ${num(h.muMin, 3)}, and keeps the design margin ${num(profile.minMargin)} down to μ = ${num(h.muAtMinMargin, 3)}. Measure μ on the finished machine (docs/profile.md) and compare.`,
    ),
  ];
}

/** What every output moves: an actuator its load (and the most it could lift), a flag only its own swing. */
function outputsTable(input: DocumentsInput, loads: Headroom['outputs']): Block {
  const { build, profile } = input;
  const parts = new Map(build.netlist.parts.map((q) => [q.id, q]));
  const m = num(profile.minMargin);
  const u = unitsOf(profile);
  const rows = build.machine.outputs.map((o) => {
    const part = parts.get(build.signals.outputs[o] ?? '');
    const l = loads[o];
    if (part?.kind === 'actuator' && l)
      return [o, 'actuator', u.mass(l.loadG), u.mass(l.maxLoadG), num(l.margin), 'its load, by its own capstan'];
    if (part?.kind === 'actuator')
      return [
        o,
        'actuator',
        u.mass(part.loadG),
        '—',
        '—',
        `held ${part.fixed === 1 ? 'lifted' : 'at rest'}: the output is constant`,
      ];
    return [
      o,
      'flag',
      '—',
      '—',
      '—',
      "the Z lever's own swing: no external load (give the output a load to drive one)",
    ];
  });
  return table(
    [
      'output',
      'shown by',
      `load (${u.massUnit})`,
      `most it can lift at margin ${m} (${u.massUnit})`,
      'margin',
      'what it moves',
    ],
    rows,
    {
      caption: 'What each output moves',
    },
  );
}

/** Where the drum torque is worst, in the sheet's words. */
function worstPlace(w: SnapshotPlace): string {
  const code = w.code === '' ? '' : ` (code ${w.code})`;
  return `state ${w.state}${code}, ${momentWords(w)}`;
}

function timingSection(input: DocumentsInput): Section {
  const t = findCheck(input.checks, 'timing');
  if (!t)
    return {
      id: 'timing',
      title: 'Timing and clock rate',
      blocks: [p('The timing check was not run for this sheet.')],
    };
  const s = (x: number): string => `${num(x, 2)} s`;
  const blocks: Block[] = [
    p(
      `Each gate stage takes about ${num(input.profile.stageDelayS, 3)} s (lever swing and cord take-up; an estimate in the technology profile). A latch settles in two stages.`,
    ),
    table(
      ['', ''],
      [
        ['φ1 pulled (longest chain)', s(t.phaseTimesS.phi1)],
        ['dead band after releasing φ1', s(t.deadBandsS.afterPhi1)],
        ['φ2 pulled (longest chain)', s(t.phaseTimesS.phi2)],
        ['dead band after releasing φ2', s(t.deadBandsS.afterPhi2)],
        ['one clock, at least', s(t.clockS)],
        ['fastest safe rate', `${num(t.clocksPerMinute, 1)} clocks per minute`],
        ['crank speed', `${num(t.crankRpm, 1)} turns per minute (one clock per turn)`],
        ['cam window φ1', `${num(t.cam.phi1[0], 1)}° – ${num(t.cam.phi1[1], 1)}°`],
        ['cam window φ2', `${num(t.cam.phi2[0], 1)}° – ${num(t.cam.phi2[1], 1)}°`],
        ['reset settles in', s(t.resetS)],
        [
          'Monte Carlo',
          `${t.monteCarlo.runs} runs (seed ${t.monteCarlo.seed}): ${t.monteCarlo.ok ? 'no race' : (t.monteCarlo.race?.words ?? 'a run differs')}`,
        ],
      ],
    ),
    p(`Longest φ1 chain: ${t.chains.phi1.join(' → ') || '(none)'}.`),
    p(`Longest φ2 chain: ${t.chains.phi2.join(' → ') || '(none)'}.`),
  ];
  if (!t.ok) blocks.push({ kind: 'note', tone: 'fail', title: 'Timing check failed', items: [t.summary] });
  return { id: 'timing', title: 'Timing and clock rate', blocks };
}

function wiringSection(input: DocumentsInput): Section {
  const rows = wiringRows(input.build.netlist, input.profile, input.placement);
  const u = unitsOf(input.profile);
  return {
    id: 'wiring',
    title: 'Wiring list',
    blocks: [
      p(
        'One row per cord branch, in tying order: every cord of one capstan before the next, from the levers to the flags. Bays are written drum·bay. The same list is in wiring.csv; the length of every piece is in cut-list.csv.',
      ),
      table(
        [
          'step',
          'cord',
          'from',
          'side',
          'turns',
          'to',
          'port',
          'bays',
          u.cutHead,
          'routing',
          `load (${u.massUnit})`,
          'margin',
        ],
        rows.map((r) => [
          String(r.step),
          r.cord,
          r.driver,
          r.driverSide,
          num(r.turns),
          r.target,
          r.port,
          r.fromBay === '' ? '' : `${r.fromBay} → ${r.toBay}`,
          r.lengthM === '' ? '' : u.cut(r.lengthM),
          r.routing,
          u.mass(r.loadG),
          num(r.margin),
        ]),
        { tick: true, mono: [1, 2, 5, 6] },
      ),
    ],
  };
}

/** The frame: the drawing, what each bay does, the cord to cut. */
function frameSection(input: DocumentsInput, drawings: Drawings | undefined): Section {
  const pl = input.placement;
  if (!pl) return { id: 'frame', title: 'Frame', blocks: [p('This sheet was made without a placement.')] };
  const words = partWords(input.build, input.profile.documentUnits);
  const f = input.profile.frame;
  const layout = findCheck(input.checks, 'layout');
  const u = unitsOf(input.profile);
  const drums = pl.drums.map((d) => `drum ${d.drum}: ${u.len(d.lengthM)}, ${d.bays.length} bays`).join('; ');
  const blocks: Block[] = [
    p(
      `${pl.drums.length === 1 ? 'One drum' : `${pl.drums.length} drums, stacked ${u.len(f.drumSpacingM)} apart`} (${drums}; the longest allowed is ${u.len(f.longestDrumM)}). Bays are counted from 1 at the visitor end of each drum; operator levers sit at the visitor end, clock and reset levers at the crank end. The order of the bays is ${pl.method === 'exact' ? 'the proven shortest' : pl.method === 'heuristic' ? 'the shortest the search found' : "the netlist's own, which was already the shortest"} in cord along the channel: ${u.len(pl.totalCordM, 1)} of cord in all (${u.len(pl.baselineCordM, 1)} with the bays in netlist order), ${f.turn === 'pulley' ? `${pl.pulleys} pulleys` : `${pl.routing.pins} pins`} (one at each corner where a cord's drop turns along a channel, shared by its branches, and one where each branch rises or leaves the frame).`,
    ),
  ];
  if (layout)
    blocks.push(
      p(`Layout check: ${layout.ok ? 'passed' : 'FAILED'} — ${summaryIn(layout, input.profile.documentUnits)}`),
    );
  if (drawings) blocks.push(drawingFigures(drawings).frame);
  blocks.push(
    table(
      ['drum', 'bay', `from visitor end (${u.alongUnit})`, 'part', 'what it does', 'levers'],
      pl.bays.map((b) => [
        String(b.drum),
        String(b.bay),
        u.along(b.xM),
        b.part,
        words.get(b.part) ?? '',
        b.levers.map((l) => l.name).join(', '),
      ]),
      { caption: 'Every bay, from the visitor end', mono: [3] },
    ),
    p(
      `Cut every cord piece to cut-list.csv (trunk from the hold lever to the drum, then each branch’s piece: a cord that leaves its bay drops once and splits at knots in the channel, and the list says where each piece is tied on). Cut the clock cams from cams.svg printed at 100 %: check its ${u.checkBar} bar first.`,
    ),
  );
  return { id: 'frame', title: 'Frame: bays, drums and cords', blocks };
}

/** The state diagram and the schematic, each on its own page. */
function drawingsSection(drawings: Drawings): Section {
  const figures = drawingFigures(drawings);
  return {
    id: 'drawings',
    title: 'State diagram and schematic',
    blocks: [figures.stateDiagram, figures.schematic],
  };
}

function rulesSection(input: DocumentsInput): Section {
  const fi = findCheck(input.checks, 'forbidden-input');
  const seq = input.build.encoding.bits > 0;
  const blocks: Block[] = [];
  if (seq) {
    blocks.push(
      p('The hand procedure, once per clock:'),
      {
        kind: 'list',
        ordered: true,
        items: ['Set the input levers.', 'Pull φ1, then release it.', 'Pull φ2, then release it.'],
      },
      p('Reset: pull the reset lever and release it, with both clock levers released. Rules:'),
    );
    const rows = OPERATING_RULES.map((r) => {
      const v = fi?.rules.find((x) => x.rule === r);
      return [
        RULE_WORDS[r],
        v ? (v.upsets.length > 0 ? v.words : 'breaking it upsets no latch within the search') : 'not checked',
      ];
    });
    blocks.push(table(['rule', 'what breaking it does (forbidden-input check)'], rows));
    if (fi?.rules.some((r) => r.upsets.length > 0))
      blocks.push({
        kind: 'note',
        tone: 'caution',
        title: 'Signage and interlocks',
        items: [
          'Design the signs, the clock cam or crank, and any interlocks so that the rules above cannot be broken by a visitor.',
        ],
      });
  } else {
    blocks.push(
      p(
        'This machine has one state: it is built without latches or clock levers. Its outputs follow the input levers directly.',
      ),
    );
  }
  const rec = findCheck(input.checks, 'recovery');
  if (rec) blocks.push(p(`Recovery from unused codes: ${rec.ok ? 'passed' : 'FAILED'} — ${rec.summary}`));
  return { id: 'rules', title: 'Operating rules', blocks };
}

/** The whole build sheet; `drawings` embeds the frame drawing, the state diagram and the schematic. */
export function buildSheet(input: DocumentsInput, drawings?: Drawings): Doc {
  const f = input.build.machine;
  return {
    title: `Build sheet — ${f.name}`,
    subtitle: `${f.states.length} states, ${f.inputs.length} inputs, ${f.outputs.length} outputs; ${input.build.parts.gates} gates on ${input.build.parts.capstans} capstans`,
    sections: [
      summarySection(input),
      safetySection(),
      profileSection(input),
      { id: 'states', title: 'State table', blocks: stateTableBlocks(input.build) },
      { id: 'equations', title: 'Set and reset equations', blocks: equationBlocks(input.build) },
      guardSection(input),
      partsSection(input),
      frameSection(input, drawings),
      driveSection(input),
      timingSection(input),
      wiringSection(input),
      rulesSection(input),
      ...(drawings ? [drawingsSection(drawings)] : []),
    ],
  };
}

/**
 * Sections of the parts & forces view, as templates: checks, parts and bill of materials,
 * timing, operating rules. (The charts and the exports live in parts.ts.)
 */
import { html, nothing } from 'lit';
import {
  bomRowIn,
  type CheckResult,
  type DocumentUnits,
  type Quantities,
  quantitiesFor,
  RULE_WORDS,
  type RuleViolation,
  summaryIn,
  type TimingResult,
  withoutCapstanWords,
} from '../../core/index.js';
import type { BuildView, ChecksView } from '../worker/protocol.js';

/** An action that fixes a failing check: its id, the check it fixes (if one), and its words. */
export interface Fix {
  readonly id: 'unused-to-start' | 'defaults';
  readonly check?: string;
  readonly label: string;
}

const CHECK_WORDS: Readonly<Record<string, string>> = {
  'forbidden-input': 'No forbidden latch input',
  'next-state-equivalence': 'Equations match the table',
  equivalence: 'Build behaves as written',
  recovery: 'Recovers from unused codes',
  timing: 'Timing and clock rate',
  drive: 'Force budgets',
};

/** The checks, each in words; a failing check shows the fixes offered for it, and any general fix follows the list. */
export function checksSection(
  checks: readonly CheckResult[] | undefined,
  pending: boolean,
  fixes: readonly Fix[],
  fix: (id: Fix['id']) => void,
  draft = false,
  units: DocumentUnits = 'metric',
) {
  const button = (f: Fix) => html`<button data-fix=${f.id} @click=${() => fix(f.id)}>${f.label}</button>`;
  const general = fixes.filter((f) => f.check === undefined);
  return html`<section class="panel" aria-label="Checks">
    <h2>Checks</h2>
    ${
      !checks
        ? html`<p class="soft">
            ${
              draft
                ? 'The checks run on the final build, once its codes are chosen.'
                : pending
                  ? 'Checking…'
                  : 'Checks run once the machine builds.'
            }
          </p>`
        : html`<ul class="checks">
              ${checks.map((c) => {
                const own = c.ok ? [] : fixes.filter((f) => f.check === c.name);
                return html`<li class=${c.ok ? 'ok' : 'bad'} data-check=${c.name}>
                  <strong>${c.ok ? '✔' : '✘'} ${CHECK_WORDS[c.name] ?? c.name}</strong>
                  <div class="summary">${summaryIn(c, units)}</div>
                  ${own.length > 0 ? html`<div class="fixes">${own.map(button)}</div>` : nothing}
                </li>`;
              })}
            </ul>
            ${general.length > 0 ? html`<div class="fixes">${general.map(button)}</div>` : nothing}`
    }
  </section>`;
}

export function partsSection(b: BuildView) {
  const p = b.build.parts;
  // The workshop's units (the profile's documentUnits): amounts, notes and the lever pull in them.
  const units = b.profile.documentUnits;
  const q = quantitiesFor(units);
  const counts: [string, number][] = [
    ['gates', p.gates],
    ['latches', p.latches],
    ['levers', p.levers],
    ['capstans', p.capstans],
    ['weights', p.weights],
    ['cords', p.cords],
  ];
  return html`<section class="panel" aria-label="Parts and bill of materials">
    <h2>Parts and bill of materials</h2>
    <p class="counts">${counts.map(([k, v]) => html`<span><strong>${v}</strong> ${k}</span>`)}</p>
    ${withoutCapstanWords(b.build.netlist) ? html`<p class="soft">${withoutCapstanWords(b.build.netlist)}.</p>` : nothing}
    <div class="box">
      <table aria-label="Bill of materials">
        <thead>
          <tr>
            <th scope="col">Item</th>
            <th scope="col" class="num">Count</th>
            <th scope="col" class="num">Each</th>
            <th scope="col" class="num">Total</th>
            <th scope="col">Note</th>
          </tr>
        </thead>
        <tbody>
          ${b.bom
            .map((row) => bomRowIn(row, units))
            .map(
              (r) =>
                html`<tr>
                  <td>${r.item}</td>
                  <td class="num">${r.count}</td>
                  <td class="num">${r.each} ${r.unit}</td>
                  <td class="num">${r.total} ${r.unit}</td>
                  <td class="soft">${r.note}</td>
                </tr>`,
            )}
        </tbody>
      </table>
    </div>
    <p class="soft" data-lever-pull>
      Hardest lever pull: ${q.mass(Math.max(0, ...b.forces.map((f) => f.forceG)))} at the weight.
    </p>
  </section>`;
}

const s2 = (x: number): string => (Math.round(x * 100) / 100).toString();

/** Friction headroom (how far μ may fall) and what each actuator lifts against the most it could. */
export function headroomView(c: ChecksView, q: Quantities) {
  return html`${
    c.muMin === null || c.muAtMinMargin === null
      ? nothing
      : html`<p data-headroom>
          Friction headroom: every capstan still holds down to μ = ${c.muMin.toFixed(3)} and keeps the margin of
          ${c.minMargin} down to μ = ${c.muAtMinMargin.toFixed(3)} (μ = ${c.mu} now).
        </p>`
  }
  ${
    c.outputLoads.length === 0
      ? html`<p class="soft">Every output is a flag: it moves only its own lever's swing, no external load.</p>`
      : html`<div class="box">
          <table aria-label="Loads of the outputs">
            <thead>
              <tr>
                <th scope="col">Output</th>
                <th scope="col" class="num">Load</th>
                <th scope="col" class="num">Most at margin ${c.minMargin}</th>
                <th scope="col" class="num">Margin</th>
              </tr>
            </thead>
            <tbody>
              ${c.outputLoads.map(
                (o) =>
                  html`<tr class=${o.margin >= c.minMargin ? 'ok' : 'bad'}>
                    <td>${o.output}</td>
                    <td class="num">${q.mass(o.loadG)}</td>
                    <td class="num">${q.mass(Math.floor(o.maxLoadG))}</td>
                    <td class="num">${s2(o.margin)}</td>
                  </tr>`,
              )}
            </tbody>
          </table>
        </div>`
  }`;
}

export function timingSection(t: TimingResult | undefined) {
  if (!t) return nothing;
  return html`<section class="panel" aria-label="Timing and clock rate">
    <h2>Timing and clock rate</h2>
    <div class="box">
      <table>
        <tbody>
          <tr>
            <th scope="row">φ1 (compute)</th>
            <td class="num">${s2(t.phaseTimesS.phi1)} s</td>
            <td class="soft">${t.chains.phi1.join(' → ')}</td>
          </tr>
          <tr>
            <th scope="row">dead band after φ1</th>
            <td class="num">${s2(t.deadBandsS.afterPhi1)} s</td>
            <td></td>
          </tr>
          <tr>
            <th scope="row">φ2 (transfer)</th>
            <td class="num">${s2(t.phaseTimesS.phi2)} s</td>
            <td class="soft">${t.chains.phi2.join(' → ')}</td>
          </tr>
          <tr>
            <th scope="row">dead band after φ2</th>
            <td class="num">${s2(t.deadBandsS.afterPhi2)} s</td>
            <td></td>
          </tr>
          <tr>
            <th scope="row">one clock</th>
            <td class="num">${s2(t.clockS)} s</td>
            <td>at most ${t.clocksPerMinute} clocks per minute</td>
          </tr>
          <tr>
            <th scope="row">crank</th>
            <td class="num">${t.crankRpm} /min</td>
            <td>cam: φ1 ${t.cam.phi1[0]}°–${t.cam.phi1[1]}°, φ2 ${t.cam.phi2[0]}°–${t.cam.phi2[1]}°</td>
          </tr>
          <tr>
            <th scope="row">reset</th>
            <td class="num">${s2(t.resetS)} s</td>
            <td></td>
          </tr>
        </tbody>
      </table>
    </div>
    <p class=${t.monteCarlo.ok ? 'ok' : 'bad'}>
      ${t.monteCarlo.ok ? `${t.monteCarlo.runs} runs with varied stage delays (seed ${t.monteCarlo.seed}) agree.` : (t.monteCarlo.race?.words ?? 'A run with varied delays disagrees.')}
    </p>
  </section>`;
}

export function rulesSection(rules: readonly RuleViolation[], replay: (r: RuleViolation) => void) {
  return html`<section class="panel" aria-label="Operating rules">
    <h2>Operating rules</h2>
    <p class="soft">
      Per clock: set the input levers, pull φ1, release it, pull φ2, release it. Keep these rules; signage and
      interlocks are designed from what breaking them does.
    </p>
    <ol class="rules">
      ${(rules.length > 0
        ? rules
        : (Object.keys(RULE_WORDS) as (keyof typeof RULE_WORDS)[]).map((rule) => ({
            rule,
            violation: [],
            trace: [],
            upsets: [],
            words: '',
          }))
      ).map(
        (r) =>
          html`<li>
            <strong>${RULE_WORDS[r.rule]}.</strong>
            ${r.words ? html`<div class="soft">${r.upsets.length > 0 ? `Breaking it (${r.trace.map((t) => t.replace(/^\d+\. /, '')).join(', ')}) upsets ${r.upsets.join(', ')}.` : 'No way of breaking it upset a latch in the search.'}</div>` : nothing}
            ${
              r.violation.length > 0 && r.upsets.length > 0
                ? html`<button
                    @click=${() => replay(r)}
                    aria-label=${`Try it in the trial run: break the rule “${RULE_WORDS[r.rule]}”`}
                  >
                    Try it in the trial run
                  </button>`
                : nothing
            }
          </li>`,
      )}
    </ol>
  </section>`;
}

/**
 * The shakedown walk in the worker: the checked build's commissioning sheet (the same rows as
 * the printed sheet, from the documents' sources) and the core's `CordNarrowing` over it, kept
 * per build so each row ticked costs one row per suspect cord. Making the sheet the first time
 * runs the sheet's fault simulation (tens of milliseconds for the examples, seconds for a
 * large build), which is why it is here and not on the page.
 */
import { CordNarrowing, coverageWords, expectedAt, type Built, valuesAt, type StepSight } from '../../core/index.js';
import { sourcesFor } from './exports.js';
import type { WalkSheet, WalkView } from './protocol.js';

const walks = new WeakMap<Built, CordNarrowing>();

/** FNV-1a (32 bits) of a text, in hex: a short digest to tell one sheet from another. */
export function digest(text: string): string {
  let h = 0x811c9dc5;
  for (let i = 0; i < text.length; i++) {
    h ^= text.charCodeAt(i);
    h = Math.imul(h, 0x01000193);
  }
  return (h >>> 0).toString(16).padStart(8, '0');
}

/** The sheet of a checked build as the shakedown shows it. */
export function walkSheet(b: Built): WalkSheet {
  const sources = sourcesFor(b);
  const walk = narrowingOf(b);
  const rows = sources.steps().map((r) => {
    const expected = expectedAt(r, walk.columns);
    return {
      step: r.step,
      clock: r.clock,
      action: r.action,
      expected,
      values: valuesAt(r, walk.columns),
    };
  });
  const print = digest(JSON.stringify([b.build.netlist, walk.columns, rows]));
  return {
    machine: b.build.machine.name,
    print,
    columns: walk.columns,
    rows,
    coverage: coverageWords(sources.faults()),
  };
}

function narrowingOf(b: Built): CordNarrowing {
  let w = walks.get(b);
  if (!w) walks.set(b, (w = new CordNarrowing(sourcesFor(b))));
  return w;
}

/** The walk so far on a checked build (and its sheet, when asked). */
export function walkJob(b: Built, reached: number, sights: readonly StepSight[], sheet: boolean): WalkView {
  const narrowed = narrowingOf(b).narrow(reached, sights);
  return sheet ? { sheet: walkSheet(b), narrowed } : { narrowed };
}

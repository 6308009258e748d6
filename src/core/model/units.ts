/**
 * The workshop's units on what it cuts, hangs and drives: the conversions and the way a workshop
 * writes a length, a mass or a torque, in one place. Pure.
 *
 * Factors are exact by definition (the international yard and pound agreement of 1959; NIST
 * Special Publication 811, appendix B, and NIST Handbook 44, appendix C): 1 in = 0.0254 m,
 * 1 ft = 12 in = 0.3048 m, 1 lb = 0.45359237 kg, 1 oz = 1/16 lb = 28.349523125 g.
 *
 * How a workshop writes them, and why:
 * - A cut length goes in feet and inches to the sixteenth of an inch, rounded up (a piece cut a
 *   little long can be trimmed; one cut short is waste), the fraction reduced: `3 ft 4 5/16 in`,
 *   `7/8 in`, `2 ft`. A sixteenth is the finest mark on the usual workshop tape (common practice).
 *   The count of sixteenths is an integer, so its decimal inches (n / 16) print exactly and a
 *   spreadsheet can sum them.
 * - A size (a cord's or a pulley's diameter, a lever blank's thickness) is nominal, not cut: the
 *   nearest common fraction (to 1/64 in below an inch, to 1/16 in from an inch up) where it lies
 *   within SIZE_FRACTION_TOLERANCE of the size, otherwise decimal inches to 0.001 in. A fraction
 *   misleads where the part was never made to it: a 3 mm cord is 0.118 in, and calling it 1/8 in
 *   (3.175 mm, 6 % more) would send a buyer to the wrong cord.
 * - A mass (a weight to hang, a load) goes in ounces to 0.1 oz, and from a pound up in pounds
 *   and ounces: `0.5 oz`, `1 lb 1.6 oz`.
 * - A load or a pull given in grams-force is a mass to hang or to feel, written as a mass above.
 * - A drum torque goes in pound-force inches to 0.01 lbf·in (1 lbf = 4.4482216152605 N exactly,
 *   so 1 lbf·in = 0.112984829027617 N·m; NIST SP 811 B.8), the unit a US motor or gearbox plate
 *   gives its torque in (common practice).
 * - A length along the frame or of cord in all (a drum, the cord to cut together) goes in feet
 *   and inches to the nearest sixteenth, as a dimension; a position along a drum in a table cell
 *   to 0.1 in.
 * - Power stays in watts (a US motor plate gives watts or horsepower; watts need no second
 *   conversion), times in seconds, angles in degrees, μ and margins are plain numbers.
 *
 * `quantitiesFor(units)` is the one writer of every such figure a person reads (Quantities): the
 * documents, the checks' summaries, the command line and the designer take it, so no file writes
 * metres or grams by hand in inch mode. A metric document keeps the precision each place has
 * always written (its `MetricForm`); the inch forms are fixed here, per kind of quantity.
 * Words that carry figures and outlive the moment they were made (a check's summary, which
 * crosses to the designer's worker and into the documents) are data: `say` keeps each figure
 * typed (`Figure`: its kind, its SI value, its metric form) and `wordsIn(words, units)` writes
 * them, so no one parses a summary back for its numbers.
 *
 * The choice could grow to other systems (`"mixed"`: metric lengths with avoirdupois weights, or
 * `"foot-decimal"`: feet to 0.01 ft as surveyors write them); each would be one more entry here.
 */

/** The units the workshop's documents are written in. The profile's own fields stay SI either way. */
export type DocumentUnits = 'metric' | 'inch';

/** Every value `documentUnits` may take, the default first. */
export const DOCUMENT_UNITS: readonly DocumentUnits[] = ['metric', 'inch'];

/** What a workshop may write for a system of units that is not one of DOCUMENT_UNITS' own words. */
const UNIT_WORDS: Readonly<Record<string, DocumentUnits>> = {
  si: 'metric',
  mm: 'metric',
  millimetre: 'metric',
  millimeter: 'metric',
  metre: 'metric',
  meter: 'metric',
  imperial: 'inch',
  inches: 'inch',
  in: 'inch',
  feet: 'inch',
  foot: 'inch',
  ft: 'inch',
  us: 'inch',
  customary: 'inch',
};

/** The system a word for units most likely means (`"imperial"` → `inch`). */
export function documentUnitsGuess(v: string): DocumentUnits | undefined {
  const w = v.trim().toLowerCase();
  return Object.hasOwn(UNIT_WORDS, w) ? UNIT_WORDS[w] : undefined;
}

/** Metres in one inch, exactly (1959 agreement; NIST SP 811 B.8). */
export const METRES_PER_INCH = 0.0254;
/** Inches in one foot. */
export const INCHES_PER_FOOT = 12;
/** Grams in one avoirdupois pound, exactly (1959 agreement; NIST SP 811 B.8). */
export const GRAMS_PER_POUND = 453.59237;
/** Ounces in one pound. */
export const OUNCES_PER_POUND = 16;
/** Grams in one avoirdupois ounce, exactly: 453.59237 / 16 = 28.349523125. */
export const GRAMS_PER_OUNCE = GRAMS_PER_POUND / OUNCES_PER_POUND;

/** How far a size may lie from its nearest fraction to be written as one (relative). */
export const SIZE_FRACTION_TOLERANCE = 0.005;

/**
 * Slack for binary floating point when rounding up: a length that is a whole number of
 * sixteenths in decimal (0.0254 m) may come out a hair above it in binary. 1e-6 of a sixteenth
 * is 1.6 nanometres, far below any cut.
 */
const SLACK = 1e-6;

/** Inches in `m` metres. */
export const inchesOf = (m: number): number => m / METRES_PER_INCH;
/** Ounces in `g` grams. */
export const ouncesOf = (g: number): number => g / GRAMS_PER_OUNCE;

/** Whole sixteenths of an inch in `m` metres, rounded up (never short). */
export function sixteenthsUp(m: number): number {
  // max(0, …): a length of nothing is 0 sixteenths, never the -0 that ceil gives just below it.
  return Math.max(0, Math.ceil((m / METRES_PER_INCH) * 16 - SLACK));
}

/** Whole sixteenths of an inch in `m` metres, to the nearest. */
export function sixteenthsNearest(m: number): number {
  return Math.round((m / METRES_PER_INCH) * 16);
}

function gcd(a: number, b: number): number {
  return b === 0 ? a : gcd(b, a % b);
}

/** `n/d` reduced: `5/16`, `1/2`. */
function fraction(n: number, d: number): string {
  const g = gcd(n, d);
  return `${n / g}/${d / g}`;
}

/** Inches and a fraction of `d`: `4 5/16 in`, `7/8 in`, `4 in`. */
function inchesWords(whole: number, part: number, d: number): string {
  if (part === 0) return `${whole} in`;
  return whole === 0 ? `${fraction(part, d)} in` : `${whole} ${fraction(part, d)} in`;
}

/** A count of sixteenths in feet and inches, the fraction reduced: `3 ft 4 5/16 in`, `2 ft`, `11 7/8 in`, `1 ft 0 1/2 in`. */
export function feetInches(sixteenths: number): string {
  const perFoot = 16 * INCHES_PER_FOOT;
  const feet = Math.floor(sixteenths / perFoot);
  const rest = sixteenths - feet * perFoot;
  const whole = Math.floor(rest / 16);
  const inches = inchesWords(whole, rest % 16, 16);
  if (feet === 0) return inches;
  if (rest === 0) return `${feet} ft`;
  // `2 ft 0 3/8 in`, never `2 ft 3/8 in`, which a hurried eye reads as 2 3/8 ft.
  return whole === 0 ? `${feet} ft 0 ${inches}` : `${feet} ft ${inches}`;
}

/** Metres rounded up to the millimetre: the metric cut list's cut length (never cut short). */
export function cutMetres(m: number): number {
  return Math.ceil(m * 1000 - 1e-6) / 1000;
}

/**
 * The inch cut of a length, in sixteenths: its metric cut (`cutMetres`) rounded up again to the
 * sixteenth, so that the inch piece is never shorter than the metric piece of the same build.
 */
export const cutSixteenths = (m: number): number => sixteenthsUp(cutMetres(m));

/** A cut length written in feet and inches: `cutSixteenths` of it. */
export const cutFeetInches = (m: number): string => feetInches(cutSixteenths(m));

/** A length (a dimension on a drawing, not a cut) in feet and inches, to the nearest sixteenth. */
export const lengthFeetInches = (m: number): string => feetInches(sixteenthsNearest(m));

/**
 * Feet and inches as `feetInches` writes them, back to sixteenths; undefined for anything else.
 * `3 ft 4 5/16 in` → 645.
 */
export function parseFeetInches(text: string): number | undefined {
  const g = /^(?:(\d+) ft)?(?:(?:^| )(?:(\d+) )?(?:(\d+)\/(\d+) )?in)?$/.exec(text);
  if (!g || text === '') return undefined;
  const [, ft, whole, num, den] = g;
  const hasInches = / ?in$/.test(text);
  if (hasInches && whole === undefined && num === undefined) return undefined;
  if (num !== undefined && (16 % Number(den) !== 0 || Number(num) === 0 || Number(num) >= Number(den)))
    return undefined;
  const frac = num !== undefined ? (Number(num) * 16) / Number(den) : 0;
  return Number(ft ?? 0) * 16 * INCHES_PER_FOOT + Number(whole ?? 0) * 16 + frac;
}

/** Decimal inches of a count of sixteenths (exact: n / 16 is a short binary fraction). */
export const inchesOfSixteenths = (sixteenths: number): number => sixteenths / 16;

/**
 * A size (a diameter, a thickness) in inches: the nearest fraction where it is within
 * SIZE_FRACTION_TOLERANCE (to 1/64 in below an inch, 1/16 in from an inch up), otherwise decimal
 * inches to 0.001 in. `1/8 in`, `1 3/16 in`, `0.118 in`.
 */
export function sizeInches(m: number): string {
  const inches = inchesOf(m);
  const d = inches < 1 ? 64 : 16;
  const parts = Math.round(inches * d);
  if (parts > 0 && Math.abs(parts / d - inches) <= SIZE_FRACTION_TOLERANCE * inches)
    return inchesWords(Math.floor(parts / d), parts % d, d);
  return `${inches.toFixed(3)} in`;
}

/** Ounces to 0.1 oz. */
export const ouncesTenth = (g: number): number => Math.round(ouncesOf(g) * 10) / 10;

/** A mass as a workshop weighs it: ounces to 0.1 oz below a pound, pounds and ounces from a pound up. */
export function massWords(g: number): string {
  const tenths = Math.round(ouncesOf(g) * 10);
  const perPound = OUNCES_PER_POUND * 10;
  if (tenths < perPound) return `${(tenths / 10).toFixed(1)} oz`;
  const pounds = Math.floor(tenths / perPound);
  const rest = tenths - pounds * perPound;
  return rest === 0 ? `${pounds} lb` : `${pounds} lb ${(rest / 10).toFixed(1)} oz`;
}

/** Newtons in one pound-force, exactly (NIST SP 811 B.8: 4.448 221 615 260 5 N). */
export const NEWTONS_PER_POUND_FORCE = 4.4482216152605;
/** Newton-metres in one pound-force inch: 4.4482216152605 × 0.0254 = 0.112984829027617 N·m. */
export const NEWTON_METRES_PER_POUND_FORCE_INCH = NEWTONS_PER_POUND_FORCE * METRES_PER_INCH;
/** Pound-force inches in `nm` newton-metres. */
export const poundForceInchesOf = (nm: number): number => nm / NEWTON_METRES_PER_POUND_FORCE_INCH;

/**
 * How a metric document writes the number of a figure, as data (a figure crosses to the
 * designer's worker and back): `digits` decimals, zeros kept with `zeros`, trailing zeros
 * dropped without; as it is held without `digits`.
 */
export interface Precision {
  readonly digits?: number;
  readonly zeros?: boolean;
}
/** To `digits` decimals, zeros kept: `1.20`. */
export const fixed = (digits: number): Precision => ({ digits, zeros: true });
/** To at most `digits` decimals, trailing zeros dropped: `1.2`. */
export const trimmed = (digits: number): Precision => ({ digits });
/** As it is held: `0.04`, `1.5`. */
export const plain: Precision = {};

const numberWords = (v: number, p: Precision): string => {
  if (p.digits === undefined) return String(v);
  return p.zeros ? v.toFixed(p.digits) : String(Math.round(v * 10 ** p.digits) / 10 ** p.digits);
};

/** A metric length's unit and precision: metres or millimetres (of a length given in metres). */
export interface MetricForm {
  readonly unit: 'm' | 'mm';
  readonly precision: Precision;
}
/** Metres, to `precision`. */
export const inMetres = (precision: Precision): MetricForm => ({ unit: 'm', precision });
/** Millimetres, to `precision`. */
export const inMillimetres = (precision: Precision): MetricForm => ({ unit: 'mm', precision });

const metricLength = (m: number, f: MetricForm): string =>
  f.unit === 'mm' ? `${numberWords(m * 1000, f.precision)} mm` : `${numberWords(m, f.precision)} m`;

/**
 * Every figure a person reads, written in one system of units. Values go in SI (metres, grams,
 * newton-metres); the metric words keep the precision the caller gives (the default is each
 * method's own), the inch words are this module's (see the head of the file).
 */
export interface Quantities {
  readonly units: DocumentUnits;
  /** A length along the frame or of cord: `1.22 m`; `4 ft 0 1/16 in` (nearest 1/16 in). */
  length(m: number, metric?: MetricForm): string;
  /** A length to cut: `0.524 m`; `1 ft 8 5/8 in` (the metric cut rounded up to 1/16 in). */
  cut(m: number, metric?: MetricForm): string;
  /** A size (a radius, a diameter, a pitch): `30 mm`; `1 3/16 in` or `0.315 in` (sizeInches). */
  size(m: number, metric?: MetricForm): string;
  /** A mass, or a load in grams-force: `20 g`; `0.7 oz`, `1 lb 1.6 oz`. */
  mass(g: number, metric?: Precision): string;
  /** A torque: `1.172 N·m`; `10.37 lbf·in`. */
  torque(nm: number, metric?: Precision): string;
  /** The unit of a table column of masses (`g`, `oz`), and a cell of it: the number alone. */
  readonly massUnit: 'g' | 'oz';
  massCell(g: number, metric?: Precision): string;
  /** The unit of a table column of cut lengths (`m`, `in`), and a cell of it: decimal inches of whole sixteenths, rounded up. */
  readonly cutUnit: 'm' | 'in';
  cutCell(m: number, metric?: Precision): string;
  /** The unit of a table column of positions along a drum (`m`, `in`), and a cell of it (0.1 in). */
  readonly alongUnit: 'm' | 'in';
  alongCell(m: number, metric?: Precision): string;
  /** The unit of a chart of torques (`N·m`, `lbf·in`), and a bar's figure in it. */
  readonly torqueUnit: 'N·m' | 'lbf·in';
  torqueValue(nm: number): number;
}

const METRIC_QUANTITIES: Quantities = {
  units: 'metric',
  length: (m, f = inMetres(fixed(2))) => metricLength(m, f),
  cut: (m, f = inMetres(fixed(3))) => metricLength(m, f),
  size: (m, f = inMillimetres(trimmed(1))) => metricLength(m, f),
  mass: (g, p = plain) => `${numberWords(g, p)} g`,
  torque: (nm, p = fixed(3)) => `${numberWords(nm, p)} N·m`,
  massUnit: 'g',
  massCell: (g, p = trimmed(1)) => numberWords(g, p),
  cutUnit: 'm',
  cutCell: (m, p = plain) => numberWords(m, p),
  alongUnit: 'm',
  alongCell: (m, p = trimmed(3)) => numberWords(m, p),
  torqueUnit: 'N·m',
  torqueValue: (nm) => nm,
};

const INCH_QUANTITIES: Quantities = {
  units: 'inch',
  length: (m) => lengthFeetInches(m),
  cut: (m) => cutFeetInches(m),
  size: (m) => sizeInches(m),
  mass: (g) => massWords(g),
  torque: (nm) => `${poundForceInchesOf(nm).toFixed(2)} lbf·in`,
  massUnit: 'oz',
  massCell: (g) => String(ouncesTenth(g)),
  cutUnit: 'in',
  cutCell: (m) => String(inchesOfSixteenths(cutSixteenths(m))),
  alongUnit: 'in',
  alongCell: (m) => String(Math.round(inchesOf(m) * 10) / 10),
  torqueUnit: 'lbf·in',
  torqueValue: (nm) => Math.round(poundForceInchesOf(nm) * 100) / 100,
};

/** The writer of every figure a person reads in `units`. */
export const quantitiesFor = (units: DocumentUnits): Quantities =>
  units === 'inch' ? INCH_QUANTITIES : METRIC_QUANTITIES;

/** A figure inside words: what it measures, its SI value (metres, grams, N·m), and its metric form. */
export type Figure =
  | { readonly kind: 'length' | 'cut' | 'size'; readonly si: number; readonly metric?: MetricForm }
  | { readonly kind: 'mass' | 'torque'; readonly si: number; readonly metric?: Precision };

/** Words with figures in them, as data: text as it is, each figure written in the reader's units. */
export type Words = readonly (string | Figure)[];

/** A length along the frame or of cord (metres). */
export const lengthFigure = (m: number, metric?: MetricForm): Figure => ({ kind: 'length', si: m, metric });
/** A size: a radius, a diameter, a pitch (metres). */
export const sizeFigure = (m: number, metric?: MetricForm): Figure => ({ kind: 'size', si: m, metric });
/** A mass, or a load in grams-force (grams). */
export const massFigure = (g: number, metric?: Precision): Figure => ({ kind: 'mass', si: g, metric });
/** A torque (newton-metres). */
export const torqueFigure = (nm: number, metric?: Precision): Figure => ({ kind: 'torque', si: nm, metric });

const isFigure = (v: Figure | Words): v is Figure => !Array.isArray(v);

/**
 * Words from a template: say`lifts ${massFigure(300)}` → ['lifts ', figure]. Text and numbers go
 * in as JavaScript writes them; a Words value is spliced in whole.
 */
export function say(text: TemplateStringsArray, ...values: readonly (string | number | Figure | Words)[]): Words {
  const out: (string | Figure)[] = [];
  const push = (v: string | Figure): void => {
    const last = out[out.length - 1];
    if (typeof v === 'string' && typeof last === 'string') out[out.length - 1] = last + v;
    else if (v !== '') out.push(v);
  };
  text.forEach((t, i) => {
    push(t);
    if (i >= values.length) return;
    const v = values[i];
    if (typeof v === 'string' || typeof v === 'number') push(String(v));
    else if (isFigure(v)) push(v);
    else for (const w of v) push(w);
  });
  return out;
}

/** `parts` joined by `sep`, as Words. */
export function joinWords(parts: readonly Words[], sep: string): Words {
  return parts.flatMap((w, i) => (i === 0 ? [...w] : [sep, ...w]));
}

/** Words written in `units`: each figure by quantitiesFor(units), in its metric form in metric. */
export function wordsIn(words: Words, units: DocumentUnits): string {
  const q = quantitiesFor(units);
  return words
    .map((w) => {
      if (typeof w === 'string') return w;
      switch (w.kind) {
        case 'length':
          return q.length(w.si, w.metric);
        case 'cut':
          return q.cut(w.si, w.metric);
        case 'size':
          return q.size(w.si, w.metric);
        case 'mass':
          return q.mass(w.si, w.metric);
        case 'torque':
          return q.torque(w.si, w.metric);
      }
    })
    .join('');
}

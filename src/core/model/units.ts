/**
 * The workshop's units on what it cuts and hangs: the conversions and the way a workshop writes
 * a length or a mass, in one place. Pure.
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
 * - Forces and torques stay in SI (newtons, newton-metres): a workshop weighs its pull-up weights
 *   but meets a torque only on a motor's plate, which is in N·m the world over (common practice).
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

/** A dimension in the chosen units: metric as the documents have always written it (`0.40 m`), inch as feet and inches. */
export function dimensionWords(m: number, units: DocumentUnits): string {
  return units === 'inch' ? lengthFeetInches(m) : `${m.toFixed(2)} m`;
}

/**
 * model/units: the workshop's units. Factors against their definitions (the international yard
 * and pound agreement of 1959, as tabled in NIST Special Publication 811, 2008 edition,
 * appendix B.8, and NIST Handbook 44, appendix C); the feet-and-inches writing checked by hand
 * and by a property test (fast-check, fixed seed): rounded up, within a sixteenth, read back.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  cutFeetInches,
  cutMetres,
  cutSixteenths,
  documentUnitsGuess,
  feetInches,
  GRAMS_PER_OUNCE,
  GRAMS_PER_POUND,
  INCHES_PER_FOOT,
  inchesOfSixteenths,
  lengthFeetInches,
  massWords,
  METRES_PER_INCH,
  NEWTON_METRES_PER_POUND_FORCE_INCH,
  NEWTONS_PER_POUND_FORCE,
  fixed,
  inMetres,
  inMillimetres,
  joinWords,
  lengthFigure,
  massFigure,
  ouncesTenth,
  parseFeetInches,
  plain,
  poundForceInchesOf,
  quantitiesFor,
  say,
  sixteenthsUp,
  sizeFigure,
  sizeInches,
  torqueFigure,
  trimmed,
  wordsIn,
} from '../../../src/core/model/units.js';

const SIXTEENTH_M = METRES_PER_INCH / 16;
/**
 * The rounding's allowance for binary floating point: a millionth of a millimetre or of a
 * sixteenth (units.ts, cut-list), a few nanometres — far below any saw or knife.
 */
const SLACK_M = 2e-9;

describe('core/model/units', () => {
  it('uses the exact factors of the 1959 agreement (NIST SP 811 appendix B.8; Handbook 44 appendix C)', () => {
    // NIST SP 811 B.8: inch → metre 2.54 E-02 (exact); foot → metre 3.048 E-01 (exact);
    // pound (avoirdupois) → kilogram 4.5359237 E-01 (exact); ounce (avoirdupois) → kilogram 2.834952 E-02.
    expect(METRES_PER_INCH).toBe(0.0254);
    expect(METRES_PER_INCH * INCHES_PER_FOOT).toBeCloseTo(0.3048, 15);
    expect(GRAMS_PER_POUND).toBe(453.59237);
    // Handbook 44 appendix C: 1 ounce avoirdupois = 28.349 523 125 grams (exact: 1/16 lb).
    expect(GRAMS_PER_OUNCE).toBe(28.349523125);
    // Handbook 44 appendix C: 1 yard = 0.9144 metre exactly; 1 mile = 1.609 344 km exactly.
    expect(36 * METRES_PER_INCH).toBeCloseTo(0.9144, 15);
    expect(5280 * 12 * METRES_PER_INCH).toBeCloseTo(1609.344, 9);
  });

  it('writes feet, inches and reduced sixteenths as a workshop tape reads them', () => {
    expect(feetInches(645)).toBe('3 ft 4 5/16 in'); // 40 5/16 in
    expect(feetInches(14)).toBe('7/8 in');
    expect(feetInches(64)).toBe('4 in');
    expect(feetInches(384)).toBe('2 ft');
    expect(feetInches(200)).toBe('1 ft 0 1/2 in');
    expect(feetInches(1)).toBe('1/16 in');
    expect(feetInches(0)).toBe('0 in');
    // 1 m = 39.370 in (NIST SP 811 B.8, 1/0.0254): 39 6/16 rounded up = 3 ft 3 3/8 in.
    expect(cutFeetInches(1)).toBe('3 ft 3 3/8 in');
    // A length that is a whole number of sixteenths stays itself (no binary slip upwards).
    expect(sixteenthsUp(0.3048)).toBe(192);
    expect(sixteenthsUp(0.0254 * 40.3125)).toBe(645);
    // To the nearest for a dimension: 0.3 m = 11.811 in → 11 13/16 in (nearest and up agree here).
    expect(lengthFeetInches(0.3)).toBe('11 13/16 in');
  });

  it('reads back only what it writes', () => {
    expect(parseFeetInches('3 ft 4 5/16 in')).toBe(645);
    expect(parseFeetInches('2 ft')).toBe(384);
    expect(parseFeetInches('7/8 in')).toBe(14);
    expect(parseFeetInches('1 ft 0 1/2 in')).toBe(200);
    for (const bad of ['', 'in', '3 ft 4 5/3 in', '16/16 in', '3ft', '4 5/16', 'x in'])
      expect(parseFeetInches(bad), bad).toBe(undefined);
  });

  it('rounds every cut length up to within a sixteenth, and reads it back (property, seed 1959)', () => {
    fc.assert(
      fc.property(fc.double({ min: 0, max: 30, noNaN: true }), (m) => {
        const n = sixteenthsUp(m);
        const written = feetInches(n);
        // Never short: the written length is at least the exact length (to the rounding's slack) …
        expect(n * SIXTEENTH_M).toBeGreaterThanOrEqual(m - SLACK_M);
        // … and less than it plus a sixteenth.
        expect(n * SIXTEENTH_M).toBeLessThan(m + SIXTEENTH_M);
        expect(parseFeetInches(written)).toBe(n);
        expect(inchesOfSixteenths(n) * 16).toBe(n);
      }),
      { seed: 1959, numRuns: 2000 },
    );
  });

  it('cuts an inch piece never shorter than the metric piece, and within a sixteenth of it (property, seed 254)', () => {
    fc.assert(
      fc.property(fc.double({ min: 0, max: 30, noNaN: true }), (m) => {
        const metric = cutMetres(m);
        const inch = cutSixteenths(m) * SIXTEENTH_M;
        expect(metric).toBeGreaterThanOrEqual(m - SLACK_M);
        expect(inch).toBeGreaterThanOrEqual(metric - SLACK_M);
        expect(inch).toBeLessThan(metric + SIXTEENTH_M);
      }),
      { seed: 254, numRuns: 2000 },
    );
  });

  it('writes a size as a fraction only where the fraction is true to 0.5 %, else decimal inches', () => {
    expect(sizeInches(0.003175)).toBe('1/8 in'); // a true 1/8 in cord
    expect(sizeInches(0.003)).toBe('0.118 in'); // 3 mm cord: 1/8 in would be 5.8 % too thick
    expect(sizeInches(0.0254 * 1.1875)).toBe('1 3/16 in');
    expect(sizeInches(0.03)).toBe('1.181 in'); // 30 mm: 1 3/16 in is 0.54 % off
    expect(sizeInches(0.0254)).toBe('1 in');
    expect(sizeInches(0.012)).toBe('0.472 in');
  });

  it('weighs in ounces to 0.1 oz, and in pounds and ounces from a pound up', () => {
    // 15 g = 0.529 oz (÷ 28.349523125); 500 g = 17.637 oz = 1 lb 1.6 oz; 1 lb = 453.59237 g exactly.
    expect(ouncesTenth(15)).toBe(0.5);
    expect(massWords(15)).toBe('0.5 oz');
    expect(massWords(500)).toBe('1 lb 1.6 oz');
    expect(massWords(GRAMS_PER_POUND)).toBe('1 lb');
    expect(massWords(GRAMS_PER_POUND * 2.5)).toBe('2 lb 8.0 oz');
    // Just under a pound that rounds to 16.0 oz carries into the pound.
    expect(massWords(GRAMS_PER_POUND - 0.5)).toBe('1 lb');
  });

  it('guesses the system a workshop meant by a common word for it', () => {
    expect(documentUnitsGuess('Imperial')).toBe('inch');
    expect(documentUnitsGuess('SI')).toBe('metric');
    expect(documentUnitsGuess('cubits')).toBe(undefined);
    expect(documentUnitsGuess('constructor')).toBe(undefined);
  });

  it('converts torque by the pound-force (NIST SP 811 appendix B.8: 1 lbf = 4.448 221 615 260 5 N, exact)', () => {
    // NIST SP 811 B.8: pound-force → newton 4.448 222 E+00 (the exact value is 4.4482216152605 N,
    // from the pound 0.45359237 kg and standard gravity 9.80665 m/s²); pound-force inch →
    // newton metre 1.129 848 E-01.
    expect(NEWTONS_PER_POUND_FORCE).toBe(4.4482216152605);
    expect(NEWTONS_PER_POUND_FORCE).toBeCloseTo(0.45359237 * 9.80665, 13);
    expect(NEWTON_METRES_PER_POUND_FORCE_INCH).toBeCloseTo(0.1129848, 7);
    // By hand: 1.172 N·m ÷ 0.112 984 829 N·m/lbf·in = 10.373 lbf·in; 2.130 N·m = 18.852 lbf·in.
    expect(poundForceInchesOf(1.172)).toBeCloseTo(10.373, 3);
    const inch = quantitiesFor('inch');
    expect(inch.torque(1.172)).toBe('10.37 lbf·in');
    expect(inch.torque(2.13)).toBe('18.85 lbf·in');
    expect(inch.torqueUnit).toBe('lbf·in');
    expect(quantitiesFor('metric').torque(1.172)).toBe('1.172 N·m');
  });

  it('writes every kind of figure in each system: metric at the precision given, inch at its own (worked by hand)', () => {
    const metric = quantitiesFor('metric');
    const inch = quantitiesFor('inch');
    // Metric keeps the form each document has always used.
    expect(metric.length(1.2)).toBe('1.20 m');
    expect(metric.length(1.5, inMetres(plain))).toBe('1.5 m');
    expect(metric.length(45.4, inMetres(trimmed(1)))).toBe('45.4 m');
    expect(metric.size(0.03, inMillimetres(plain))).toBe('30 mm');
    expect(metric.size(0.008, inMetres(trimmed(3)))).toBe('0.008 m');
    expect(metric.mass(20)).toBe('20 g');
    expect(metric.mass(16.66, trimmed(1))).toBe('16.7 g');
    expect(metric.cut(0.524, inMetres(fixed(2)))).toBe('0.52 m');
    // Inch, by hand: 1.22 m / 0.0254 = 48.0315 in; × 16 = 768.504 → 769 sixteenths to the nearest
    // = 48 1/16 in = 4 ft 0 1/16 in.
    expect(inch.length(1.22)).toBe('4 ft 0 1/16 in');
    // 1.5 m = 59.055 in = 4 ft 11 1/16 in (59.055 × 16 = 944.9 → 945).
    expect(inch.length(1.5)).toBe('4 ft 11 1/16 in');
    // 0.04 m = 1.5748 in: 1 9/16 in is 0.8 % off, past the 0.5 % a fraction may be, so 1.575 in.
    expect(inch.size(0.04)).toBe('1.575 in');
    // 30 mm = 1.1811 in (1 3/16 in = 1.1875 in is 0.54 % off): 1.181 in.
    expect(inch.size(0.03)).toBe('1.181 in');
    // 20 g = 0.705 oz → 0.7 oz; 450 g = 15.873 oz → 15.9 oz.
    expect(inch.mass(20)).toBe('0.7 oz');
    expect(inch.mass(450)).toBe('15.9 oz');
    expect(inch.massCell(450)).toBe('15.9');
    expect(inch.massUnit).toBe('oz');
    // A cut of 0.524 m = 20.630 in, rounded up to 20 11/16 in = 20.6875 in.
    expect(inch.cut(0.524)).toBe('1 ft 8 11/16 in');
    expect(inch.cutCell(0.524)).toBe('20.6875');
    // A position along the drum to 0.1 in: 0.1 m = 3.937 in → 3.9.
    expect(inch.alongCell(0.1)).toBe('3.9');
  });

  it('keeps words with typed figures as data, written the same as plain text in metric', () => {
    const w = say`drum ${lengthFigure(1.22)} long, radius ${sizeFigure(0.04, inMetres(plain))}; pull ${massFigure(20)}; ${joinWords(
      [say`torque ${torqueFigure(1.172)}`, ['at rest']],
      '; ',
    )}`;
    expect(wordsIn(w, 'metric')).toBe('drum 1.22 m long, radius 0.04 m; pull 20 g; torque 1.172 N·m; at rest');
    expect(wordsIn(w, 'inch')).toBe(
      'drum 4 ft 0 1/16 in long, radius 1.575 in; pull 0.7 oz; torque 10.37 lbf·in; at rest',
    );
    // Plain data: a structured clone (the designer's worker) keeps it whole.
    expect(wordsIn(structuredClone(w), 'inch')).toBe(wordsIn(w, 'inch'));
  });
});

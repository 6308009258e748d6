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
  ouncesTenth,
  parseFeetInches,
  sixteenthsUp,
  sizeInches,
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
});

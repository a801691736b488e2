// Vehicle identification number checks: ISO 3779 and 49 CFR 565 (references.md §3).
import { z } from 'zod';

export interface VinCheck {
  /** the input, upper case with all whitespace removed */
  vin: string;
  valid: boolean;
  /** character in position 9, when the VIN has 17 characters */
  checkDigit: string | null;
  /** what position 9 should be, when every character can be transliterated */
  expectedCheckDigit: string | null;
  wmi: string | null;
  vds: string | null;
  vis: string | null;
  modelYears: number[];
  /** what no VIN can be (length, characters): the VIN is refused */
  errors: string[];
  /**
   * North American rules (49 CFR 565: check digit, model-year code) that this VIN does not follow.
   * ISO 3779 requires neither outside North America, so these never refuse a VIN.
   */
  warnings: string[];
}

export const VIN_LENGTH = 17;

// 49 CFR 565.15(c) transliteration; I, O and Q are never used.
const letterValues: Record<string, number> = {
  A: 1, B: 2, C: 3, D: 4, E: 5, F: 6, G: 7, H: 8,
  J: 1, K: 2, L: 3, M: 4, N: 5, P: 7, R: 9,
  S: 2, T: 3, U: 4, V: 5, W: 6, X: 7, Y: 8, Z: 9,
};
const weights = [8, 7, 6, 5, 4, 3, 2, 10, 0, 9, 8, 7, 6, 5, 4, 3, 2] as const;

/** Position 10 cycle; A = 1980 and again 2010. Never U, Z or 0 (nor I, O, Q). */
export const MODEL_YEAR_CODES = 'ABCDEFGHJKLMNPRSTVWXY123456789';

/** Transliterated value of one VIN character (49 CFR 565.15(c)), or null if it cannot appear in a VIN. */
export function vinCharValue(ch: string): number | null {
  if (/^[0-9]$/.test(ch)) return Number(ch);
  return letterValues[ch.toUpperCase()] ?? null;
}
const valueOf = vinCharValue;

function normalise(input: string): string {
  return String(input).replace(/\s+/g, '').toUpperCase();
}

/** Sum of transliterated values times position weights; the check digit is this mod 11. */
export function vinWeightedSum(vin17: string): number {
  const vin = normalise(vin17);
  if (vin.length !== VIN_LENGTH) throw new RangeError(`a VIN has 17 characters; this one has ${vin.length}`);
  let sum = 0;
  for (let i = 0; i < VIN_LENGTH; i++) {
    const v = valueOf(vin.charAt(i));
    if (v === null) throw new RangeError(`position ${i + 1} ("${vin.charAt(i)}") cannot be used in a VIN`);
    sum += v * (weights[i] ?? 0);
  }
  return sum;
}

/** Check digit for a 17-character VIN ('X' for remainder 10). Position 9 itself is ignored. */
export function vinCheckDigit(vin17: string): string {
  const r = vinWeightedSum(vin17) % 11;
  return r === 10 ? 'X' : String(r);
}

export interface ModelYearOptions {
  /**
   * Apply the light-vehicle rule (passenger cars, multipurpose vehicles and
   * trucks up to 10,000 lb GVWR): position 7 numeric means 1980-2009,
   * alphabetic 2010-2039. Default true. Pass false for heavy vehicles,
   * trailers and motorcycles, where both cycles stay possible.
   */
  lightVehicle?: boolean;
}

/**
 * Model years that position 10 can stand for, ascending. Returns [] when
 * position 10 is not a model-year code or the VIN is not 17 characters.
 */
export function modelYearCandidates(vin17: string, options: ModelYearOptions = {}): number[] {
  const vin = normalise(vin17);
  if (vin.length !== VIN_LENGTH) return [];
  const idx = MODEL_YEAR_CODES.indexOf(vin.charAt(9));
  if (idx < 0) return [];
  const years = [1980 + idx, 2010 + idx];
  if (options.lightVehicle === false) return years;
  const seventh = vin.charAt(6);
  if (/^[0-9]$/.test(seventh)) return [1980 + idx];
  if (valueOf(seventh) !== null) return [2010 + idx];
  return years;
}

/** Position-10 code for a model year 1980-2039, or null. */
export function modelYearCode(year: number): string | null {
  if (!Number.isInteger(year) || year < 1980 || year > 2039) return null;
  return MODEL_YEAR_CODES.charAt((year - 1980) % 30);
}

function characterErrors(vin: string): string[] {
  const errors: string[] = [];
  [...vin].forEach((ch, i) => {
    if (/^[IOQ]$/.test(ch)) errors.push(`position ${i + 1} is "${ch}": the letters I, O and Q are never used in a VIN.`);
    else if (!/^[A-Z0-9]$/.test(ch)) errors.push(`position ${i + 1} is "${ch}": a VIN has only letters and digits.`);
  });
  return errors;
}

/** Full check of one VIN; each problem is one sentence in `errors`. */
export function checkVin(input: string): VinCheck {
  const vin = normalise(input ?? '');
  const errors: string[] = [];
  if (vin.length === 0) errors.push('Enter a VIN: 17 letters and digits.');
  else if (vin.length !== VIN_LENGTH) errors.push(`A VIN has 17 characters; this one has ${vin.length}.`);
  const charErrors = characterErrors(vin);
  errors.push(...charErrors);

  const full = vin.length === VIN_LENGTH;
  const checkDigit = full ? vin.charAt(8) : null;
  const expectedCheckDigit = full && charErrors.length === 0 ? vinCheckDigit(vin) : null;
  const warnings: string[] = [];
  if (checkDigit !== null && expectedCheckDigit !== null && checkDigit !== expectedCheckDigit) {
    warnings.push(
      `Check digit does not match (position 9 is ${checkDigit}, the VIN computes ${expectedCheckDigit}): only required for North American vehicles.`,
    );
  }
  const yearChar = full ? vin.charAt(9) : '';
  if (full && charErrors.length === 0 && !MODEL_YEAR_CODES.includes(yearChar)) {
    warnings.push(
      `Position 10 is "${yearChar}", which is not a North American model-year code: the year is not read from it (only required for North American vehicles).`,
    );
  }
  return {
    vin,
    valid: errors.length === 0,
    checkDigit,
    expectedCheckDigit,
    wmi: full ? vin.slice(0, 3) : null,
    vds: full ? vin.slice(3, 8) : null,
    vis: full ? vin.slice(9) : null,
    modelYears: full ? modelYearCandidates(vin) : [],
    errors: errors.map(capitalise),
    warnings,
  };
}

function capitalise(s: string): string {
  return s.charAt(0).toUpperCase() + s.slice(1);
}

/** True when the VIN also follows every North American rule (49 CFR 565). */
export function followsNorthAmericanRules(check: VinCheck): boolean {
  return check.valid && check.warnings.length === 0;
}

/** A VIN field: trims and upper-cases, fails with checkVin's first error (warnings never refuse). */
export const vinSchema: z.ZodType<string> = z
  .string()
  .transform((v) => normalise(v))
  .superRefine((vin, ctx) => {
    const r = checkVin(vin);
    if (!r.valid) ctx.addIssue({ code: 'custom', message: r.errors[0] ?? 'Invalid VIN.' });
  });

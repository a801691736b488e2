// Generic misfire codes: P0300 random/multiple, P0301-P0312 cylinder N (references.md §1).
import { parseDtc } from './dtc-format';

export const MAX_MISFIRE_CYLINDER = 12;

/** 5 -> 'P0305'. Only cylinders 1-12 have a generic misfire code. */
export function misfireCodeForCylinder(cylinder: number): string | null {
  if (!Number.isInteger(cylinder) || cylinder < 1 || cylinder > MAX_MISFIRE_CYLINDER) return null;
  return `P03${String(cylinder).padStart(2, '0')}`;
}

function codeOf(input: string): string | null {
  const r = parseDtc(input);
  return r.ok ? r.dtc.code : null;
}

/** True for P0300-P0312 (an FTB, if given, is ignored). */
export function isMisfireCode(code: string): boolean {
  const c = codeOf(code);
  return c !== null && /^P03(0\d|1[0-2])$/.test(c);
}

/** 'P0305' -> 5; P0300 (random/multiple) and anything else -> null. */
export function cylinderForMisfireCode(code: string): number | null {
  const c = codeOf(code);
  if (c === null || !isMisfireCode(c)) return null;
  const n = Number(c.slice(3));
  return n >= 1 ? n : null;
}

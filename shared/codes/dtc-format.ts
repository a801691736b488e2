// Trouble code syntax, SAE J2012 / ISO 15031-6: letter P/C/B/U, digit 0-3,
// three hex characters, optionally a failure type byte (FTB) of two hex digits.

export interface Dtc {
  /** 'P0302', normalised to upper case */
  code: string;
  /** failure type byte, two upper hex digits, e.g. '13' */
  ftb?: string;
  /** 'P0302-13', or 'P0302' when there is no FTB */
  full: string;
}

export type DtcParseResult = { ok: true; dtc: Dtc } | { ok: false; reason: string };

/** Thrown by functions that need a well-formed code and were given something else. */
export class InvalidDtcError extends Error {
  constructor(
    readonly input: string,
    readonly reason: string,
  ) {
    super(`"${input}" is not a trouble code: ${reason}`);
    this.name = 'InvalidDtcError';
  }
}

export const dtcLetters = ['P', 'C', 'B', 'U'] as const;
export type DtcLetter = (typeof dtcLetters)[number];

const HEX = /^[0-9A-F]$/;
const FTB = /^[0-9A-F]{2}$/;

export const dtcReasons = {
  empty: 'enter a trouble code, e.g. P0302',
  letter: 'first letter must be P, C, B or U',
  digit: 'second character must be 0-3',
  hex: 'characters 3-5 must be hex 0-9 or A-F',
  length: 'a trouble code has 5 characters (e.g. P0302), or 7 with a failure type byte (P0302-13)',
  ftb: 'failure type byte must be two hex digits (e.g. P0302-13)',
} as const;

/** Checks the five-character code part; returns a reason or null. */
function codeProblem(code: string): string | null {
  const [first, second, ...rest] = code;
  if (first === undefined) return dtcReasons.empty;
  if (!(dtcLetters as readonly string[]).includes(first)) return dtcReasons.letter;
  if (second === undefined) return dtcReasons.length;
  if (!/^[0-3]$/.test(second)) return dtcReasons.digit;
  if (!rest.slice(0, 3).every((c) => HEX.test(c))) return dtcReasons.hex;
  if (code.length !== 5) return dtcReasons.length;
  return null;
}

/** Splits '  p0302-13 ' style input into code part and FTB part. */
function splitInput(input: string): { code: string; ftb: string | undefined } {
  const s = input.trim().toUpperCase().replace(/[\u2010-\u2015]/g, '-');
  const sep = /^(\S+?)\s*-\s*(\S*)$|^(\S+)\s+(\S+)$/.exec(s);
  if (sep) return { code: sep[1] ?? sep[3] ?? '', ftb: sep[2] ?? sep[4] ?? '' };
  // Compact 'P030213': seven characters whose first five form a code.
  if (s.length === 7 && codeProblem(s.slice(0, 5)) === null) return { code: s.slice(0, 5), ftb: s.slice(5) };
  return { code: s, ftb: undefined };
}

/**
 * Parses one trouble code. Accepts any case and surrounding spaces, and an FTB
 * written 'P0302-13', 'P0302 13' or compact 'P030213' (the whole input is one
 * code here, so the compact form is unambiguous; free-text search is stricter,
 * see findDtcsInText).
 */
export function parseDtc(input: string): DtcParseResult {
  if (typeof input !== 'string' || input.trim() === '') return { ok: false, reason: dtcReasons.empty };
  const { code, ftb } = splitInput(input);
  const problem = codeProblem(code);
  if (problem) return { ok: false, reason: problem };
  if (ftb === undefined) return { ok: true, dtc: { code, full: code } };
  if (!FTB.test(ftb)) return { ok: false, reason: dtcReasons.ftb };
  return { ok: true, dtc: { code, ftb, full: `${code}-${ftb}` } };
}

export function isValidDtc(input: string): boolean {
  return parseDtc(input).ok;
}

/** parseDtc that throws InvalidDtcError, for callers that were promised a code. */
export function requireDtc(input: string): Dtc {
  const r = parseDtc(input);
  if (!r.ok) throw new InvalidDtcError(String(input), r.reason);
  return r.dtc;
}

/** Codes sharing the first four characters are one family: 'P0302' -> 'P030'. */
export function dtcFamily(code: string): string {
  return requireDtc(code).code.slice(0, 4);
}

// Trouble codes as they travel on the bus, SAE J1979 / ISO 15031-5 (references.md §2).
// Service $03 packs a code in two bytes: bits 15-14 letter (00 P, 01 C, 10 B,
// 11 U), bits 13-12 the second digit, then three hex nibbles. 0x0000 is padding.
import { dtcLetters, requireDtc } from './dtc-format';

export class DtcDecodeError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'DtcDecodeError';
  }
}

function cleanHex(hex: string): string {
  if (typeof hex !== 'string') throw new DtcDecodeError('expected a string of hex digits');
  const s = hex.replace(/\s+/g, '').toUpperCase();
  const bad = /[^0-9A-F]/.exec(s);
  if (bad) throw new DtcDecodeError(`"${bad[0]}" is not a hex digit (0-9, A-F)`);
  return s;
}

function pairToCode(pair: string): string | null {
  if (pair === '0000') return null;
  const nibble = parseInt(pair.charAt(0), 16);
  return `${dtcLetters[nibble >> 2]}${nibble & 3}${pair.slice(1)}`;
}

/** '0133' -> 'P0133'; '0000' (padding) -> null. Spaces are ignored ('01 33'). */
export function decodeDtcPair(hex4: string): string | null {
  const s = cleanHex(hex4);
  if (s.length !== 4) throw new DtcDecodeError(`a code takes 4 hex digits (2 bytes), got ${s.length}`);
  return pairToCode(s);
}

/** 'C0035' -> '4035'. Only the two-byte code is encoded; an FTB is dropped (see encodeDtcTriple). */
export function encodeDtcPair(code: string): string {
  const { code: c } = requireDtc(code);
  const letter = dtcLetters.indexOf(c.charAt(0) as (typeof dtcLetters)[number]);
  const first = ((letter << 2) | Number(c.charAt(1))).toString(16).toUpperCase();
  return first + c.slice(2);
}

/** '0133C100' -> ['P0133', 'U0100']; padding pairs are skipped. */
export function decodeDtcPairs(hex: string): string[] {
  const s = cleanHex(hex);
  if (s.length % 2 !== 0) throw new DtcDecodeError(`odd number of hex digits (${s.length}): bytes come in pairs of digits`);
  if (s.length % 4 !== 0) throw new DtcDecodeError(`${s.length / 2} bytes do not split into 2-byte codes`);
  const out: string[] = [];
  for (let i = 0; i < s.length; i += 4) {
    const code = pairToCode(s.slice(i, i + 4));
    if (code) out.push(code);
  }
  return out;
}

/**
 * A whole service $03 (or $07/$0A) response, starting with its service byte
 * 43/47/4A: '43 01 35' -> ['P0135']. After that byte, an odd byte count means
 * the first byte is the CAN code count, which must match the codes carried.
 */
export function decodeService03Response(hex: string): string[] {
  const s = cleanHex(hex);
  if (s.length % 2 !== 0) throw new DtcDecodeError(`odd number of hex digits (${s.length}): bytes come in pairs of digits`);
  if (!/^(43|47|4A)/.test(s)) throw new DtcDecodeError('a trouble code response starts with 43, 47 or 4A');
  let body = s.slice(2);
  if ((body.length / 2) % 2 === 1) {
    const count = parseInt(body.slice(0, 2), 16);
    const pairs = (body.length - 2) / 4;
    if (count !== pairs) throw new DtcDecodeError(`response says ${count} codes but carries ${pairs}`);
    body = body.slice(2);
  }
  return decodeDtcPairs(body);
}

/** Three-byte code as UDS reports it: 'P0302-13' -> '030213' (missing FTB -> 00). */
export function encodeDtcTriple(code: string): string {
  const dtc = requireDtc(code);
  return encodeDtcPair(dtc.code) + (dtc.ftb ?? '00');
}

/** '030213' -> 'P0302-13'; '000000' -> null. */
export function decodeDtcTriple(hex6: string): string | null {
  const s = cleanHex(hex6);
  if (s.length !== 6) throw new DtcDecodeError(`a 3-byte code takes 6 hex digits, got ${s.length}`);
  const code = pairToCode(s.slice(0, 4));
  if (code === null) return s.slice(4) === '00' ? null : `P0000-${s.slice(4)}`;
  return `${code}-${s.slice(4)}`;
}

function requireByte(value: number, what: string): number {
  if (!Number.isInteger(value) || value < 0 || value > 0xff) throw new RangeError(`${what} must be a byte 0-255, got ${value}`);
  return value;
}

/** Service $01 PID $01 byte A: bit 7 MIL, bits 6-0 count of confirmed codes. */
export function decodeMilStatus(byteA: number): { milOn: boolean; storedCodes: number } {
  const a = requireByte(byteA, 'PID $01 byte A');
  return { milOn: (a & 0x80) !== 0, storedCodes: a & 0x7f };
}

// Trouble codes in a typed query. Looser than findDtcsInText (case notes):
// a search box gets 'p0302', 'P0302-13', 'P030213' and 'P 0302'.
import { parseDtc } from '../codes';
import { consume } from './text';

// The spaced form ('P 0302') only for P: 'B 2000' is more often a reading.
const CODE_IN_QUERY =
  /(?<![\p{L}\p{N}])(?:([PCBU])-?|(P) )([0-3][0-9A-F]{3})(?:-([0-9A-F]{2})|([0-9A-F]{2}))?(?![\p{L}\p{N}])/giu;

export interface QueryCodes { rest: string; codes: string[]; full: string[] }

/** Finds codes, masks them in the text; `codes` are 5-character, `full` keep any FTB. */
export function extractCodes(text: string): QueryCodes {
  const codes: string[] = [];
  const full: string[] = [];
  const rest = consume(text, CODE_IN_QUERY, (m) => {
    const letter = m[1] ?? m[2] ?? '';
    const ftb = m[4] ?? m[5];
    const r = parseDtc(ftb ? `${letter}${m[3]}-${ftb}` : `${letter}${m[3]}`);
    if (!r.ok) return false;
    if (!codes.includes(r.dtc.code)) codes.push(r.dtc.code);
    if (!full.includes(r.dtc.full)) full.push(r.dtc.full);
    return true;
  });
  return { rest, codes, full };
}

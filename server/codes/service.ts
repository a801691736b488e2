// Trouble-code reference and decoding over the pure library in shared/codes.
import {
  classifyDtc,
  codeReferenceNote,
  cylinderForMisfireCode,
  decodeDtcPairs,
  DtcDecodeError,
  describeFtb,
  dtcScopeLabels,
  dtcSystemLabels,
  encodeDtcPair,
  isMisfireCode,
  listCodeReference,
  lookupCodeTitle,
  parseDtc,
  type DtcClassification,
  type DtcSystem,
} from '../../shared/codes';
import type { CodeDetail, CodeListQuery, CodeListResponse } from '../../shared/schemas/codes';
import { expandTerm } from '../../shared/terms';
import { badRequest } from '../http/errors';

const systemOfLetter: Record<string, DtcSystem> = { P: 'powertrain', C: 'chassis', B: 'body', U: 'network' };

function secondCharMeaning(c: DtcClassification): string {
  if (c.scope === 'generic') return 'generic: the same meaning on every make (ISO/SAE defined)';
  if (c.scope === 'manufacturer') return 'manufacturer specific: defined by the vehicle maker';
  return 'reserved for future use';
}

function thirdCharMeaning(c: DtcClassification): string {
  return c.groupLabel ? `subsystem group: ${c.groupLabel.toLowerCase()}` : `subsystem or area within the ${c.system} system`;
}

function lastCharsMeaning(code: string): string {
  if (code === 'P0300') return 'random or multiple cylinders misfiring';
  const cylinder = cylinderForMisfireCode(code);
  return cylinder !== null ? `cylinder ${cylinder} is the one misfiring` : 'the fault within that group';
}

/** What each character of the code says, in plain words. */
function structureOf(code: string, c: DtcClassification, ftb: CodeDetail['ftb']): CodeDetail['structure'] {
  const parts: CodeDetail['structure'] = [
    { chars: code.charAt(0), position: 'letter', meaning: `${dtcSystemLabels[c.system]} system` },
    { chars: code.charAt(1), position: 'second character', meaning: secondCharMeaning(c) },
    { chars: code.charAt(2), position: 'third character', meaning: thirdCharMeaning(c) },
    { chars: code.slice(3), position: 'fourth and fifth', meaning: lastCharsMeaning(code) },
  ];
  if (ftb) {
    const meaning = ftb.meaning ? `${ftb.meaning} (${ftb.category})` : ftb.category;
    parts.push({ chars: ftb.value, position: 'failure type byte', meaning });
  }
  return parts;
}

/** Decoded structure and title of one code; a malformed code is a 400 carrying the reason. */
export function describeCode(input: string): CodeDetail {
  const parsed = parseDtc(input);
  if (!parsed.ok) throw badRequest(`"${input.slice(0, 20)}" is not a trouble code: ${parsed.reason}.`, { code: parsed.reason });
  const { code, ftb, full } = parsed.dtc;
  const c = classifyDtc(code);
  const ftbView = ftb ? describeFtb(ftb) : undefined;
  return {
    code,
    full,
    system: c.system,
    systemLabel: dtcSystemLabels[c.system],
    scope: c.scope,
    scopeLabel: dtcScopeLabels[c.scope],
    group: c.group,
    groupLabel: c.groupLabel,
    title: lookupCodeTitle(code),
    titleNote: codeReferenceNote,
    pair: encodeDtcPair(code),
    misfire: isMisfireCode(code) ? { cylinder: cylinderForMisfireCode(code) } : null,
    structure: structureOf(code, c, ftbView),
    ...(ftbView ? { ftb: ftbView } : {}),
  };
}

/** J1979 byte pairs to codes; bad hex is a 400 with the reason. */
export function decodePairs(hex: string): string[] {
  try {
    return decodeDtcPairs(hex);
  } catch (err) {
    if (err instanceof DtcDecodeError) throw badRequest(`Cannot decode those bytes: ${err.message}.`, { pairs: err.message });
    throw err;
  }
}

const CODE_PREFIX = /^[PCBU]([0-3][0-9A-F]{0,3})?$/i;

/** Each query word must appear in the title, as written or as a J1930 synonym ("cyl" finds "Cylinder"). */
function titleMatcher(q: string): (title: string) => boolean {
  const words = q.toLowerCase().split(/[\s,/]+/).filter(Boolean);
  // Word starts only: "2" finds "Bank 2", not "P0012"'s "12".
  const startOf = (w: string) => new RegExp(`(^|[^a-z0-9])${w.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')}`, 'i');
  const alternatives = words.map((w) => [w, ...expandTerm(w)].map(startOf));
  return (title) => alternatives.every((alts) => alts.some((re) => re.test(title)));
}

/** Browse or look up the reference: a code prefix ('P03', 'p0302') or words in titles, paginated. */
export function listCodes(query: CodeListQuery): CodeListResponse {
  const q = query.q.trim();
  const exact = parseDtc(q);
  const asPrefix = CODE_PREFIX.test(q) ? q.toUpperCase() : exact.ok ? exact.dtc.code : null;
  const inTitle = titleMatcher(q);
  const matches = (e: { code: string; title: string }) => (asPrefix !== null ? e.code.startsWith(asPrefix) : inTitle(e.title));
  const all = listCodeReference()
    .map((e) => ({ ...e, system: systemOfLetter[e.code.charAt(0)] ?? 'powertrain' }))
    .filter((e) => (!query.system || e.system === query.system) && (q === '' || matches(e)));
  const start = (query.page - 1) * query.pageSize;
  return {
    codes: all.slice(start, start + query.pageSize),
    total: all.length,
    page: query.page,
    pageSize: query.pageSize,
    note: codeReferenceNote,
    exact: exact.ok ? exact.dtc.full : null,
  };
}

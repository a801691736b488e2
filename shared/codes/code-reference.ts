// Generic code titles from content/codes/generic-codes.json (see its README for provenance).
import data from '../../content/codes/generic-codes.json';
import { parseDtc } from './dtc-format';

export interface CodeReferenceEntry {
  code: string;
  title: string;
}

const entries: readonly CodeReferenceEntry[] = data.codes.map(({ code, title }) => ({ code, title }));
const byCode = new Map(entries.map((e) => [e.code, e.title]));

/** Note that ships with the reference data (provenance and caution). */
export const codeReferenceNote: string = data.note;

/** Title of a generic code, or null when the reference does not list it. An FTB is ignored. */
export function lookupCodeTitle(code: string): string | null {
  const r = parseDtc(code);
  return r.ok ? (byCode.get(r.dtc.code) ?? null) : null;
}

/** Every listed code with its title, in file order (P, C, B, U, then by code). */
export function listCodeReference(): CodeReferenceEntry[] {
  return entries.map((e) => ({ ...e }));
}

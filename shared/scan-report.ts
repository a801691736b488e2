// Reading what a technician pastes from a scan tool printout: plain text or CSV.
// Pulls out trouble codes (with FTB and status when stated), the VIN, the
// odometer reading and monitor status (shared/readiness). Heuristics, each documented beside its rule.
import { decodeUdsStatus, findDtcMentions, parseDtc, type Dtc } from './codes';
import { readReadiness, type ReadinessReadout } from './readiness';
import { checkVin, followsNorthAmericanRules } from './vin';

export type ScanCodeStatus = 'pending' | 'confirmed' | 'permanent' | 'history' | 'active';
export interface ScanCode {
  code: string;
  ftb?: string;
  status?: ScanCodeStatus;
}
export interface Mileage {
  value: number;
  unit: 'km' | 'mi';
}
export interface ScanReport {
  codes: ScanCode[];
  vin?: string;
  mileage?: Mileage;
  /** monitor status: a PID $01 answer or a printed monitor table */
  readiness?: ReadinessReadout;
}

export const SCAN_REPORT_MAX_BYTES = 1024 * 1024;

export type ScanReportErrorReason = 'empty' | 'binary' | 'too-large' | 'nothing-found';

export class ScanReportError extends Error {
  constructor(
    readonly reason: ScanReportErrorReason,
    message: string,
  ) {
    super(message);
    this.name = 'ScanReportError';
  }
}

// ---------- input checks

function utf8Length(s: string): number {
  let n = 0;
  for (let i = 0; i < s.length; i++) {
    const c = s.charCodeAt(i);
    if (c < 0x80) n += 1;
    else if (c < 0x800) n += 2;
    else if (c >= 0xd800 && c <= 0xdbff) {
      n += 4;
      i++;
    } else n += 3;
  }
  return n;
}

// Control characters other than tab/CR/LF, DEL, C1 controls and U+FFFD (what
// binary bytes become when decoded as UTF-8).
const NON_PRINTABLE = /[\u0000-\u0008\u000B\u000C\u000E-\u001F\u007F-\u009F\uFFFD]/g;

function assertReadable(text: unknown): string {
  if (typeof text !== 'string') throw new ScanReportError('empty', 'The report is not text. Paste the printout as plain text or CSV.');
  if (text.length > SCAN_REPORT_MAX_BYTES || utf8Length(text) > SCAN_REPORT_MAX_BYTES) {
    throw new ScanReportError('too-large', 'The report is over 1 MB. Paste only the trouble code part of the printout.');
  }
  const body = text.replace(/^\uFEFF/, '');
  if (body.trim() === '') throw new ScanReportError('empty', 'The report is empty. Paste the scan tool printout as text or CSV.');
  if (body.includes('\u0000')) throw new ScanReportError('binary', 'This looks like a binary file, not text. Export the report as text or CSV first.');
  const odd = body.match(NON_PRINTABLE)?.length ?? 0;
  if (odd / body.length > 0.1) {
    throw new ScanReportError('binary', 'Most of this is not readable text. Export the report as text or CSV first.');
  }
  return body;
}

// ---------- status words

// Words a printout uses for a code's state. 'stored' is what generic OBD tools
// call confirmed codes (service $03). Words that also occur in code titles
// ('current', 'present') count only inside a status column.
const STATUS_WORDS: [RegExp, ScanCodeStatus][] = [
  [/\bpending\b/i, 'pending'],
  [/\b(confirmed|stored)\b/i, 'confirmed'],
  [/\bpermanent\b/i, 'permanent'],
  [/\b(history|historic|historical|inactive)\b/i, 'history'],
  [/\bactive\b/i, 'active'],
];
const COLUMN_ONLY_WORDS: [RegExp, ScanCodeStatus][] = [
  [/\b(current|present)\b/i, 'active'],
  [/\bpast\b/i, 'history'],
];

/** First status word in the text (by position), or undefined. */
function statusIn(text: string, words = STATUS_WORDS): ScanCodeStatus | undefined {
  let best: { at: number; status: ScanCodeStatus } | undefined;
  for (const [re, status] of words) {
    const m = re.exec(text);
    if (m && (!best || m.index < best.at)) best = { at: m.index, status };
  }
  return best?.status ?? statusFromUdsByte(text);
}

/** 'status 0x2F' / 'status: 2Fh' -> a status from the UDS bits. */
function statusFromUdsByte(text: string): ScanCodeStatus | undefined {
  const m = /\bstatus\b\W{0,3}(?:0x([0-9a-f]{2})\b|([0-9a-f]{2})h\b)/i.exec(text);
  const hex = m?.[1] ?? m?.[2];
  return hex === undefined ? undefined : statusFromUds(parseInt(hex, 16));
}

/** UDS status byte to one word: failing now beats confirmed beats pending beats failed-since-clear. */
export function statusFromUds(byte: number): ScanCodeStatus | undefined {
  const { bits } = decodeUdsStatus(byte);
  if (bits.testFailed) return 'active';
  if (bits.confirmedDTC) return 'confirmed';
  if (bits.pendingDTC) return 'pending';
  if (bits.testFailedSinceLastClear) return 'history';
  return undefined;
}

function statusInColumn(cell: string): ScanCodeStatus | undefined {
  const hex = /^\s*(?:0x)?([0-9a-f]{2})h?\s*$/i.exec(cell);
  if (hex?.[1] && /\d/.test(cell)) return statusFromUds(parseInt(hex[1], 16));
  return statusIn(cell) ?? statusIn(cell, COLUMN_ONLY_WORDS);
}

// ---------- collecting codes

class CodeList {
  private readonly list: ScanCode[] = [];

  /**
   * Adds a code or merges it into one already listed; returns the entry. A bare
   * mention ('P0302' in a freeze frame line) is the same code as 'P0302-13'
   * listed earlier, and a later 'P0302-13' adds its FTB to an earlier bare entry.
   */
  add(dtc: Dtc, status: ScanCodeStatus | undefined): ScanCode {
    const same = this.list.filter((c) => c.code === dtc.code);
    const existing = dtc.ftb
      ? (same.find((c) => c.ftb === dtc.ftb) ?? same.find((c) => c.ftb === undefined))
      : same[0];
    if (existing) {
      if (dtc.ftb && !existing.ftb) existing.ftb = dtc.ftb;
      if (!existing.status && status) existing.status = status;
      return existing;
    }
    const entry: ScanCode = { code: dtc.code };
    if (dtc.ftb) entry.ftb = dtc.ftb;
    if (status) entry.status = status;
    this.list.push(entry);
    return entry;
  }

  get codes(): ScanCode[] {
    return this.list;
  }
}

// ---------- plain text lines

const FREEZE_FRAME = /freeze[\s-]*frame/i;
const OTHER_SECTION = /freeze[\s-]*frame|readiness|monitor|vehicle info|live data|data stream|module info/i;

function looksLikeHeader(line: string): boolean {
  const t = line.trim();
  return t.length <= 60 && (/:$/.test(t) || /^[-=#*[]/.test(t) || OTHER_SECTION.test(t));
}

interface LineState {
  section: ScanCodeStatus | undefined;
  /** codes from the latest line that had codes, for 'Status: ...' lines below them */
  lastCodes: ScanCode[];
}

// 'Status: Confirmed' under a code is a field of that code's block, not a section header.
const STATUS_FIELD = /^\s*(status|state|type)\s*[:=]/i;

/**
 * One line of plain text. A code's status is the status word after it (before
 * the next code), else the first one on the line ('Permanent: P0420, P0430'),
 * else the section it sits under ('Pending codes:' headers). Freeze frame
 * lines name the code that stored the frame, so they take no section status.
 */
function readTextLine(line: string, state: LineState, out: CodeList): void {
  const mentions = findDtcMentions(line);
  if (mentions.length === 0) {
    const s = statusIn(line);
    if (s && STATUS_FIELD.test(line)) {
      for (const c of state.lastCodes) c.status ??= s;
    } else if (s && line.trim().length <= 60) state.section = s;
    else if (looksLikeHeader(line)) state.section = undefined;
    return;
  }
  const freeze = FREEZE_FRAME.test(line);
  if (freeze) state.section = undefined;
  const anywhere = statusIn(line.replace(/[PCBU][0-3][0-9A-F]{3}(-[0-9A-F]{2})?/gi, ' '));
  state.lastCodes = mentions.map((m, i) => {
    const end = mentions[i + 1]?.index ?? line.length;
    const own = statusIn(line.slice(m.index + m.length, end));
    return out.add(m.dtc, own ?? anywhere ?? (freeze ? undefined : state.section));
  });
}

// ---------- CSV

function splitCsvLine(line: string, delimiter: string): string[] {
  const cells: string[] = [];
  let cell = '';
  let quoted = false;
  for (let i = 0; i < line.length; i++) {
    const ch = line.charAt(i);
    if (quoted) {
      if (ch === '"' && line.charAt(i + 1) === '"') {
        cell += '"';
        i++;
      } else if (ch === '"') quoted = false;
      else cell += ch;
    } else if (ch === '"' && cell.trim() === '') {
      quoted = true;
      cell = '';
    } else if (ch === delimiter) {
      cells.push(cell.trim());
      cell = '';
    } else cell += ch;
  }
  cells.push(cell.trim());
  return cells;
}

const CODE_HEADER = /^(dtc|dtcs|code|codes|dtc code|trouble code|fault code|error code|dtc number)$/i;
const CODE_HEADER_LOOSE = /\b(dtc|code)\b/i;
const NOT_CODE_HEADER = /desc|text|title|meaning|name|count|status|type/i;
const FTB_HEADER = /\bftb\b|failure type|fault type|sub[\s-]?type|type byte/i;
const STATUS_HEADER = /\bstatus\b|\bstate\b|^type$/i;
const VIN_HEADER = /^(vin|vehicle identification number)$/i;
const MILEAGE_HEADER = /odometer|mileage|\bodo\b/i;

interface CsvLayout {
  delimiter: string;
  headerIndex: number;
  header: string[];
  code: number;
  ftb: number;
  status: number;
  vin: number;
  mileage: number;
}

function headerColumns(header: string[]): Omit<CsvLayout, 'delimiter' | 'headerIndex' | 'header'> | null {
  let code = header.findIndex((h) => CODE_HEADER.test(h));
  if (code < 0) code = header.findIndex((h) => CODE_HEADER_LOOSE.test(h) && !NOT_CODE_HEADER.test(h));
  if (code < 0) return null;
  const ftb = header.findIndex((h) => FTB_HEADER.test(h));
  const status = header.findIndex((h, i) => i !== ftb && STATUS_HEADER.test(h));
  return {
    code,
    ftb,
    status,
    vin: header.findIndex((h) => VIN_HEADER.test(h)),
    mileage: header.findIndex((h) => MILEAGE_HEADER.test(h)),
  };
}

/** A CSV header is a line in the first 30 that splits into 2+ cells, one naming the code column. */
function findCsvLayout(lines: string[]): CsvLayout | null {
  for (let i = 0; i < Math.min(lines.length, 30); i++) {
    const line = lines[i] ?? '';
    for (const delimiter of [',', ';', '\t', '|']) {
      if (!line.includes(delimiter)) continue;
      const header = splitCsvLine(line, delimiter);
      if (header.length < 2 || findDtcMentions(line).length > 0) continue;
      const cols = headerColumns(header);
      if (cols) return { delimiter, headerIndex: i, header, ...cols };
    }
  }
  return null;
}

function rowCodes(cells: string[], layout: CsvLayout, line: string): Dtc[] {
  const cell = cells[layout.code] ?? '';
  const parsed = parseDtc(cell);
  if (parsed.ok) return [parsed.dtc];
  const inCell = findDtcMentions(cell).map((m) => m.dtc);
  return inCell.length ? inCell : findDtcMentions(line).map((m) => m.dtc);
}

function readCsvRow(cells: string[], layout: CsvLayout, line: string, out: CodeList, found: Found): void {
  const ftbCell = (cells[layout.ftb] ?? '').trim();
  const ftb = /^(0x)?[0-9a-f]{2}$/i.test(ftbCell) ? ftbCell.slice(-2).toUpperCase() : undefined;
  const statusCell = cells[layout.status];
  const status = (statusCell !== undefined ? statusInColumn(statusCell) : undefined) ?? statusIn(line);
  for (const dtc of rowCodes(cells, layout, line)) {
    const withFtb: Dtc = !dtc.ftb && ftb ? { code: dtc.code, ftb, full: `${dtc.code}-${ftb}` } : dtc;
    out.add(withFtb, status);
  }
  const vinCell = cells[layout.vin];
  if (vinCell) found.labelledVins.push(vinCell.replace(/\s+/g, '').toUpperCase());
  const mileageCell = cells[layout.mileage];
  if (mileageCell && !found.mileage) found.mileage = mileageIn(`${layout.header[layout.mileage]}: ${mileageCell}`);
}

// ---------- VIN and mileage

interface Found {
  labelledVins: string[];
  plainVins: string[];
  mileage: Mileage | undefined;
}

const VIN_TOKEN = /(?<![A-Za-z0-9])[A-HJ-NPR-Z0-9]{17}(?![A-Za-z0-9])/gi;
const VIN_LABEL = /\b(vin|vehicle identification number|chassis (no|number))\b[\s:.#=-]*(no\.?|number|#)?[\s:.#=-]*$/i;

/**
 * A labelled VIN ('VIN: ...') is taken as written when it has 17 VIN
 * characters: vehicles outside North America need not carry a check digit.
 * An unlabelled 17-character token counts only if checkVin passes and it has
 * a letter (so long numbers, e.g. calibration ids, are not taken for VINs).
 */
function findVins(line: string, found: Found): void {
  for (const m of line.matchAll(VIN_TOKEN)) {
    const token = m[0].toUpperCase();
    if (VIN_LABEL.test(line.slice(0, m.index))) found.labelledVins.push(token);
    else if (/[A-Z]/.test(token) && followsNorthAmericanRules(checkVin(token))) found.plainVins.push(token);
  }
}

const MILEAGE_LABEL = /\b(odometer|odo|mileage|milage|kilometrage)\b/i;
// Distances since codes were cleared or with the MIL on are not the odometer.
const NOT_ODOMETER = /\bsince\b|\bmil\s+on\b|\bwith\s+mil\b|\bwarm[\s-]?ups?\b/i;
const NUMBER = /(\d{1,3}(?:[,.\u00A0\u202F' ]\d{3})+|\d+)(?:[.,](\d{1,2}))?(?!\d)/;
const UNIT_AFTER = /^\s*(km|kms|kilomet(?:re|er)s?|mi|mls|miles?)\b/i;
const UNIT_ANYWHERE = /\b(km|kms|kilomet(?:re|er)s?|mi|mls|miles?)\b/i;

function unitOf(word: string): 'km' | 'mi' {
  return /^k/i.test(word) ? 'km' : 'mi';
}

/**
 * 'Odometer: 84,210 km', 'Mileage (mi) 52 118'. Groups of three digits after
 * a separator are thousands ('84.210 km' is 84210); one or two digits after a
 * point or comma are a fraction. Without a unit the line is skipped: 'mileage'
 * is used for kilometres too.
 */
export function mileageIn(line: string): Mileage | undefined {
  const label = MILEAGE_LABEL.exec(line);
  if (!label || NOT_ODOMETER.test(line)) return undefined;
  const rest = line.slice(label.index + label[0].length);
  const num = NUMBER.exec(rest);
  if (!num?.[1]) return undefined;
  const value = Number(num[1].replace(/\D/g, '') + (num[2] ? `.${num[2]}` : ''));
  const unitWord = UNIT_AFTER.exec(rest.slice(num.index + num[0].length))?.[1] ?? UNIT_ANYWHERE.exec(line)?.[1];
  if (!unitWord || !Number.isFinite(value) || value > 9_999_999) return undefined;
  return { value, unit: unitOf(unitWord) };
}

// ---------- the whole report

/** Reads a pasted printout. Throws ScanReportError when it cannot be read or holds neither codes nor a VIN. */
export function parseScanReport(text: string): ScanReport {
  const body = assertReadable(text);
  const lines = body.split(/\r\n|\r|\n/);
  const layout = findCsvLayout(lines);
  const out = new CodeList();
  const found: Found = { labelledVins: [], plainVins: [], mileage: undefined };
  const state: LineState = { section: undefined, lastCodes: [] };

  lines.forEach((line, i) => {
    findVins(line, found);
    const cells = layout && i > layout.headerIndex ? splitCsvLine(line, layout.delimiter) : null;
    if (layout && cells && cells.length >= 2) readCsvRow(cells, layout, line, out, found);
    else if (!layout || i !== layout.headerIndex) readTextLine(line, state, out);
    if (!found.mileage) found.mileage = mileageIn(line);
  });

  const vin = found.labelledVins.find((v) => /^[A-HJ-NPR-Z0-9]{17}$/.test(v)) ?? found.plainVins[0];
  const readiness = readReadiness(body);
  if (out.codes.length === 0 && !vin && !readiness) {
    throw new ScanReportError(
      'nothing-found',
      'No trouble codes or VIN found, and no monitor status. Codes look like P0302 (or P0302-13 with a failure type byte).',
    );
  }
  const report: ScanReport = { codes: out.codes };
  if (vin) report.vin = vin;
  if (found.mileage) report.mileage = found.mileage;
  if (readiness) report.readiness = readiness;
  return report;
}

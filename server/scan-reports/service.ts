// Reading a pasted or uploaded scan tool printout into codes, VIN and mileage.
import { describeFtb, lookupCodeTitle } from '../../shared/codes';
import { parseScanReport, SCAN_REPORT_MAX_BYTES, ScanReportError } from '../../shared/scan-report';
import type { ReadinessReadout } from '../../shared/readiness';
import type { ScanReportView } from '../../shared/schemas/codes';
import type { ReadinessView } from '../../shared/schemas/readiness';
import { checkVin } from '../../shared/vin';
import { badRequest, HttpError } from '../http/errors';

// Formats techs sometimes export by mistake; named so the message says what to do.
const MAGIC: [number[], string][] = [
  [[0x25, 0x50, 0x44, 0x46], 'This is a PDF. Export the report as text or CSV, or copy the codes out and paste them.'],
  [[0x50, 0x4b, 0x03, 0x04], 'This is a zip or office file (e.g. a spreadsheet). Save it as CSV first.'],
  [[0x89, 0x50, 0x4e, 0x47], 'This is a picture (PNG), not text. Type or paste the codes instead.'],
  [[0xff, 0xd8, 0xff], 'This is a picture (JPEG), not text. Type or paste the codes instead.'],
];

const startsWith = (buf: Buffer, bytes: number[]) => bytes.every((b, i) => buf[i] === b);

/** Uploaded bytes to text: UTF-8, or UTF-16 when it carries a byte order mark. */
export function textOfUpload(buf: Buffer): string {
  for (const [bytes, message] of MAGIC) if (startsWith(buf, bytes)) throw badRequest(message);
  if (startsWith(buf, [0xff, 0xfe])) return new TextDecoder('utf-16le').decode(buf.subarray(2));
  if (startsWith(buf, [0xfe, 0xff])) return new TextDecoder('utf-16be').decode(buf.subarray(2));
  return new TextDecoder('utf-8').decode(buf);
}

/** Judges a report's monitor status; the route passes one bound to the shop's rule. */
export type ReadinessJudge = (readout: ReadinessReadout, vin: string | undefined) => ReadinessView;

export function readScanReport(text: string, judge: ReadinessJudge): ScanReportView {
  let report;
  try {
    report = parseScanReport(text);
  } catch (err) {
    if (!(err instanceof ScanReportError)) throw err;
    if (err.reason === 'too-large') throw new HttpError(413, 'too_large', err.message);
    throw new HttpError(400, `scan_${err.reason.replace('-', '_')}`, err.message);
  }
  return {
    codes: report.codes.map((c) => {
      const title = lookupCodeTitle(c.code);
      const meaning = c.ftb ? describeFtb(c.ftb).meaning : null;
      return { ...c, ...(title ? { title } : {}), ...(meaning ? { ftbMeaning: meaning } : {}) };
    }),
    ...(report.vin ? { vin: report.vin, vinCheck: checkVin(report.vin) } : {}),
    ...(report.mileage ? { mileage: report.mileage } : {}),
    ...(report.readiness ? { readiness: judge(report.readiness, report.vin) } : {}),
  };
}

export const SCAN_UPLOAD_LIMIT = SCAN_REPORT_MAX_BYTES;

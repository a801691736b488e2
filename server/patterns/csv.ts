// The dashboard's tables as CSV files, one per table, with the same figures the screen shows.
import { toCsv, type CsvValue } from '../../shared/patterns';
import type { CsvTable, PatternsResponse } from '../../shared/schemas/patterns';

const pct = (r: number | null) => (r === null ? null : Math.round(r * 1000) / 10);

const tables: Record<CsvTable, (p: PatternsResponse) => { header: string[]; rows: CsvValue[][] }> = {
  topCodes: (p) => ({ header: ['code', 'title', 'cases'], rows: p.topCodes.map((c) => [c.code, c.title, c.count]) }),
  topSymptoms: (p) => ({ header: ['symptom', 'cases'], rows: p.topSymptoms.map((s) => [s.tag, s.count]) }),
  comebacks: (p) => ({
    header: ['vin', 'plate', 'code', 'first case id', 'first case', 'repeat case id', 'repeat case', 'repeat visit', 'days', 'km', 'reason'],
    rows: p.comebacks.map((c) => [c.vehicle.vin, c.vehicle.plate, c.code, c.firstCaseId, c.firstTitle, c.repeatCaseId, c.repeatTitle, c.repeatDay, c.days, c.km, c.reason]),
  }),
  byPlatform: (p) => ({
    header: ['platform id', 'platform', 'cases', 'comebacks', 'comeback rate %', 'confirmed-fix rate %'],
    rows: p.byPlatform.map((b) => [b.platformId, b.label, b.cases, b.comebacks, pct(b.comebackRate), pct(b.confirmedRate)]),
  }),
  byRootCause: (p) => ({
    header: ['root cause', 'confirmed fixes', 'came back', 'comeback rate %'],
    rows: p.byRootCause.map((r) => [r.label, r.fixes, r.cameBack, pct(r.comebackRate)]),
  }),
};

export function patternsCsv(p: PatternsResponse, table: CsvTable): { filename: string; body: string } {
  const { header, rows } = tables[table](p);
  const platform = p.period.platformId ? `-platform-${p.period.platformId}` : '';
  return { filename: `causeway-${table}-${p.period.from}-to-${p.period.to}${platform}.csv`, body: toCsv(header, rows) };
}

// The demo shop's cases as the walk's history, straight from content/ (no database):
// for `npm run bench:walks` and the tests that measure suggestions and precedents.
import { readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import type { Platform } from '../../shared/platform';
import type { HistoryCase } from '../../shared/walk';
import { parseCaseFile, type CaseFile } from '../cases/case-file';
import { readDemoPlatforms } from './demo-files';

export interface DemoCase extends HistoryCase {
  caseId: string;
  file: CaseFile;
  confirmed: boolean;
}

export interface DemoHistory {
  platforms: Platform[];
  cases: DemoCase[];
}

export function readDemoHistory(contentDir: string): DemoHistory {
  const platformRows = readDemoPlatforms(contentDir);
  const platforms: Platform[] = platformRows.map(({ key: _key, ...p }, i) => ({ ...p, id: i + 1 }));
  const byKey = new Map(platformRows.map((p, i) => [p.key, platforms[i]!]));
  const dir = path.join(contentDir, 'cases');
  const cases = readdirSync(dir)
    .filter((f) => /^\d{4}-.*\.md$/.test(f))
    .sort()
    .map((f): DemoCase => {
      const file = parseCaseFile(readFileSync(path.join(dir, f), 'utf8'), f);
      return {
        caseId: file.slug,
        title: file.title,
        cause: file.cause ?? null,
        codes: file.codes,
        symptoms: file.symptoms,
        context: file.context,
        platform: file.platform ? (byKey.get(file.platform) ?? null) : null,
        file,
        confirmed: file.status === 'published' && file.confirmed !== false,
      };
    });
  return { platforms, cases };
}
